// The planner with a 2,4-D ester + glyphosate burndown before clover: the form offers the actives with their
// typical plant-back and the "label is the law" note, and the plan moves the seeding past the plant-back and
// says why. Penn State Extension, "Including 2,4-D in the Burndown": 2,4-D labels ask 30 days before crops
// other than corn, soybeans, sorghum and small grains (clover among them). Illinois IPM Bulletin (2012): no
// tillage for 7 days after a 2,4-D ester, so the kill wait is 7 days when none is entered.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import demoUsers from '@/db/demo-users.json';
import { intlDay } from '../unit/schedule/plantings';
import { DESKTOP, launchBrowser, loadDemoData, openPlot, PHONE, screenshot, signIn } from './browser';

let browser: Browser;

beforeAll(async () => {
  await loadDemoData();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

const manager = demoUsers.users.find((u) => u.role === 'manager')!;

const now = new Date();
const year = now.getUTCFullYear() + 1;
const seedDate = `${year}-04-15`;

/** "Sat 8 May", as the engine writes a day with its month (weekday from Intl, ECMA-402). */
const dayWithMonth = (date: string) => intlDay(date, true);

describe('the planner with a 2,4-D ester burndown before clover', () => {
  it('shows the plant-back and the moved seeding, with the herbicide cautions', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, manager.email, manager.password);
    await openPlot(page, /Foxglove Hollow Lease/, 'Creekside strip');

    await page.getByLabel('Season', { exact: true }).selectOption('spring');
    await page.getByLabel('Method', { exact: true }).selectOption('prepared-seedbed');
    await page.getByLabel('Planned seeding date', { exact: true }).fill(seedDate);
    await page.getByLabel(/^Ready by/).fill('');
    await page.getByLabel('Species 1', { exact: true }).selectOption('white-clover');
    await page.getByLabel('Share', { exact: true }).fill('1');
    await page.getByLabel('Product name', { exact: true }).fill('Example burndown mix');
    await page.getByRole('checkbox', { name: 'glyphosate', exact: true }).check();
    await page.getByRole('checkbox', { name: '2,4-D ester', exact: true }).check();
    await page.getByLabel('Rate given as', { exact: true }).selectOption('percent-solution');
    await page.getByLabel(/^Rate \(% solution\)/).fill('2');
    await page.getByLabel('Sprayer tank (gal)', { exact: true }).fill('4');
    await page.getByLabel('Spray volume (gal per acre)', { exact: true }).fill('15');

    // The form shows what the actives mean for this blend, and that the label governs.
    const meaning = page.getByRole('list', { name: 'What the actives mean for this blend' });
    await expect.poll(() => meaning.textContent(), { timeout: 20_000 }).toContain('clovers and other legumes: 30 days');
    expect(await page.getByText(/the label on your jug is the law/).count()).toBeGreaterThan(0);
    await screenshot(page, 'planner-plant-back-form-desktop');
    const shot = (name: string) => `${process.env.TEST_ARTIFACTS_DIR ?? '.test-artifacts'}/${name}.png`;
    await page.locator('fieldset', { has: page.getByRole('checkbox', { name: 'glyphosate', exact: true }) }).last().screenshot({ path: shot('planner-plant-back-actives-desktop') });

    await page.getByRole('button', { name: 'Preview' }).click();
    const preview = page.locator('section[aria-labelledby="preview-heading"]');
    await preview.waitFor();
    // Spraying 7 days before the target (the ester's kill wait), seeding 30 days after the spraying.
    const sprayDate = new Date(Date.parse(`${seedDate}T12:00:00Z`) - 7 * 86_400_000).toISOString().slice(0, 10);
    const seedingDate = new Date(Date.parse(`${sprayDate}T12:00:00Z`) + 30 * 86_400_000).toISOString().slice(0, 10);
    // The planner shows each reason as a sentence, so it starts with a capital.
    await expect.poll(() => preview.getByText(/Held until the plant-back ends/).count(), { timeout: 30_000 }).toBeGreaterThan(0);
    const text = (await preview.textContent()) ?? '';
    expect(text).toContain(`Held until the plant-back ends ${dayWithMonth(seedingDate)}`);
    expect(text).toContain('2,4-D ester typically needs 30 days between spraying and sowing clovers and other legumes');
    expect(text).toContain(`Seeding moved from ${dayWithMonth(seedDate)} to ${dayWithMonth(seedingDate)}`);
    const cautions = (await preview.locator('section[aria-label="Cautions"]').first().textContent()) ?? '';
    expect(cautions).toMatch(/label is the law/i);
    expect(cautions).toMatch(/protective equipment/i);
    expect(cautions).toMatch(/drift/i);
    await screenshot(page, 'planner-plant-back-preview-desktop');
    await preview.screenshot({ path: shot('planner-plant-back-preview-section-desktop') });

    await page.setViewportSize(PHONE);
    await preview.scrollIntoViewIfNeeded();
    await screenshot(page, 'planner-plant-back-preview-phone');
    await preview.screenshot({ path: shot('planner-plant-back-preview-section-phone') });
    await context.close();
  }, 240_000);
});
