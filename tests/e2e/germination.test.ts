// At phone size: the germination reminder's link opens the check form for that plot; a member counts plants,
// attaches a photo and saves; the poor stand brings a reseeding plan; a manager accepts it.
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { checkGermination } from '@/lib/notify/messages';
import { addMember, createPlot, createProperty, signedInUser } from '../support/http';
import { testDb } from '../support/db';
import { baseUrl, launchBrowser, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
const db = testDb();
type Person = Awaited<ReturnType<typeof signedInUser>>;
let owner: Person;
let manager: Person;
let member: Person;
let plot: { id: string; name: string };
let checkStepId: string;
let plantingId: string;
const today = new Date().toISOString().slice(0, 10);

beforeAll(async () => {
  browser = await launchBrowser();
  [owner, manager, member] = await Promise.all(['ge-owner', 'ge-manager', 'ge-member'].map((p) => signedInUser(p)));
  const property = await createProperty(owner.client, { name: 'Hollow Oak test ground', timeZone: 'UTC' });
  plot = await createPlot(owner.client, property.id, { name: 'North corner', acres: 0.5 });
  await addMember(owner.client, property.id, manager, 'manager');
  await addMember(owner.client, property.id, member, 'member');
  const planted = await owner.client.post(`/api/plots/${plot.id}/plantings`, {
    season: 'fall',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: today,
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  });
  expect(planted.status, planted.text).toBe(201);
  plantingId = planted.body.planting.id;
  checkStepId = planted.body.steps.find((s: { kind: string }) => s.kind === 'check-germination').id;
});

afterAll(async () => {
  await browser?.close();
  await db.destroy();
});

describe('germination check on a phone', () => {
  it('opens from the alert link, counts plants, attaches a photo, saves, and a manager accepts the reseeding', async () => {
    // The very link the e-mail and the push notification carry.
    const link = checkGermination({ baseUrl: baseUrl(), plotId: plot.id, stepId: checkStepId, plotName: plot.name, propertyName: 'Hollow Oak test ground', date: today }).push.url;
    expect(link).toBe(`${baseUrl()}/plots/${plot.id}/check?step=${checkStepId}`);

    const context = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    await signIn(page, member.user.email, member.user.password);
    await page.goto(link);
    await page.getByRole('heading', { name: 'Germination check', level: 1 }).waitFor();
    // White clover at 6 lb/acre (the middle of its published 4–8 lb/acre broadcast range: Alabama DCNR citing Ball et
    // al.; MSU Extension M1591) × 800,000 seeds/lb ÷ 43,560 ft² × 30–60 % establishing = 33–66 plants per ft².
    expect(await page.getByText(/should give 33–66 plants per sq ft/).count()).toBe(1);

    // Three spots: 2, 3 and 1 seedlings in the one-square-foot frame.
    await page.getByLabel('Plants at spot 1').fill('2');
    for (let i = 0; i < 3; i++) await page.getByRole('button', { name: 'One more at spot 2' }).tap();
    await page.getByLabel('Plants at spot 3').fill('1');
    await page.getByText('2.0 plants per sq ft').waitFor();
    await page.getByRole('radio', { name: /2 · Thin/ }).check();
    await page.getByRole('radio', { name: 'Moderate' }).check();
    await page.getByLabel('Notes').fill('Bare along the ridge, deer tracks');

    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#6b8f3a' } }).jpeg().toBuffer();
    await page.locator('#check-photos').setInputFiles({ name: 'north-corner.jpg', mimeType: 'image/jpeg', buffer: jpeg });
    await page.locator('[data-photo-state="done"]').waitFor();
    // The preview is the server's thumbnail, served to the member.
    const thumb = await page.locator('[data-photo-state="done"] img').getAttribute('src');
    expect(thumb).toMatch(/^\/api\/uploads\/[0-9a-f-]{36}\/thumb$/);
    await screenshot(page, 'germination-phone-form');

    // Touch targets: every button on the form is at least 44 px tall (WCAG 2.2 target size, enhanced).
    const heights = await page.locator('form button').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
    expect(Math.min(...heights)).toBeGreaterThanOrEqual(44);

    await page.getByRole('button', { name: 'Save the check' }).tap();
    await page.getByRole('heading', { name: 'Check saved' }).waitFor();
    expect(await page.locator('[data-verdict="poor"]').count()).toBeGreaterThan(0);
    await page.getByRole('heading', { name: 'Proposed reseeding' }).waitFor();
    expect(await page.getByText('A manager or owner of the property can accept this reseeding.').count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Accept the reseeding' }).count()).toBe(0);
    const proposal = page.locator('section[aria-labelledby="reseed-heading"]');
    expect(await proposal.locator('[data-step-kind="seed"]').count()).toBe(1);
    expect(await proposal.locator('[data-step-kind="spray"]').count()).toBe(0);
    expect(await proposal.getByText(/lb of seed/).count()).toBeGreaterThan(0);
    await screenshot(page, 'germination-phone-poor-stand');

    const row = await db.selectFrom('observations').selectAll().where('planting_id', '=', plantingId).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ frame_counts: [2, 3, 1], plants_per_sq_ft: 2, verdict: 'poor', weed_pressure: 'moderate', stand_rating: 2 });
    expect((await db.selectFrom('uploads').select('id').where('observation_id', '=', row.id).execute()).length).toBe(1);
    expect((await db.selectFrom('steps').select('status').where('id', '=', checkStepId).executeTakeFirstOrThrow()).status).toBe('done');
    await context.close();

    // The manager opens the same link later, sees the check with its photo, and accepts the reseeding.
    const managerContext = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    const mpage = await managerContext.newPage();
    await signIn(mpage, manager.user.email, manager.user.password);
    await mpage.goto(link);
    const earlier = mpage.locator(`[data-observation="${row.id}"]`);
    await earlier.waitFor();
    expect(await earlier.locator('img').count()).toBe(1);
    await earlier.getByRole('button', { name: 'See the reseeding for this check' }).tap();
    await earlier.getByRole('button', { name: 'Accept the reseeding' }).tap();
    await earlier.getByText('Reseeding planned').waitFor();
    await screenshot(mpage, 'germination-phone-reseed-accepted');
    const plantings = await db.selectFrom('plantings').select('id').where('plot_id', '=', plot.id).execute();
    expect(plantings.length).toBe(2);
    expect((await db.selectFrom('observations').select('reseed_planting_id').where('id', '=', row.id).executeTakeFirstOrThrow()).reseed_planting_id).not.toBeNull();
    await managerContext.close();
  }, 120_000);
});
