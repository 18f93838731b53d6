import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import demoUsers from '@/db/demo-users.json';
import { baseUrl, DESKTOP, launchBrowser, PHONE, screenshot, signIn, loadDemoData } from './browser';

let browser: Browser;

beforeAll(async () => {
  await loadDemoData();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('a new club manager in the browser', () => {
  it('signs up, creates a property, adds a plot and sees it in the table', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const email = `e2e-${randomUUID()}@example.test`;

    await page.goto(`${baseUrl()}/sign-up`);
    await page.getByLabel('Name').fill('Juniper Ashcombe');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('a-long-enough-password');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/dashboard');
    await page.goto(`${baseUrl()}/properties`);

    // A new user sees two: the page's button and the empty list's invitation to start.
    await page.getByRole('link', { name: /new property/i }).first().click();
    await page.waitForURL('**/properties/new');
    await page.getByLabel('Name').fill('Thistle Knob');
    await page.getByLabel('Latitude').fill('38.25');
    await page.getByLabel('Longitude').fill('-91.5');
    await page.getByLabel('Time zone').selectOption('America/Chicago');
    await page.getByLabel(/Elevation/).fill('240');
    await screenshot(page, 'property-form-desktop');
    await page.getByRole('button', { name: 'Create property' }).click();
    await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByRole('heading', { name: 'Thistle Knob' }).count()).toBeGreaterThan(0);

    await page.getByRole('link', { name: 'Add plot' }).click();
    await page.getByLabel('Name').fill('Hickory strip');
    await page.getByLabel('Acres').fill('0.5');
    await page.getByLabel('Cover').selectOption('grass-weeds');
    await page.getByLabel('Sun').selectOption('full');
    await page.getByRole('button', { name: 'Save plot' }).click();
    await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);

    const row = page.getByRole('row', { name: /Hickory strip/ });
    await row.waitFor();
    expect(await row.textContent()).toContain('0.5');
    await screenshot(page, 'property-page-desktop');

    await page.setViewportSize(PHONE);
    await screenshot(page, 'property-page-phone');
    await context.close();
  });

  it('keeps what was typed and names the field when the server refuses it', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const owner = demoUsers.users.find((u) => u.role === 'owner')!;
    await signIn(page, owner.email, owner.password);
    await page.goto(`${baseUrl()}/properties/new`);
    await page.getByLabel('Name').fill('Bad latitude ground');
    await page.getByLabel('Latitude').fill('123');
    await page.getByLabel('Longitude').fill('-91.5');
    await page.getByLabel('Time zone').selectOption('America/Chicago');
    await page.getByLabel(/Elevation/).fill('100');
    await page.getByRole('button', { name: 'Create property' }).click();
    await expect.poll(() => page.getByText(/Latitude must be at most 90/).count()).toBeGreaterThan(0);
    expect(await page.getByLabel('Name').inputValue()).toBe('Bad latitude ground');
    expect(page.url()).toContain('/properties/new');
    await screenshot(page, 'property-form-error-phone');
    await context.close();
  });
});

describe('the landowner (demo viewer)', () => {
  it('sees the property and its plots with no edit controls, and the API refuses its writes', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const viewer = demoUsers.users.find((u) => u.role === 'viewer')!;
    await signIn(page, viewer.email, viewer.password);

    const list = await page.request.get(`${baseUrl()}/api/properties`);
    const { properties } = (await list.json()) as { properties: { id: string; name: string; role: string }[] };
    const lease = properties.find((p) => p.name === 'Foxglove Hollow Lease');
    expect(lease?.role).toBe('viewer');

    await page.goto(`${baseUrl()}/properties/${lease!.id}`);
    await page.getByRole('row', { name: /Creekside strip/ }).waitFor();
    for (const name of [/add plot/i, /^edit/i, /remove/i, /delete/i, /invite/i]) {
      expect(await page.getByRole('button', { name }).count(), String(name)).toBe(0);
      expect(await page.getByRole('link', { name }).count(), String(name)).toBe(0);
    }
    await screenshot(page, 'property-page-viewer');

    const write = await page.request.post(`${baseUrl()}/api/properties/${lease!.id}/plots`, {
      data: { name: 'Sneaky plot', acres: 1, cover: 'bare-soil', sun: 'full' },
    });
    expect(write.status()).toBe(403);
    const rename = await page.request.patch(`${baseUrl()}/api/properties/${lease!.id}`, { data: { name: 'Mine now' } });
    expect(rename.status()).toBe(403);
    await context.close();
  });
});
