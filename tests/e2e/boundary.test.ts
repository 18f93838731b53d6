// The plot boundary in Chromium: the demo manager uploads a walked GPX track on a demo plot, sees the outline
// drawn and its acres, and takes those acres as the plot's size. Screenshots at desktop and phone width.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { createDb, createPool } from '@/db';
import demoUsers from '@/db/demo-users.json';
import { baseUrl, DESKTOP, launchBrowser, loadDemoData, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
const manager = demoUsers.users.find((u) => u.role === 'manager')!;
const GPX = path.resolve(__dirname, '../fixtures/boundaries/field.gpx');
const PLOT = 'Cedar gap';

let plotId = '';

async function restorePlot() {
  // The demo plot goes back to how the demo made it, for the browser files that run after this one.
  const db = createDb(createPool(process.env.DATABASE_URL));
  try {
    const plot = await db.selectFrom('plots').select(['id', 'boundary_upload_id']).where('name', '=', PLOT).executeTakeFirstOrThrow();
    await db.updateTable('plots').set({ acres: 0.25, boundary: null, boundary_acres: null, boundary_upload_id: null }).where('id', '=', plot.id).execute();
    await db.deleteFrom('uploads').where('plot_id', '=', plot.id).where('kind', '=', 'boundary').execute();
    plotId = plot.id;
  } finally {
    await db.destroy();
  }
}

beforeAll(async () => {
  await loadDemoData();
  await restorePlot();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await restorePlot();
});

async function openPlotFromProperty(page: Page) {
  await page.goto(`${baseUrl()}/properties`);
  await page.getByRole('link', { name: /Foxglove Hollow Lease/ }).first().click();
  await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);
  await page.getByRole('link', { name: PLOT, exact: true }).click();
  await page.waitForURL(/\/plots\/[0-9a-f-]{36}$/);
  await page.getByRole('heading', { name: 'Boundary' }).waitFor();
}

describe('plot boundary upload', () => {
  it('uploads a GPX track, draws the outline with its acres, and offers them as the plot’s size', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, manager.email, manager.password);
    await openPlotFromProperty(page);
    await page.getByText('No outline yet.').waitFor();

    await page.getByLabel('Outline file').setInputFiles(GPX);
    await page.getByRole('button', { name: 'Upload outline' }).click();
    await page.getByText(/Read the outline from “field\.gpx”/).waitFor();
    // 0.768 acres by GeographicLib (tests/unit/geo/boundary.test.ts checks the module against @turf/area and by hand).
    await expect(page.getByTestId('boundary-acres').textContent()).resolves.toBe('0.77 ac');
    const outline = page.getByTestId('boundary-outline');
    const d = await outline.getAttribute('d');
    // One closed ring of six corners: M, five L, Z.
    expect(d).toMatch(/^M[\d.,]+(L[\d.,]+){5}Z$/);
    const box = await outline.boundingBox();
    expect(box!.width).toBeGreaterThan(100);
    expect(await page.getByRole('img', { name: /Outline of the plot, 0\.77 ac/ }).count()).toBe(1);
    expect(await page.getByText(/\d+ ft$/).count()).toBeGreaterThan(0);
    await screenshot(page, 'boundary-desktop');

    await page.getByRole('button', { name: 'Use 0.77 ac as the plot’s size' }).click();
    await page.getByText('The plot’s size is now 0.77 ac; new plans use it.').waitFor();
    await page.getByText('Planned with 0.77 ac.').waitFor();
    // The facts card at the top of the page shows the new size after the refresh.
    await page.locator('section[aria-labelledby="plot-facts-heading"]').getByText('0.77 ac', { exact: true }).waitFor();
    await context.close();
  });

  it('shows a refused file’s message and fits a phone', async () => {
    const context = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    await signIn(page, manager.email, manager.password);
    await page.goto(`${baseUrl()}/plots/${plotId}`);
    await page.getByTestId('boundary-acres').waitFor();
    await page.getByLabel('Replace with another file').setInputFiles({
      name: 'bow-tie.geojson',
      mimeType: 'application/geo+json',
      buffer: Buffer.from(JSON.stringify({ type: 'Polygon', coordinates: [[[-98.5467, 40.1123], [-98.546, 40.1128], [-98.546, 40.1123], [-98.5467, 40.1128], [-98.5467, 40.1123]]] })),
    });
    await page.getByRole('button', { name: 'Upload outline' }).click();
    await page.getByRole('alert').filter({ hasText: 'crosses itself' }).waitFor();
    // The earlier outline is still there: a refused file changes nothing.
    await expect(page.getByTestId('boundary-acres').textContent()).resolves.toBe('0.77 ac');
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.getByRole('heading', { name: 'Boundary' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'boundary-phone');
    // The section alone at phone width, to look at closely.
    await page
      .locator('section[aria-labelledby="plot-boundary-heading"]')
      .screenshot({ path: path.join(process.env.TEST_ARTIFACTS_DIR ?? path.resolve('.test-artifacts'), 'boundary-phone-section.png') });
    await context.close();
  });
});
