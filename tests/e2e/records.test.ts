// Application records in Chromium on the demo club: the manager records the Creekside strip's spray from its
// step — product, rate, totals and area from the plan, the weather from the stored forecast for that hour —
// sees it in the table, sorts and filters it; the demo viewer (the landowner) exports the CSV and gets no
// controls to record or correct. Screenshots at desktop and phone width are test artifacts.
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { createDb, createPool } from '@/db';
import demoUsers from '@/db/demo-users.json';
import { latestForecast, storeForecast } from '@/lib/data/forecasts';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCell, gridCellKey } from '@/lib/weather/grid';
import { baseUrl, DESKTOP, launchBrowser, loadDemoData, PHONE, screenshot, signIn } from './browser';

const HOUR_MS = 3_600_000;
const person = (role: string) => demoUsers.users.find((u) => u.role === role)!;
let browser: Browser;
let propertyId: string;
let sprayStepId: string;
let gridKey: string;

beforeAll(async () => {
  await loadDemoData();
  const db = createDb(createPool(process.env.DATABASE_URL));
  try {
    const property = await db.selectFrom('properties').selectAll().where('name', '=', 'Foxglove Hollow Lease').executeTakeFirstOrThrow();
    propertyId = property.id;
    gridKey = gridCellKey(property.latitude, property.longitude);
    const spray = await db
      .selectFrom('steps')
      .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
      .innerJoin('plots', 'plots.id', 'plantings.plot_id')
      .select('steps.id')
      .where('plots.property_id', '=', property.id)
      .where('plots.name', '=', 'Creekside strip')
      .where('steps.kind', '=', 'spray')
      .executeTakeFirstOrThrow();
    sprayStepId = spray.id;
    // As if the member had just marked the spray done on the phone: the draft reads the hour of the work.
    await db.updateTable('steps').set({ done_at: new Date(Date.now() - 10 * 60_000) }).where('id', '=', spray.id).execute();
    // A forecast for the lease's cell covering the last and next day, stored as the worker stores one.
    const cell = gridCell(property.latitude, property.longitude);
    const start = Math.floor(Date.now() / HOUR_MS) * HOUR_MS - 24 * HOUR_MS;
    const hours: ForecastHour[] = Array.from({ length: 48 }, (_, i) => ({
      time: new Date(start + i * HOUR_MS).toISOString(), rainMm: 0, rainProbabilityPct: 5, airTempC: 12, relativeHumidityPct: 64, windKmh: 9,
    }));
    await storeForecast({ gridKey, latitude: cell.latitude, longitude: cell.longitude, provider: 'open-meteo', forecast: { timeZone: property.time_zone, fetchedAt: new Date().toISOString(), hours } });
  } finally {
    await db.destroy();
  }
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** The forecast the server will read (another browser file may have stored a newer one for this cell). */
async function expectedWeather(at: number) {
  const forecast = await latestForecast(gridKey);
    const hour = forecast!.hours.reduce((a, b) => (Math.abs(Date.parse(b.time) - at) < Math.abs(Date.parse(a.time) - at) ? b : a));
  // NIST SP 811 B.8–B.9: 1 mi = 1.609344 km; t/°F = 1.8 t/°C + 32; to the tenth, as the form shows them.
  return { windMph: Math.round((hour.windKmh / 1.609344) * 10) / 10, airTempF: Math.round((hour.airTempC * 1.8 + 32) * 10) / 10, humidityPct: Math.round(hour.relativeHumidityPct) };
}

describe('application records', () => {
  it('the manager records the spray from its step with the weather pre-filled, then sorts and filters the table', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const manager = person('manager');
    await signIn(page, manager.email, manager.password);
    const openedAt = Date.now();
    await page.goto(`${baseUrl()}/properties/${propertyId}/records/new?step=${sprayStepId}`);
    await page.getByRole('heading', { name: 'Record an application', level: 1 }).waitFor();
    await expect.poll(() => page.getByLabel('Product name', { exact: true }).inputValue(), { timeout: 15_000 }).toBe('Glyphosate 41% (generic)');
    // Demo plan: 48 fl oz/acre on Creekside strip's 0.5 acre = 24 fl oz (arithmetic).
    expect(await page.getByLabel('Rate', { exact: true }).inputValue()).toBe('48');
    expect(await page.getByLabel('Rate unit', { exact: true }).inputValue()).toBe('fl oz/acre');
    expect(await page.getByLabel('Total product used', { exact: true }).inputValue()).toBe('24');
    expect(await page.getByLabel('Area treated (acres)', { exact: true }).inputValue()).toBe('0.5');
    const weather = await expectedWeather(openedAt - 10 * 60_000);
    expect(Number(await page.getByLabel(/^Wind speed/).inputValue())).toBe(weather.windMph);
    expect(Number(await page.getByLabel(/^Air temperature/).inputValue())).toBe(weather.airTempF);
    expect(Number(await page.getByLabel(/^Relative humidity/).inputValue())).toBe(weather.humidityPct);
    expect(await page.getByTestId('weather-note').textContent()).toMatch(/stored forecast/);
    const cautions = (await page.locator('section[aria-label="Cautions"]').textContent()) ?? '';
    expect(cautions).toMatch(/label is the law/i);
    expect(cautions).toMatch(/protective equipment/i);
    expect(cautions).toMatch(/drift/i);
    expect(cautions).toMatch(/certified applicator/i);
    await page.getByLabel(/^Wind from/).selectOption('NW');
    await page.getByLabel(/^Notes/).fill('Sprayed the edges first.');
    await screenshot(page, 'records-form-desktop');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'records-form-phone');
    await page.setViewportSize(DESKTOP);

    await page.getByRole('button', { name: 'Save the record' }).click();
    await page.waitForURL(/\/records\?saved=/);
    const table = page.locator('table');
    await table.waitFor();
    const rows = table.locator('tbody tr');
    await expect.poll(() => rows.count()).toBeGreaterThan(0);
    const saved = rows.filter({ hasText: 'Sprayed the edges first.' });
    expect(await saved.count()).toBeGreaterThan(0);
    expect(await saved.first().textContent()).toMatch(/from the forecast/);

    // A second application (lime on another plot) so sorting and filtering have something to do.
    await page.goto(`${baseUrl()}/properties/${propertyId}/records/new`);
    await page.getByLabel('Kind', { exact: true }).selectOption('lime');
    await page.getByLabel('Plot', { exact: true }).selectOption({ label: 'North corner' });
    await page.getByLabel('Product name', { exact: true }).fill('Agricultural lime');
    await page.getByLabel('Rate', { exact: true }).fill('1');
    await page.getByLabel('Rate unit', { exact: true }).selectOption('tons/acre');
    await page.getByLabel('Total product used', { exact: true }).fill('2400');
    await page.getByLabel('Unit', { exact: true }).selectOption('lb');
    await page.getByRole('button', { name: 'Save the record' }).click();
    await page.waitForURL(/\/records\?saved=/);
    await table.waitFor();
    await expect.poll(() => rows.count()).toBeGreaterThan(1);

    const productHeader = page.locator('th').filter({ hasText: 'Product' }).getByRole('button');
    await productHeader.click();
    const products = () => rows.evaluateAll((trs) => trs.map((tr) => tr.querySelectorAll('td')[3]?.textContent ?? ''));
    const first = await products();
    await productHeader.click();
    const second = await products();
    expect(second).not.toEqual(first);
    expect(await page.locator('th[aria-sort]').count()).toBe(1);

    await page.getByLabel('Product', { exact: true }).fill('glyph');
    await expect.poll(async () => (await products()).every((p) => /glyphosate/i.test(p))).toBe(true);
    await page.getByLabel('Product', { exact: true }).fill('');
    await page.getByLabel('Kind', { exact: true }).selectOption('lime');
    await expect.poll(async () => (await products()).every((p) => /lime/i.test(p))).toBe(true);
    expect((await products()).length).toBeGreaterThan(0);
    await page.getByLabel('Kind', { exact: true }).selectOption('');
    await screenshot(page, 'records-table-desktop');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'records-table-phone');
    await context.close();
  });

  it('the viewer exports the CSV and has no controls to record or correct', async () => {
    const context = await browser.newContext({ viewport: PHONE, acceptDownloads: true });
    const page = await context.newPage();
    const viewer = person('viewer');
    await signIn(page, viewer.email, viewer.password);
    await page.goto(`${baseUrl()}/properties/${propertyId}`);
    await page.getByRole('link', { name: 'Records', exact: true }).click();
    await page.waitForURL(/\/records$/);
    await page.locator('table tbody tr').first().waitFor();
    expect(await page.getByRole('link', { name: 'New record' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Correct' }).count()).toBe(0);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^sowcast-records-foxglove-hollow-lease-\d{4}-\d{2}-\d{2}\.csv$/);
    const csv = readFileSync((await download.path())!, 'utf8');
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.some((r) => r.notes === 'Sprayed the edges first.' && r.wind_direction === 'NW' && r.weather_source === 'forecast')).toBe(true);
    await screenshot(page, 'records-viewer-phone');
    // The form itself says why a viewer cannot record.
    await page.goto(`${baseUrl()}/properties/${propertyId}/records/new`);
    await page.getByRole('heading', { name: 'Not with your role' }).waitFor();
    await context.close();
  });
});
