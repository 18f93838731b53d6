// The season calendar and the dashboard in Chromium, on the demo club: a manager sees the demo's steps and
// may drag them; a viewer sees the same calendar with nothing draggable (FullCalendar marks a draggable
// event with the class fc-event-draggable — FullCalendar 6 docs, "Event Dragging & Resizing"); a phone gets
// the list of upcoming steps instead of the grid. Screenshots at desktop and phone width are test artifacts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demoUsers from '@/db/demo-users.json';
import { baseUrl, DESKTOP, launchBrowser, PHONE, screenshot, signIn, loadDemoData } from './browser';

let browser: Browser;
const person = (role: string) => demoUsers.users.find((u) => u.role === role)!;

beforeAll(async () => {
  await loadDemoData();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function openCalendar(page: Page) {
  await page.goto(`${baseUrl()}/calendar`);
  await page.locator('.fc-event').first().waitFor({ timeout: 20_000 });
}

describe('the season calendar', () => {
  it('shows the demo manager every demo plot’s steps, draggable, with a legend; a tap opens the step', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, person('manager').email, person('manager').password);
    expect(new URL(page.url()).pathname).toBe('/dashboard');
    await openCalendar(page);
    const text = (await page.locator('.fc').textContent()) ?? '';
    // Demo plots with steps this month or next (db/demo.ts): a kill wait ending tomorrow, a planned seeding.
    expect(text).toMatch(/Creekside strip|Duck pond rim|Old lane/);
    expect(await page.locator('.fc-event.fc-event-draggable').count()).toBeGreaterThan(0);
    // Every event carries its kind's icon, not colour alone.
    const events = await page.locator('.fc-event').count();
    expect(await page.locator('.fc-event svg').count()).toBeGreaterThanOrEqual(events);

    await page.getByRole('button', { name: 'Legend' }).click();
    await expect.poll(() => page.getByRole('list', { name: 'Step kinds' }).count()).toBe(1);
    await screenshot(page, 'calendar-desktop');

    await page.getByRole('button', { name: 'Week' }).click();
    await page.locator('.fc-dayGridWeek-view').waitFor();
    await screenshot(page, 'calendar-week-desktop');

    // Tapping a step opens its page.
    await page.locator('.fc-event').first().click();
    await page.waitForURL(/\/steps\/[0-9a-f-]{36}$/);
    await context.close();
  });

  it('lets the demo viewer see the calendar but drag nothing', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, person('viewer').email, person('viewer').password);
    await openCalendar(page);
    expect(await page.locator('.fc-event').count()).toBeGreaterThan(0);
    expect(await page.locator('.fc-event-draggable').count()).toBe(0);
    await screenshot(page, 'calendar-viewer-desktop');
    await context.close();
  });

  it('collapses to a list of upcoming steps on a phone', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await signIn(page, person('manager').email, person('manager').password);
    await page.goto(`${baseUrl()}/calendar`);
    const list = page.getByRole('list', { name: 'Upcoming steps' });
    await list.waitFor({ timeout: 20_000 });
    expect(await page.locator('.fc').count()).toBe(0);
    expect(await list.getByRole('link').count()).toBeGreaterThan(0);
    await screenshot(page, 'calendar-phone');
    await list.getByRole('link').first().click();
    await page.waitForURL(/\/steps\/[0-9a-f-]{36}$/);
    await context.close();
  });
});

describe('the dashboard', () => {
  it('is the first page after sign-in and shows the manager’s week, at desktop and phone width', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, person('manager').email, person('manager').password);
    await page.waitForURL('**/dashboard');
    for (const title of ['Today', 'This week', 'Moved since your last visit', 'Germination checks due', 'Forecasts']) {
      await page.getByRole('heading', { name: title, exact: true }).first().waitFor();
    }
    await screenshot(page, 'dashboard-desktop');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'dashboard-phone');
    await context.close();
  });
});
