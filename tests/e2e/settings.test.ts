// In the browser: a member sets reminder and quiet hours and sees them after a reload; the device list shows a
// virtual phone and removes it; the property page shows the weather panel — fresh, stale and empty. Screenshots
// at desktop and phone width go to TEST_ARTIFACTS_DIR.
import { randomInt, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import type { Kysely } from 'kysely';
import { createDb, createPool } from '@/db';
import type { Database } from '@/db/database';
import { loadDemo } from '@/db/demo';
import demoUsers from '@/db/demo-users.json';
import { recordForecastFailure, storeForecast } from '@/lib/data/forecasts';
import { gridCellKey, weatherClientFromEnv } from '@/lib/weather/client';
import { addMember, Client, createPlot, createProperty, signedInUser, type TestUser } from '../support/http';
import { baseUrl, DESKTOP, launchBrowser, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
let db: Kysely<Database>;
let member: { user: TestUser; client: Client };
let foxglove: { id: string; latitude: number; longitude: number; time_zone: string };
/** The member's own ground, in a 0.1° grid cell of its own: forecasts stored here touch no other test's cell. */
let hawthorn: { id: string; name: string };

const lonelyPlace = (baseLat: number, baseLon: number) => ({
  latitude: baseLat + randomInt(0, 900) / 1000,
  longitude: baseLon - randomInt(0, 900) / 1000,
});

const localDate = (ms: number, timeZone: string) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);

/** A 16-day forecast from the local fake weather service (Open-Meteo's API), stored as the worker stores one. */
async function fetchAndStore(place: { latitude: number; longitude: number; timeZone: string }, fetchedAt?: Date) {
  const client = weatherClientFromEnv(process.env);
  const forecast = await client.fetchForecast(
    { latitude: place.latitude, longitude: place.longitude, timeZone: place.timeZone, startDate: localDate(Date.now(), place.timeZone), days: 16 },
    new Date(),
  );
  const gridKey = gridCellKey(place.latitude, place.longitude);
  await storeForecast({
    gridKey,
    latitude: place.latitude,
    longitude: place.longitude,
    provider: client.provider,
    forecast: { ...forecast, fetchedAt: (fetchedAt ?? new Date()).toISOString() },
  });
  return gridKey;
}

beforeAll(async () => {
  db = createDb(createPool(process.env.DATABASE_URL));
  await loadDemo(db); // idempotent: other files may have loaded it too
  const ownerInfo = demoUsers.users.find((u) => u.role === 'owner')!;
  const owner = new Client('demo owner');
  if (!(await owner.signIn(ownerInfo.email, ownerInfo.password)).ok) throw new Error('the demo owner could not sign in');
  const row = await db
    .selectFrom('properties')
    .innerJoin('memberships', 'memberships.property_id', 'properties.id')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['properties.id', 'properties.latitude', 'properties.longitude', 'properties.time_zone'])
    .where('properties.name', '=', 'Foxglove Hollow Lease')
    .where('users.email', '=', ownerInfo.email)
    .executeTakeFirstOrThrow();
  foxglove = row;
  // A member of the demo club of their own, so this file's settings change nobody else's.
  member = await signedInUser('e2e-settings');
  await addMember(owner, foxglove.id, member, 'member');
  const place = lonelyPlace(41, -95);
  hawthorn = await createProperty(member.client, { name: 'Hawthorn Rise', ...place, timeZone: 'America/Chicago', elevationM: 330 });
  await createPlot(member.client, hawthorn.id, { name: 'Upper field', acres: 1.5, cover: 'grass-weeds' });
  await createPlot(member.client, hawthorn.id, { name: 'Spring draw', acres: 0.4, cover: 'existing-stand', sun: 'partial' });
  await fetchAndStore({ ...place, timeZone: 'America/Chicago' });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await db?.destroy();
});

async function memberPage(viewport = DESKTOP): Promise<Page> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await signIn(page, member.user.email, member.user.password);
  return page;
}

