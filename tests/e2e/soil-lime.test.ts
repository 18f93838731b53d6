// Lime from the soil test, in Chromium: a plot's latest soil test (pH 5.0, Mehlich buffer pH 6.3, Ac 1.2 — the
// NCDA&CS lime factor page's own example numbers) fills the planting form with the lime for the blend's target
// pH (white clover 6.5, food plot guides): 1.2 × (6.5 − 5.0)/(6.6 − 5.0) = 1.125 t/acre of standard lime,
// shown to the hundredth (1.13). The blend is all clover, so no N target is offered (Penn State Extension,
// "Nitrogen Management for Legumes"). Seeding five weeks out leaves no time for lime to react, so the previewed
// plan's lime step says "lime now; it needs months to react — expect the full effect next season"
// (Mississippi State Extension: three to six months before planting). Screenshots are test artifacts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';
import { fileForm, sendForm } from '../integration/upload-helpers';
import { baseUrl, DESKTOP, launchBrowser, PHONE, screenshot, signIn } from './browser';

const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
const plusDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

let browser: Browser;
let owner: { user: TestUser; client: Client };
let plotId: string;

beforeAll(async () => {
  owner = await signedInUser('lime-owner');
  const property = await createProperty(owner.client, { timeZone: 'America/New_York' });
  const plot = await createPlot(owner.client, property.id, { cover: 'tilled', acres: 1 });
  plotId = plot.id;
  const res = await sendForm(
    owner.client,
    `/api/plots/${plotId}/soil-tests`,
    fileForm('report.pdf', PDF, 'application/pdf', { ph: '5.0', bufferPh: '6.3', bufferMethod: 'mehlich', acidityMeq: '1.2', p2o5LbPerAcre: '40', nLbPerAcre: '30', sampledOn: plusDays(-3) }),
  );
  if (res.status !== 201) throw new Error(`soil test answered ${res.status}: ${res.text}`);
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('lime from the soil test', () => {
  it('fills the lime for the blend’s target pH, offers no N for clover alone, and says the lime needs months', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, owner.user.email, owner.user.password);
    await page.goto(`${baseUrl()}/plots/${plotId}`);
    await page.getByLabel('Season', { exact: true }).selectOption('fall');
    await page.getByLabel('Method', { exact: true }).selectOption('prepared-seedbed');
    await page.getByLabel('Planned seeding date', { exact: true }).fill(plusDays(35));
    await page.getByLabel(/^Ready by/).fill('');
    // Worked ground: nothing to spray.
    await page.locator('#useHerbicide').uncheck();
    await page.getByLabel('Species 1', { exact: true }).selectOption('white-clover');
    await page.getByLabel('Share', { exact: true }).fill('1');

    await page.getByRole('button', { name: 'Fill from the latest soil test' }).click();
    const filled = page.getByText(/^Filled from the soil test sampled/);
    await filled.waitFor();
    const message = (await filled.textContent()) ?? '';
    expect(message).toContain('Lime for this blend (target pH 6.5 for white clover (ladino type)): 1.13 tons of standard agricultural lime per acre');
    expect(message).toContain('NCDA&CS method');
    expect(await page.getByLabel('Lime (tons per acre)', { exact: true }).inputValue()).toBe('1.13');
    // All clover: the soil test's 30 lb of N is not filled in and there is no N field to fill.
    expect(await page.getByLabel(/^N target/).count()).toBe(0);
    expect(await page.getByText('No N target for an all-legume blend').count()).toBe(1);
    for (const [i, grade] of ['0', '20', '20'].entries()) await page.locator(`#fertilizer-grade-${i}`).fill(grade);

    await page.getByRole('button', { name: 'Preview' }).click();
    const preview = page.locator('section[aria-labelledby="preview-heading"]');
    await preview.waitFor();
    const lime = preview.locator('li[data-step-kind="lime"]').first();
    await lime.waitFor();
    const limeText = (await lime.textContent()) ?? '';
    // The plan shows the reason with its first letter raised ("Lime now; …").
    expect(limeText).toMatch(/lime now; it needs months to react — expect the full effect next season/i);
    // 1.125 t → 1.13 t on one acre = 2,260 lb.
    expect(limeText).toContain('2,260 lb of lime');
    await lime.scrollIntoViewIfNeeded();
    await screenshot(page, 'soil-lime-preview-desktop');
    await page.setViewportSize(PHONE);
    await lime.scrollIntoViewIfNeeded();
    await screenshot(page, 'soil-lime-preview-phone');
    await context.close();
    // Two page loads, a fill and a preview: past a minute on a loaded two-core machine.
  }, 150_000);
});
