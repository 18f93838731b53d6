// In the browser: a person makes a calendar address in Settings, sees it once, the address serves their
// iCalendar feed (RFC 5545 text/calendar), and revoking it in Settings makes it answer 404. Screenshot at phone width.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { createUser, type TestUser } from '../support/http';
import { baseUrl, launchBrowser, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
let user: TestUser;

beforeAll(async () => {
  user = await createUser('e2e-feed', 'Robin Vale');
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('calendar feeds in settings', () => {
  it('makes an address, shows it once, and revokes it', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await signIn(page, user.email, user.password);
    await page.goto(`${baseUrl()}/settings`);
    await page.getByRole('heading', { name: 'Your steps in a phone calendar' }).waitFor();
    await page.getByText('None yet.', { exact: false }).waitFor();
    await page.locator('#feed-label').fill('My phone');
    await page.getByRole('button', { name: 'Make a calendar address' }).click();
    const address = page.getByLabel('Your calendar address');
    await address.waitFor();
    const url = await address.inputValue();
    expect(url).toMatch(/\/api\/calendar-feed\/[A-Za-z0-9_-]{43}$/);
    await page.getByText('How to subscribe on a phone').click();
    await screenshot(page, 'calendar-feed-settings-phone');

    const feed = await fetch(`${baseUrl()}${new URL(url).pathname}`);
    expect(feed.status).toBe(200);
    expect(feed.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
    expect((await feed.text()).startsWith('BEGIN:VCALENDAR\r\n')).toBe(true);

    // After a reload the address is gone from the page: only its label and dates remain.
    await page.reload();
    // The label as listed (the field's hint and the Revoke button's hidden text also say it).
    await page.getByRole('paragraph').filter({ hasText: /^My phone$/ }).waitFor();
    expect(await page.getByLabel('Your calendar address').count()).toBe(0);
    expect(await page.content()).not.toContain(new URL(url).pathname);
    await page.getByRole('button', { name: /Revoke/ }).click();
    await page.getByText('None yet.', { exact: false }).waitFor();
    expect((await fetch(`${baseUrl()}${new URL(url).pathname}`)).status).toBe(404);
    await context.close();
  });
});
