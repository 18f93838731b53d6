// In the browser: a manager opens Costs from the property page, books an expense and reads the split; a member
// has no Costs link and the page refuses them. Screenshots at desktop and phone width go to TEST_ARTIFACTS_DIR.
// The expected sentences are worked by hand: $120.00 shared by two is $60.00 each, so the payer is owed $60.00.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { addMember, Client, createPlot, createProperty, createUser, type TestUser } from '../support/http';
import { baseUrl, DESKTOP, launchBrowser, PHONE, screenshot, signIn } from './browser';

let browser: Browser;
let dana: TestUser, lee: TestUser, sam: TestUser;
let propertyId: string;

async function signedIn(user: TestUser) {
  const client = new Client(user.name);
  if (!(await client.signIn(user.email, user.password)).ok) throw new Error(`${user.name} could not sign in`);
  return client;
}

beforeAll(async () => {
  [dana, lee, sam] = await Promise.all([createUser('e2e-costs-dana', 'Dana Pell'), createUser('e2e-costs-lee', 'Lee Arden'), createUser('e2e-costs-sam', 'Sam Tully')]);
  const owner = await signedIn(dana);
  propertyId = (await createProperty(owner, { name: 'Larkspur Flats' })).id;
  await createPlot(owner, propertyId, { name: 'Creek bend', acres: 0.5 });
  await createPlot(owner, propertyId, { name: 'High meadow', acres: 1.5 });
  await addMember(owner, propertyId, { user: lee, client: await signedIn(lee) }, 'manager');
  await addMember(owner, propertyId, { user: sam, client: await signedIn(sam) }, 'member');
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function pageFor(user: TestUser, viewport: { width: number; height: number }): Promise<Page> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await signIn(page, user.email, user.password);
  return page;
}

describe('costs', () => {
  it('a manager adds an expense from the property page and sees who owes whom', async () => {
    const page = await pageFor(lee, DESKTOP);
    await page.goto(`${baseUrl()}/properties/${propertyId}`);
    await page.getByRole('link', { name: 'Costs' }).click();
    await page.waitForURL(`**/properties/${propertyId}/costs`);
    await page.getByRole('heading', { name: 'Add an expense' }).waitFor();

    const form = page.getByRole('form', { name: 'Add an expense' });
    await form.getByLabel('Date').fill('2027-08-28');
    await form.getByLabel('Plot').selectOption({ label: 'Creek bend' });
    await form.getByLabel('Category').selectOption('seed');
    await form.getByLabel('Amount (USD)').fill('120');
    await form.getByLabel('What it was').fill('Clover and rye seed');
    // Paid by defaults to the person booking it.
    expect(await form.getByLabel('Paid by').inputValue()).toBe(lee.id);
    // The season follows the date: late August books to fall 2027.
    expect(await form.getByLabel('Season').inputValue()).toBe('fall');
    await form.getByLabel('Dana Pell').check();
    await form.getByLabel('Lee Arden').check();
    await form.getByRole('button', { name: 'Add expense' }).click();
    await page.getByText('Saved “Clover and rye seed”.').waitFor();

    await page.getByText('Lee Arden paid $120.00, share $60.00, is owed $60.00').waitFor();
    await expect.poll(() => page.getByText('Dana Pell paid $0.00, share $60.00, owes $60.00').count()).toBe(1);
    await expect.poll(() => page.getByText('Sam Tully paid $0.00, share $0.00, is even').count()).toBe(1);
    const settle = page.getByRole('list', { name: 'Payments to settle up' });
    expect((await settle.innerText()).replace(/\s+/g, ' ').trim()).toBe('Dana Pell pays Lee Arden $60.00');
    // Per plot: all of it on Creek bend, $120 / 0.5 ac = $240.00 an acre.
    const creek = page.getByRole('table', { name: 'Costs per plot' }).getByRole('row', { name: /Creek bend/ });
    expect((await creek.innerText()).replace(/\s+/g, ' ')).toContain('$120.00 $240.00');
    // Bad input is named under its field and nothing is saved.
    await form.getByLabel('What it was').fill('Fuel');
    await form.getByLabel('Category').selectOption('fuel');
    await form.getByLabel('Amount (USD)').fill('12.345');
    await form.getByRole('button', { name: 'Add expense' }).click();
    await form.getByText('Amount must be dollars and cents, like 120 or 120.50').waitFor();
    await screenshot(page, 'costs-desktop');
    expect(await page.getByRole('list', { name: 'Expense list' }).getByRole('listitem').count()).toBe(1);

    const phone = await pageFor(lee, PHONE);
    await phone.goto(`${baseUrl()}/properties/${propertyId}/costs`);
    await phone.getByText('Lee Arden paid $120.00, share $60.00, is owed $60.00').waitFor();
    // Nothing runs off the side of a phone screen but the wide tables, which scroll inside their cards.
    const overflow = await phone.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(phone, 'costs-phone');
    await page.context().close();
    await phone.context().close();
  });

  it('a member gets no Costs link and the page refuses them', async () => {
    const page = await pageFor(sam, PHONE);
    await page.goto(`${baseUrl()}/properties/${propertyId}`);
    await page.getByRole('heading', { name: 'Larkspur Flats' }).waitFor();
    expect(await page.getByRole('link', { name: 'Costs' }).count()).toBe(0);
    await page.goto(`${baseUrl()}/properties/${propertyId}/costs`);
    await page.getByText(/Only a manager or owner of this property can do that/).waitFor();
    expect(await page.getByRole('heading', { name: 'Add an expense' }).count()).toBe(0);
    await screenshot(page, 'costs-member-phone');
    await page.context().close();
  });
});