describe('settings in the browser', () => {
  it('a member changes the reminder hour and quiet hours, saves, reloads and sees them', async () => {
    const page = await memberPage();
    await page.goto(`${baseUrl()}/settings`);
    await page.getByRole('heading', { name: 'Settings', level: 1 }).waitFor();
    // The header links to the page.
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).getAttribute('aria-current')).toBe('page');

    await page.getByLabel('Reminder hour', { exact: true }).selectOption('6');
    await page.getByRole('checkbox', { name: /Quiet hours/ }).check();
    await page.getByLabel('Quiet from').selectOption('22');
    await page.getByLabel('Quiet until').selectOption('5');
    await expect.poll(() => page.getByText('Quiet from 22:00 to 05:00, overnight.').count()).toBe(1);

    // The same rule the server has: quiet hours cannot start and end together. The form says so and keeps the rest.
    await page.getByLabel('Quiet until').selectOption('22');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect.poll(() => page.getByText('Quiet hours must start and end at different hours').count()).toBe(1);
    expect(await page.getByLabel('Reminder hour', { exact: true }).inputValue()).toBe('6');
    await page.getByLabel('Quiet until').selectOption('5');

    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor();
    const saved = await member.client.get('/api/settings/notifications');
    expect(saved.body.settings).toMatchObject({ reminderHour: 6, quietStartHour: 22, quietEndHour: 5 });

    await page.reload();
    await page.getByRole('heading', { name: 'Settings', level: 1 }).waitFor();
    // The server's HTML carries no selected option for react-hook-form's uncontrolled selects: the saved
    // values appear once the page has hydrated, so wait for them rather than read the first paint.
    await expect.poll(() => page.getByLabel('Reminder hour', { exact: true }).inputValue(), { timeout: 10_000 }).toBe('6');
    expect(await page.getByRole('checkbox', { name: /Quiet hours/ }).isChecked()).toBe(true);
    expect(await page.getByLabel('Quiet from').inputValue()).toBe('22');
    expect(await page.getByLabel('Quiet until').inputValue()).toBe('5');
    // The reminder hour is said in the property's own zone.
    expect(await page.getByText(/Foxglove Hollow Lease: 06:00 America\/Chicago/).count()).toBe(1);
    expect(await page.getByText(/Hawthorn Rise: 06:00 America\/Chicago/).count()).toBe(1);
    await page.context().close();
  });

  it("lists the member's devices, a virtual phone among them, shows this browser's state, and removes a device", async () => {
    const pushUrl = process.env.FAKE_PUSH_URL;
    expect(pushUrl, 'the test run starts the fake push service').toBeTruthy();
    const { publicKey } = (await member.client.get('/api/settings/push')).body;
    const label = `Demo phone — ${member.user.name}`;
    const issued = await fetch(`${pushUrl}/_control/subscriptions`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ label, applicationServerKey: publicKey }),
    }).then((r) => r.json());
    expect((await member.client.post('/api/settings/push-subscriptions', { ...issued, label })).status).toBe(201);

    const page = await memberPage();
    await page.goto(`${baseUrl()}/settings`);
    const device = page.getByRole('listitem').filter({ hasText: label });
    await device.waitFor();
    // Headless Chromium on loopback is a secure context with a PushManager: the switch is there, and off.
    const state = await page.locator('[data-push-state]').getAttribute('data-push-state');
    expect(['off', 'unsupported', 'blocked']).toContain(state);
    expect(await page.getByText(/This device: (off|not supported|blocked)/).count()).toBe(1);
    await screenshot(page, 'settings-desktop');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'settings-phone');

    await device.getByRole('button', { name: /Remove/ }).click();
    await expect.poll(() => page.getByRole('listitem').filter({ hasText: label }).count()).toBe(0);
    const devices = (await member.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    expect(devices.map((d) => d.endpoint)).not.toContain(issued.endpoint);
    await page.context().close();
  });

  it('turning this device on either subscribes and lists it, or says why not and stores nothing', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    await context.grantPermissions(['notifications'], { origin: baseUrl() });
    const page = await context.newPage();
    await signIn(page, member.user.email, member.user.password);
    const before = (await member.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    await page.goto(`${baseUrl()}/settings`);
    await page.getByRole('button', { name: 'Turn on for this device' }).click();
    const outcome = page.getByRole('status').or(page.getByRole('alert')).filter({ hasText: /Notifications were not turned on|will get Sowcast’s notifications/ });
    await outcome.first().waitFor();
    const text = (await outcome.first().textContent()) ?? '';
    const after = (await member.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    if (text.includes('not turned on')) {
      // Headless Chromium has no push service to register with: the reason is shown and nothing is stored.
      expect(after).toEqual(before);
      expect(await page.locator('[data-push-state]').getAttribute('data-push-state')).toBe('off');
    } else {
      expect(after.length).toBe(before.length + 1);
      expect(await page.locator('[data-push-state]').getAttribute('data-push-state')).toBe('on');
    }
    await context.close();
  });
});

