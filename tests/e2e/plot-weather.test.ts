// The plot weather chart in Chromium, on the demo club's waiting planting (Old lane, seeding a few days out):
// the demo's rain two days out is put into the fake weather service and the forecast stored as the worker
// stores one; the chart draws (an SVG in the chart), says in words what it shows, and fits a 375 px phone by
// scrolling sideways inside itself. Screenshots at desktop and phone width are test artifacts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { createDb, createPool } from '@/db';
import { putDemoWeather } from '@/db/demo-phones';
import demoUsers from '@/db/demo-users.json';
import { storeForecast } from '@/lib/data/forecasts';
import { gridCell, gridCellKey } from '@/lib/weather/grid';
import { weatherClientFromEnv } from '@/lib/weather/client';
import { baseUrl, DESKTOP, launchBrowser, loadDemoData, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
const person = (role: string) => demoUsers.users.find((u) => u.role === role)!;
// 375 px: the narrowest phone the product is laid out for.
const NARROW_PHONE = { ...PHONE, width: 375 };

const localDate = (ms: number, timeZone: string) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);

/** The demo's weather into the fake, then a 16-day forecast for Foxglove Hollow Lease's cell, stored as the worker does. */
async function storeDemoForecast() {
  const weatherUrl = process.env.FAKE_WEATHER_URL;
  if (!weatherUrl) throw new Error('FAKE_WEATHER_URL is not set: run browser tests through `npm test`');
  await putDemoWeather(weatherUrl);
  const db = createDb(createPool(process.env.DATABASE_URL));
  try {
    const property = await db
      .selectFrom('properties')
      .select(['latitude', 'longitude', 'time_zone'])
      .where('name', '=', 'Foxglove Hollow Lease')
      .executeTakeFirstOrThrow();
    const cell = gridCell(property.latitude, property.longitude);
    const client = weatherClientFromEnv(process.env);
    const forecast = await client.fetchForecast(
      { latitude: cell.latitude, longitude: cell.longitude, timeZone: property.time_zone, startDate: localDate(Date.now(), property.time_zone), days: 16 },
      new Date(),
    );
    await storeForecast({
      gridKey: gridCellKey(property.latitude, property.longitude),
      latitude: cell.latitude,
      longitude: cell.longitude,
      provider: client.provider,
      forecast: { ...forecast, fetchedAt: new Date().toISOString() },
    });
  } finally {
    await db.destroy();
  }
}

beforeAll(async () => {
  await loadDemoData();
  await storeDemoForecast();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function openOldLane(page: Page) {
  await page.goto(`${baseUrl()}/properties`);
  await page.getByRole('link', { name: /Foxglove Hollow Lease/ }).first().click();
  await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);
  await page.getByRole('link', { name: 'Old lane', exact: true }).click();
  await page.waitForURL(/\/plots\/[0-9a-f-]{36}$/);
  await page.getByRole('heading', { name: 'Old lane', level: 1 }).waitFor();
}

/** The chart section once it has drawn: recharts renders each panel as an <svg class="recharts-surface">. */
async function chartDrawn(page: Page) {
  const section = page.locator('section[aria-labelledby="plot-weather-heading"]');
  await section.getByRole('heading', { name: 'Weather at this plot' }).waitFor();
  await section.locator('svg.recharts-surface').first().waitFor({ timeout: 20_000 });
  return section;
}

describe('the plot weather chart', () => {
  it('shows the demo manager rain, soil against the blend minimum, spray windows and the seeding, with words and a table', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const consoleErrors: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error' || message.type() === 'warning') consoleErrors.push(message.text());
    });
    await signIn(page, person('manager').email, person('manager').password);
    await openOldLane(page);
    const section = await chartDrawn(page);

    // Rain bars, soil line and two strips: four panels, each an SVG.
    expect(await section.locator('svg.recharts-surface').count()).toBe(4);
    // The demo puts 19 mm on the afternoon two days out: 19 / 25.4 = 0.75 in (NIST SP 811 B.8); a bar and its label.
    expect(await section.locator('.recharts-bar-rectangle').count()).toBeGreaterThan(0);
    const summary = section.locator('figcaption');
    expect(await summary.getByText(/\d(\.\d+)? in of rain expected (Sun|Mon|Tue|Wed|Thu|Fri|Sat) \d{1,2} [A-Z][a-z]{2}/).count()).toBe(1);
    expect(await summary.getByText(/^Soil /).count()).toBe(1);
    expect(await summary.getByText(/the blend minimum/).count()).toBe(1);
    expect(await summary.getByText(/^Seeding planned .*the seed zone/).count()).toBe(1);
    expect(await summary.getByText(/Why seeding sits on/).count()).toBe(1);
    // Never colour alone: a legend in words, and the day markers named on the chart.
    const legend = section.getByRole('list', { name: 'Chart legend' });
    expect(await legend.getByText(/Rain, inches/).count()).toBe(1);
    expect(await legend.getByText(/below the blend minimum/).count()).toBe(1);
    expect(await section.locator('svg text', { hasText: /^Today$/ }).count()).toBe(1);
    expect(await section.locator('svg text', { hasText: /^Seeding$/ }).count()).toBe(1);
    expect(await section.locator('svg text', { hasText: /^(moist|dry)$/ }).count()).toBeGreaterThan(0);
    // For assistive technology: the chart is one named picture, and every number is in a table.
    const picture = section.getByRole('img', { name: /^Weather chart\. Soil / });
    expect(await picture.count()).toBe(1);
    await section.getByText('The numbers, day by day').click();
    const table = section.getByRole('table', { name: 'Weather at this plot, by local day' });
    expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(15);
    expect(await table.getByText(/\(today\)/).count()).toBe(1);
    await screenshot(page, 'plot-weather-desktop');
    // recharts warns in the console when a chart is drawn at zero size or with bad data.
    expect(consoleErrors.filter((m) => /recharts|width\(0\)|height\(0\)|NaN/i.test(m))).toEqual([]);
    await context.close();
  });

  it('fits a 375 px phone: the card stays inside the screen, the chart scrolls sideways inside it', async () => {
    const context = await browser.newContext({ viewport: NARROW_PHONE });
    const page = await context.newPage();
    await signIn(page, person('viewer').email, person('viewer').password);
    await openOldLane(page);
    const section = await chartDrawn(page);
    expect(await section.locator('figcaption').getByText(/in of rain expected|No measurable rain/).count()).toBe(1);
    // Nothing of the chart's card sticks out past the right edge, except inside its own sideways scroller.
    const sticking = await section.evaluate((card) => {
      const scrolls = (el: Element | null): boolean =>
        !!el && el !== card && (['auto', 'scroll'].includes(getComputedStyle(el).overflowX) || scrolls(el.parentElement));
      return [card, ...card.querySelectorAll('*')]
        .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5 && !scrolls(el.parentElement))
        .slice(0, 5)
        .map((el) => `${el.tagName.toLowerCase()}.${String(el.getAttribute('class') ?? '').slice(0, 60)}`);
    });
    expect(sticking).toEqual([]);
    const scroller = section.getByRole('img', { name: /^Weather chart\./ });
    const box = await scroller.evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth }));
    expect(box.scroll).toBeGreaterThan(box.client);
    await section.scrollIntoViewIfNeeded();
    await screenshot(page, 'plot-weather-phone');
    await context.close();
  });
});
