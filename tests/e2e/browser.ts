import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { createDb, createPool } from '@/db';
import { loadDemo } from '@/db/demo';

export const baseUrl = () => {
  const url = process.env.SOWCAST_BASE_URL;
  if (!url) throw new Error('SOWCAST_BASE_URL is not set: run browser tests through `npm test`');
  return url;
};

/** Debian's Chromium, driven by playwright-core (never a downloaded browser). */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  });
}

export const DESKTOP = { width: 1280, height: 900 };
export const PHONE = { width: 390, height: 844 };

/** Screenshots are test artifacts (not committed), to be looked at after a run. */
export async function screenshot(page: Page, name: string) {
  const dir = process.env.TEST_ARTIFACTS_DIR ?? path.resolve('.test-artifacts');
  mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}

export async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Loads the demo club into the test database; idempotent, so every browser file may call it. */
export async function loadDemoData() {
  const db = createDb(createPool(process.env.DATABASE_URL));
  try {
    await loadDemo(db);
  } finally {
    await db.destroy();
  }
}

/** Opens a demo plot from the properties list: the property's page, then the plot's. */
export async function openPlot(page: Page, propertyName: RegExp, plotName: string) {
  await page.goto(`${baseUrl()}/properties`);
  await page.getByRole('link', { name: propertyName }).first().click();
  await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);
  await page.getByRole('link', { name: plotName, exact: true }).click();
  await page.waitForURL(/\/plots\/[0-9a-f-]{36}$/);
  await page.getByRole('heading', { name: plotName, level: 1 }).waitFor();
}