describe('the service worker (public/sw.js)', () => {
  it('shows a push payload {title, body, url, tag} as a notification, and a tap opens its page', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    await context.grantPermissions(['notifications'], { origin: baseUrl() });
    const page = await context.newPage();
    await signIn(page, member.user.email, member.user.password);
    await page.goto(`${baseUrl()}/settings`);
    const registered = context.waitForEvent('serviceworker');
    await page.evaluate(async () => {
      await navigator.serviceWorker.register('/sw.js');
      await navigator.serviceWorker.ready;
    });
    const worker = context.serviceWorkers()[0] ?? (await registered);
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null);

    // The payload as lib/notify/messages.ts builds it; the link may name another host for the same site.
    const target = `${baseUrl()}/properties/${foxglove.id}`;
    const payload = { title: 'Check germination on North corner today', body: 'Seeded Tue 24 Nov.', url: target.replace('127.0.0.1', 'localhost'), tag: `germination:${randomUUID()}` };
    // W3C Push API: a PushEvent carries the decrypted payload; the worker must show a notification (userVisibleOnly).
    const shown = await worker.evaluate(async (data) => {
      const sw = self as unknown as { dispatchEvent(e: Event): boolean; registration: ServiceWorkerRegistration };
      const PushEventCtor = (self as unknown as { PushEvent: new (type: string, init: { data: string }) => Event }).PushEvent;
      sw.dispatchEvent(new PushEventCtor('push', { data: JSON.stringify(data) }));
      for (let i = 0; i < 50; i++) {
        const list = await sw.registration.getNotifications({ tag: data.tag });
        if (list.length) return list.map((n) => ({ title: n.title, body: n.body, tag: n.tag, url: (n.data as { url: string }).url }));
        await new Promise((r) => setTimeout(r, 100));
      }
      return [];
    }, payload);
    expect(shown).toEqual([{ title: payload.title, body: payload.body, tag: payload.tag, url: target }]);

    // A tap (notificationclick) takes the open Sowcast tab to the page the notification is about.
    await worker.evaluate(async (tag) => {
      const sw = self as unknown as { dispatchEvent(e: Event): boolean; registration: ServiceWorkerRegistration };
      const [notification] = await sw.registration.getNotifications({ tag });
      const NotificationEventCtor = (self as unknown as { NotificationEvent: new (type: string, init: { notification: Notification }) => Event }).NotificationEvent;
      sw.dispatchEvent(new NotificationEventCtor('notificationclick', { notification }));
    }, payload.tag);
    await page.waitForURL(target);
    await context.close();
  });
});

describe('the weather panel on the property page', () => {
  it('shows the 16 days of the stored forecast with inches and mm, °F and °C, mph, the provider and its age', async () => {
    const answer = (await member.client.get(`/api/properties/${hawthorn.id}/weather`)).body;
    expect(answer.days.length).toBeGreaterThanOrEqual(15);
    expect(answer.stale).toBe(false);

    const page = await memberPage();
    await page.goto(`${baseUrl()}/properties/${hawthorn.id}`);
    const table = page.getByRole('table', { name: /Daily forecast/ });
    await table.waitFor();
    expect(await table.locator('tbody tr').count()).toBe(answer.days.length);
    const first = table.locator('tbody tr').first();
    // 1 in = 25.4 mm and °F = °C × 9/5 + 32 (NIST SP 811, appendix B); 1 mph = 1.609344 km/h (NIST Handbook 44).
    const day = answer.days[0];
    const inches = day.rainMm <= 0 ? '0 in' : day.rainMm / 25.4 < 0.005 ? 'trace' : `${(day.rainMm / 25.4).toFixed(2)} in`;
    const text = (await first.textContent()) ?? '';
    expect(text).toContain(inches);
    expect(text).toContain(`${Math.round((day.tMaxC * 9) / 5 + 32)} °F`);
    expect(text).toContain(`${Math.round(day.tMaxC)} °C`);
    expect(text).toContain(`${Math.round(day.windMaxKmh / 1.609344)} mph`);
    expect(text).toContain('Today');
    expect(await page.getByText(/open-meteo/).count()).toBeGreaterThan(0);
    expect(await page.getByText(/fetched (just now|\d+ min ago)/).count()).toBe(1);
    await screenshot(page, 'property-weather-desktop');

    await page.setViewportSize(PHONE);
    const cards = page.getByRole('list', { name: /Daily forecast/ });
    await cards.waitFor();
    expect(await cards.getByRole('listitem').count()).toBe(answer.days.length);
    await screenshot(page, 'property-weather-phone');
    await page.context().close();
  });

  it('says "Forecast is stale since …" when refreshes fail, and keeps showing the last good forecast', async () => {
    const place = { ...lonelyPlace(39, -94), timeZone: 'America/Chicago' };
    const property = await createProperty(member.client, { name: `Stale ground ${randomUUID().slice(0, 6)}`, ...place });
    const gridKey = await fetchAndStore(place, new Date(Date.now() - 5 * 3_600_000));
    await recordForecastFailure(gridKey, new Date(Date.now() - 3 * 3_600_000), 'WeatherError: The forecast server answered HTTP 500.');

    const page = await memberPage(PHONE);
    await page.goto(`${baseUrl()}/properties/${property.id}`);
    await page.getByText(/Forecast is stale since/).waitFor();
    expect(await page.getByText(/The forecast server answered HTTP 500\./).count()).toBe(1);
    expect(await page.getByRole('list', { name: /Daily forecast/ }).getByRole('listitem').count()).toBeGreaterThanOrEqual(15);
    await screenshot(page, 'property-weather-stale-phone');
    await page.setViewportSize(DESKTOP);
    await screenshot(page, 'property-weather-stale-desktop');
    await page.context().close();
  });

  it('before any forecast, says one is on its way', async () => {
    const property = await createProperty(member.client, {
      name: `New ground ${randomUUID().slice(0, 6)}`,
      ...lonelyPlace(31, -86),
      timeZone: 'America/Chicago',
    });
    const page = await memberPage();
    await page.goto(`${baseUrl()}/properties/${property.id}`);
    await page.getByText('No forecast yet — Sowcast fetches one within a few minutes of start').waitFor();
    await page.context().close();
  });
});
