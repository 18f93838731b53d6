import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demoUsers from '@/db/demo-users.json';
import { DESKTOP, launchBrowser, openPlot, PHONE, screenshot, signIn, loadDemoData } from './browser';

let browser: Browser;

beforeAll(async () => {
  await loadDemoData();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

const user = (role: string) => demoUsers.users.find((u) => u.role === role)!;

const openCreeksideStrip = (page: Page) => openPlot(page, /Foxglove Hollow Lease/, 'Creekside strip');

// A spring seeding comfortably ahead of whatever "today" the run has.
const now = new Date();
const seedYear = now.getUTCFullYear() + (now.getUTCMonth() >= 2 ? 1 : 0);
const seedDate = `${seedYear}-03-20`;

describe('the plot planner', () => {
  it('lets the demo manager plan a spray-and-seed planting and shows what to carry, the cautions and the steps in order', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const manager = user('manager');
    await signIn(page, manager.email, manager.password);
    await openCreeksideStrip(page);
    expect(await page.getByText('0.5 ac').count()).toBeGreaterThan(0);

    await page.getByLabel('Season', { exact: true }).selectOption('spring');
    await page.getByLabel('Method', { exact: true }).selectOption('spray-and-seed');
    await page.getByLabel('Planned seeding date', { exact: true }).fill(seedDate);
    await page.getByLabel(/^Ready by/).fill('');
    await page.getByLabel('Species 1', { exact: true }).selectOption('white-clover');
    await page.getByLabel('Share', { exact: true }).fill('1');
    await page.getByLabel(/^Seed bag size/).fill('8.5');
    // The bag's label: 8.5 lb covers one acre.
    await page.getByLabel(/^Bag label: seed/).fill('8.5');
    await page.getByLabel(/^Bag label: covers/).fill('1');
    await page.getByLabel('Product name', { exact: true }).fill('Generic glyphosate 41%');
    await page.getByLabel(/^Active ingredient/).fill('41');
    await page.getByLabel('Rate given as', { exact: true }).selectOption('percent-solution');
    await page.getByLabel(/^Rate \(% solution\)/).fill('2');
    await page.getByLabel(/^Rainfast period/).fill('2');
    await page.getByLabel('Sprayer tank (gal)', { exact: true }).fill('4');
    await page.getByLabel('Spray volume (gal per acre)', { exact: true }).fill('15');

    await page.getByRole('button', { name: 'Preview' }).click();
    const preview = page.locator('section[aria-labelledby="preview-heading"]');
    await preview.waitFor();
    // 0.5 acre × 15 gal/acre = 7.5 gal of spray; a 4-gal tank needs ceil(7.5 / 4) = 2 fills (arithmetic).
    await expect.poll(() => preview.getByText(/2 sprayer fills/).count()).toBeGreaterThan(0);
    // Broadcasting into standing, sprayed cover at twice the bag's label rate: common practice, no source. Half an
    // acre at 2 × 8.5 lb/acre is 8.5 lb, one bag (the worked case of the issue).
    expect(await preview.getByText('8.5 lb of seed — 1 bag (2× the bag rate of 8.5 lb/acre — common practice for seed broadcast into dying cover)').count()).toBeGreaterThan(0);
    // White clover is a legume: the inoculant reminder is on the list (UF/IFAS Extension SS-AGR-28).
    expect(await preview.getByText(/Inoculant made for white clover/).count()).toBeGreaterThan(0);
    await screenshot(page, 'planner-preview-desktop');

    await page.getByRole('button', { name: 'Save planting' }).click();
    await expect.poll(() => page.getByText(/^Saved: a planting of \d+ steps/).count()).toBeGreaterThan(0);

    const planting = page.locator(`section[aria-label="spring ${seedYear} planting"]`).first();
    await planting.waitFor();
    expect(await planting.getByText(/2× the bag rate of 8\.5 lb\/acre/).count()).toBeGreaterThan(0);
    expect(await planting.getByText(/2 sprayer fills/).count()).toBeGreaterThan(0);
    // "The label is the law" is the U.S. EPA's own phrase for pesticide labels (FIFRA); protective equipment
    // and drift are what every burndown label asks about.
    const cautions = planting.locator('section[aria-label="Cautions"]');
    expect(await cautions.count()).toBeGreaterThan(0);
    const cautionText = (await cautions.first().textContent()) ?? '';
    expect(cautionText).toMatch(/label is the law/i);
    expect(cautionText).toMatch(/protective equipment/i);
    expect(cautionText).toMatch(/drift/i);

    // Spray before seed before the germination check: a burndown must kill the cover the seed goes into,
    // and there is nothing to check before seeding.
    const kinds = await planting.locator('li[data-step-kind]').evaluateAll((items) => items.map((li) => li.getAttribute('data-step-kind')));
    const spray = kinds.indexOf('spray');
    const seed = kinds.indexOf('seed');
    const check = kinds.indexOf('check-germination');
    expect(spray).toBeGreaterThanOrEqual(0);
    expect(seed).toBeGreaterThan(spray);
    expect(check).toBeGreaterThan(seed);

    // The manager gets the controls on each saved step.
    expect(await planting.getByLabel('Assigned to').count()).toBeGreaterThan(0);
    expect(await planting.getByRole('button', { name: 'Pin the date' }).count()).toBeGreaterThan(0);
    expect(await planting.getByRole('button', { name: 'Mark done' }).count()).toBeGreaterThan(0);

    await screenshot(page, 'planner-saved-desktop');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'planner-saved-phone');
    await context.close();
  });

  it('starts a planting from a saved blend of the property and takes a seeding day from the comparison', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const manager = user('manager');
    await signIn(page, manager.email, manager.password);
    await openCreeksideStrip(page);

    // The demo club keeps "Fall clover and cereal" (white clover 0.5 + cereal rye 0.5) on its lease.
    const saved = page.getByLabel('Saved blends of this property', { exact: true });
    await expect.poll(() => saved.locator('option').count()).toBeGreaterThan(1);
    await saved.selectOption({ label: 'Fall clover and cereal' });
    await page.getByRole('button', { name: 'Use this blend' }).click();
    expect(await page.getByLabel('Species 1', { exact: true }).inputValue()).toBe('white-clover');
    expect(await page.getByLabel('Species 2', { exact: true }).inputValue()).toBe('cereal-rye');

    // Keep the current rows under a new name; the same name again is refused with a reason.
    const name = `Lease mix ${Date.now()}`;
    await page.getByLabel('Keep the blend above as', { exact: true }).fill(name);
    await page.getByRole('button', { name: 'Save blend' }).click();
    await expect.poll(() => page.getByText(`Saved the blend “${name}”.`).count()).toBe(1);
    await page.getByLabel('Keep the blend above as', { exact: true }).fill(name.toUpperCase());
    await page.getByRole('button', { name: 'Save blend' }).click();
    await expect.poll(() => page.getByText('This property already has a blend with that name').count()).toBe(1);

    await page.getByLabel('Season', { exact: true }).selectOption('spring');
    await page.getByLabel('Method', { exact: true }).selectOption('spray-and-seed');
    await page.getByLabel('Product name', { exact: true }).fill('Generic glyphosate 41%');
    await page.getByLabel('Rate given as', { exact: true }).selectOption('percent-solution');
    await page.getByLabel(/^Rate \(% solution\)/).fill('2');
    await page.getByLabel('Sprayer tank (gal)', { exact: true }).fill('4');
    await page.getByLabel('Spray volume (gal per acre)', { exact: true }).fill('15');

    const second = `${seedYear}-04-03`;
    await page.getByLabel('Seeding day 1', { exact: true }).fill(seedDate);
    await page.getByLabel('Seeding day 2', { exact: true }).fill(second);
    await page.getByRole('button', { name: 'Compare', exact: true }).click();
    const options = page.locator('section[aria-labelledby="compare-heading"] article');
    await expect.poll(() => options.count()).toBe(2);
    expect(await options.nth(0).getByText('Emergence').count()).toBe(1);
    expect(await options.nth(0).getByText('Frost margin').count()).toBe(1);
    await options.nth(1).getByRole('button', { name: 'Plan seeding on this day' }).click();
    expect(await page.getByLabel('Planned seeding date', { exact: true }).inputValue()).toBe(second);
    expect(await options.nth(1).getByRole('button', { name: /^Seeding set to/ }).getAttribute('aria-pressed')).toBe('true');
    await screenshot(page, 'planner-compare-desktop');
    await context.close();
  });

  it('shows the demo viewer the plan without planning, assigning or completing controls', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const viewer = user('viewer');
    await signIn(page, viewer.email, viewer.password);
    await openCreeksideStrip(page);
    await page.getByRole('heading', { name: 'Plantings and their steps' }).waitFor();
    expect(await page.locator('li[data-step-kind]').count()).toBeGreaterThan(0);
    expect(await page.getByRole('heading', { name: 'Plan a planting' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Save planting' }).count()).toBe(0);
    expect(await page.getByLabel('Assigned to').count()).toBe(0);
    expect(await page.getByRole('button', { name: /Pin the date|Unpin the date/ }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Mark done' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Skip' }).count()).toBe(0);
    await screenshot(page, 'planner-viewer-phone');
    await context.close();
  });
});
