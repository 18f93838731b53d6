// In the browser at phone size (390 × 844): the demo member's My steps page lists what the API lists for them,
// with touch targets of at least 48 px (Sowcast's field target, above WCAG 2.2's 44 px for 2.5.5 Target Size);
// offline, the service worker serves the page and the last list, a step marked done waits on the phone — through
// a reload — and is sent once the connection is back, where the server then has it done with the seed broadcast.
// Screenshots online and offline go to TEST_ARTIFACTS_DIR.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import type { Kysely } from 'kysely';
import { createDb, createPool } from '@/db';
import type { Database } from '@/db/database';
import demoUsers from '@/db/demo-users.json';
import { Client, createPlot, createProperty, signedInUser, type TestUser } from '../support/http';
import { baseUrl, launchBrowser, loadDemoData, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
let db: Kysely<Database>;

const localToday = (timeZone: string) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(Date.now());

beforeAll(async () => {
  await loadDemoData();
  db = createDb(createPool(process.env.DATABASE_URL));
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await db?.destroy();
});

async function phone(): Promise<{ context: BrowserContext; page: Page }> {
  // Service workers need a real origin (the test server's http://127.0.0.1 is a secure context) and to be allowed.
  const context = await browser.newContext({ viewport: PHONE, serviceWorkers: 'allow', hasTouch: true, isMobile: true });
  return { context, page: await context.newPage() };
}

describe('My steps at phone size', () => {
  it("lists the demo member's steps, with big touch targets and the cautions of the spraying", async () => {
    const info = demoUsers.users.find((u) => u.role === 'member')!;
    const api = new Client('demo member');
    expect((await api.signIn(info.email, info.password)).ok).toBe(true);
    const expected = (await api.get('/api/my-steps')).body.steps as { stepId: string; title: string; plotName: string; canComplete: boolean; recurring: boolean }[];
    expect(expected.length).toBeGreaterThan(0);

    const { context, page } = await phone();
    await signIn(page, info.email, info.password);
    await page.goto(`${baseUrl()}/my-steps`);
    await page.getByRole('heading', { name: 'My steps', level: 1 }).waitFor();
    await page.locator('article[data-step-id]').first().waitFor();
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My steps' }).getAttribute('aria-current')).toBe('page');
    const shown = await page.locator('article[data-step-id]').evaluateAll((cards) => cards.map((c) => c.getAttribute('data-step-id')));
    expect(shown).toEqual(expected.map((s) => s.stepId));
    for (const step of expected.slice(0, 3)) {
      expect(await page.locator(`article[data-step-id="${step.stepId}"]`).first().textContent()).toContain(step.plotName);
    }
    // Every "Mark done" and "Open step" is at least 48 px tall.
    const targets = page.getByRole('button', { name: 'Mark done' }).or(page.getByRole('link', { name: 'Open step' }));
    const heights = await targets.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
    expect(heights.length).toBeGreaterThan(0);
    for (const h of heights) expect(h).toBeGreaterThanOrEqual(48);
    // The page is no wider than the phone.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await screenshot(page, 'my-steps-phone');

    // The form opens in place, with the date and time in the property's zone and the person's name.
    await page.getByRole('button', { name: 'Mark done' }).first().click();
    const form = page.getByRole('form').first();
    await form.getByLabel('Date done').waitFor();
    expect(await form.textContent()).toContain(info.name);
    await screenshot(page, 'my-steps-form-phone');
    await context.close();
  });

  it('offline: reads the kept page, queues a step marked done through a reload, and sends it once online', async () => {
    const me: { user: TestUser; client: Client } = await signedInUser('e2e-field');
    const zone = 'America/Chicago';
    const property = await createProperty(me.client, { name: 'Juniper Flat', timeZone: zone, latitude: 37 + randomInt(0, 900) / 1000, longitude: -97 - randomInt(0, 900) / 1000 });
    const plot = await createPlot(me.client, property.id, { name: 'Back forty strip', acres: 1.2 });
    const saved = await me.client.post(`/api/plots/${plot.id}/plantings`, {
      season: 'fall',
      method: 'prepared-seedbed',
      blend: [{ speciesId: 'cereal-rye', share: 0.6 }, { speciesId: 'crimson-clover', share: 0.4 }],
      targetSeedDate: '2099-09-15',
    });
    expect(saved.status, saved.text).toBe(201);
    const seed = saved.body.steps.find((s: { kind: string }) => s.kind === 'seed');
    await db.updateTable('steps').set({ local_date: localToday(zone), window_start: null, window_end: null, assignee_id: me.user.id }).where('id', '=', seed.id).execute();

    const { context, page } = await phone();
    await signIn(page, me.user.email, me.user.password);
    await page.goto(`${baseUrl()}/my-steps`);
    const card = page.locator(`article[data-step-id="${seed.id}"]`);
    await card.waitFor();
    // The service worker has kept the page, its build files and the list.
    await page.locator('[data-offline-copy="ready"]').waitFor({ timeout: 30_000 });

    await context.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { name: 'My steps', level: 1 }).waitFor();
    // "as of …" is said only for an answer the service worker served from its copy.
    await page.getByText(/Offline\. Showing your steps as of/).waitFor();
    await card.waitFor();
    await screenshot(page, 'my-steps-offline-phone');

    await card.getByRole('button', { name: 'Mark done' }).click();
    await card.getByLabel('Seed broadcast (lb)').fill('55.5');
    await card.getByLabel('Notes').fill('Spread by hand, ground moist');
    await card.getByRole('button', { name: 'Save as done' }).click();
    await card.getByText('Waiting to send (offline)').waitFor();
    await page.getByTestId('outbox').waitFor();
    expect((await me.client.get(`/api/steps/${seed.id}`)).body.step.status).toBe('planned');

    // Never lost on reload: still waiting, still offline.
    await page.reload();
    await card.getByText('Waiting to send (offline)').waitFor();
    await screenshot(page, 'my-steps-queued-offline-phone');
    expect((await me.client.get(`/api/steps/${seed.id}`)).body.step.status).toBe('planned');

    await context.setOffline(false);
    await expect.poll(async () => (await me.client.get(`/api/steps/${seed.id}`)).body.step.status, { timeout: 45_000, interval: 500 }).toBe('done');
    const row = await db.selectFrom('steps').select(['done_on', 'done_by', 'done_record', 'notes']).where('id', '=', seed.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ done_on: localToday(zone), done_by: me.user.id, done_record: { seedLb: 55.5 }, notes: 'Spread by hand, ground moist' });
    await expect.poll(() => page.getByTestId('outbox').count(), { timeout: 15_000 }).toBe(0);
    // Sent once: the step was recorded with one outcome (one move at most, none for the same date).
    const moves = await db.selectFrom('step_moves').select('id').where('step_id', '=', seed.id).execute();
    expect(moves.length).toBe(0);
    await screenshot(page, 'my-steps-sent-phone');
    await context.close();
  });
});
