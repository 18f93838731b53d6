// Costs and the split. Sources named per check: the largest-remainder (Hamilton) apportionment and its quota
// property — each part is its exact quota rounded down or up — as Balinski & Young, "Fair Representation"
// (1982) describe it (from memory); US-dollar formatting by ECMA-402 Intl.NumberFormat ('en-US', currency USD);
// every other expected value is worked by hand in the comment beside it.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  balanceSentence, costSplit, costSummary, equalShares, formatCents, largestRemainder, settle,
  type CostExpense, type PersonBalance,
} from '@/lib/planning/costs';
import { dollarsToCents, expenseSchema } from '@/lib/validations/expense';

const expense = (o: Partial<CostExpense> & Pick<CostExpense, 'amountCents'>): CostExpense => ({
  id: Math.random().toString(36).slice(2),
  plotId: null,
  season: 'fall',
  year: 2027,
  category: 'seed',
  labourHours: null,
  paidBy: 'dana',
  splitAmong: [],
  ...o,
});

const DANA = { id: 'dana', name: 'Dana' };
const LEE = { id: 'lee', name: 'Lee' };
const SAM = { id: 'sam', name: 'Sam' };

describe('largest remainder', () => {
  it('$100.00 among three: 3333.33… each, the one odd cent to the first (worked by hand)', () => {
    // 10000 / 3 = 3333.333…; floors 3333 × 3 = 9999; 1 cent left; equal remainders → list order.
    expect(equalShares(10_000, 3)).toEqual([3334, 3333, 3333]);
  });

  it('$100.01 among three: two odd cents (worked by hand)', () => {
    // 10001 / 3 = 3333.667; floors sum 9999; 2 cents left → the first two.
    expect(equalShares(10_001, 3)).toEqual([3334, 3334, 3333]);
  });

  it('$10.00 spread over 0.5, 1.2, 0.25 and 0.8 acres (worked by hand)', () => {
    // Σ 2.75 ac. Quotas: 181.82, 436.36, 90.91, 290.91 → floors 181 + 436 + 90 + 290 = 997; 3 cents left, to
    // the largest remainders .909 (0.25 ac), .909 (0.8 ac), .818 (0.5 ac).
    expect(largestRemainder(1_000, [0.5, 1.2, 0.25, 0.8])).toEqual([182, 436, 91, 291]);
  });

  it('always sums exactly to the amount, and each part is its quota rounded down or up (quota property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 100_000_000 }),
        fc.array(fc.double({ min: 0.01, max: 500, noNaN: true }), { minLength: 1, maxLength: 12 }),
        (total, weights) => {
          const parts = largestRemainder(total, weights);
          expect(parts.reduce((a, b) => a + b, 0)).toBe(total);
          const sum = weights.reduce((a, b) => a + b, 0);
          parts.forEach((p, i) => {
            expect(Number.isInteger(p)).toBe(true);
            const quota = (total * weights[i]) / sum;
            expect(p).toBeGreaterThanOrEqual(Math.floor(quota) - 1e-9);
            expect(p).toBeLessThanOrEqual(Math.ceil(quota) + 1e-9);
          });
        },
      ),
    );
  });

  it('refuses fractional cents and empty splits rather than guessing', () => {
    expect(() => largestRemainder(10.5, [1])).toThrow(/whole/);
    expect(() => largestRemainder(100, [])).toThrow(/at least one/);
    expect(() => largestRemainder(100, [0, 0])).toThrow(/positive/);
  });
});

describe('cost per acre, season and category', () => {
  const plots = [
    { id: 'a', name: 'Creek', acres: 0.5 },
    { id: 'b', name: 'Ridge', acres: 1.5 },
  ];

  it('books plot costs to their plot and spreads whole-property costs by acres (worked by hand)', () => {
    const summary = costSummary(
      [
        expense({ plotId: 'a', amountCents: 12_000, category: 'seed' }), // $120 seed on Creek
        expense({ plotId: null, amountCents: 8_000, category: 'fuel', season: 'spring', year: 2027, labourHours: null }), // $80 fuel, whole property
        expense({ plotId: 'b', amountCents: 0, category: 'labour', labourHours: 6 }),
      ],
      plots,
    );
    // $80 over 0.5 : 1.5 ac → $20 and $60. Creek 120 + 20 = $140 over 0.5 ac = $280/ac; Ridge $60 / 1.5 = $40/ac.
    expect(summary.plots).toEqual([
      { plotId: 'a', plotName: 'Creek', acres: 0.5, directCents: 12_000, sharedCents: 2_000, totalCents: 14_000, perAcreCents: 28_000 },
      { plotId: 'b', plotName: 'Ridge', acres: 1.5, directCents: 0, sharedCents: 6_000, totalCents: 6_000, perAcreCents: 4_000 },
    ]);
    // $200 over 2 ac = $100/ac.
    expect(summary).toMatchObject({ totalCents: 20_000, propertyWideCents: 8_000, unspreadCents: 0, totalAcres: 2, perAcreCents: 10_000, labourHours: 6 });
    expect(summary.byCategory).toEqual({ seed: 12_000, fuel: 8_000, labour: 0 });
    // Seasons in time order: spring 2027 before fall 2027.
    expect(summary.seasons.map((s) => [s.season, s.year, s.totalCents, s.labourHours])).toEqual([
      ['spring', 2027, 8_000, 0],
      ['fall', 2027, 12_000, 6],
    ]);
    // Per-plot totals add up to the grand total exactly.
    expect(summary.plots.reduce((a, p) => a + p.totalCents, 0)).toBe(summary.totalCents);
  });

  it('an odd amount over plots still adds up to the cent', () => {
    const summary = costSummary([expense({ amountCents: 1_001 })], [...plots, { id: 'c', name: 'Gap', acres: 0.25 }]);
    expect(summary.plots.reduce((a, p) => a + p.sharedCents, 0)).toBe(1_001);
  });

  it('a property without plots keeps its whole-property costs unspread and says so', () => {
    const summary = costSummary([expense({ amountCents: 500 })], []);
    expect(summary).toMatchObject({ totalCents: 500, unspreadCents: 500, perAcreCents: null, plots: [] });
  });
});

describe('the split', () => {
  it('Dana paid $120.00, share $80.00, is owed $40.00; Lee pays Dana $40.00 (worked by hand)', () => {
    // Seed $120 paid by Dana, shared by Dana and Lee: $60 each. Fuel $40 paid by Lee, shared: $20 each.
    // Dana: paid 120, share 60 + 20 = 80, balance +40. Lee: paid 40, share 80, balance −40.
    const split = costSplit(
      [expense({ amountCents: 12_000, paidBy: 'dana', splitAmong: ['dana', 'lee'] }), expense({ amountCents: 4_000, paidBy: 'lee', splitAmong: ['lee', 'dana'] })],
      [DANA, LEE, SAM],
    );
    expect(split.people.map(balanceSentence)).toEqual([
      'Dana paid $120.00, share $80.00, is owed $40.00',
      'Lee paid $40.00, share $80.00, owes $40.00',
      'Sam paid $0.00, share $0.00, is even',
    ]);
    expect(split.transfers).toEqual([{ fromId: 'lee', fromName: 'Lee', toId: 'dana', toName: 'Dana', amountCents: 4_000 }]);
  });

  it('an empty split means everyone who shares costs, and greedy settling pays the largest debt first (worked by hand)', () => {
    // Seed $120 by Dana among all three: $40 each. Fuel $30 by Lee among Lee and Sam: $15 each.
    // Dana +80 (120 − 40); Lee −25 (30 − 55); Sam −55 (0 − 55).
    // Largest debtor Sam (55) pays the largest creditor Dana: $55; then Lee pays Dana $25.
    const split = costSplit(
      [expense({ amountCents: 12_000, paidBy: 'dana' }), expense({ amountCents: 3_000, paidBy: 'lee', splitAmong: ['sam', 'lee'] })],
      [DANA, LEE, SAM],
    );
    expect(split.people.map((p) => [p.name, p.paidCents, p.shareCents, p.balanceCents])).toEqual([
      ['Dana', 12_000, 4_000, 8_000],
      ['Lee', 3_000, 5_500, -2_500],
      ['Sam', 0, 5_500, -5_500],
    ]);
    expect(split.transfers.map((t) => [t.fromName, t.toName, t.amountCents])).toEqual([
      ['Sam', 'Dana', 5_500],
      ['Lee', 'Dana', 2_500],
    ]);
  });

  it('odd cents: $100.00 among three shares to exactly $100.00, and the odd cent lands on one person', () => {
    const split = costSplit([expense({ amountCents: 10_000, paidBy: 'dana' })], [DANA, LEE, SAM]);
    expect(split.people.reduce((a, p) => a + p.shareCents, 0)).toBe(10_000);
    expect(split.people.map((p) => p.shareCents).sort()).toEqual([3_333, 3_333, 3_334]);
    // Dana +66.66 or +66.67; the transfers together clear it exactly.
    const received = split.transfers.filter((t) => t.toId === 'dana').reduce((a, t) => a + t.amountCents, 0);
    expect(received).toBe(split.people.find((p) => p.personId === 'dana')!.balanceCents);
  });

  it('an expense whose payer no longer exists stays out of the split and is reported', () => {
    const split = costSplit([expense({ amountCents: 700, paidBy: null })], [DANA, LEE]);
    expect(split.unsplitCents).toBe(700);
    expect(split.people.every((p) => p.balanceCents === 0)).toBe(true);
  });

  it('settling random balances: everyone ends even, in at most n − 1 payments, never a payment of nothing', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { minLength: 1, maxLength: 10 }), (raw) => {
        const balances: PersonBalance[] = raw.map((b, i) => ({ personId: `p${i}`, name: `P${i}`, paidCents: 0, shareCents: 0, balanceCents: b }));
        // Make them sum to zero, as a real split always does.
        balances[0].balanceCents -= raw.reduce((a, b) => a + b, 0);
        const transfers = settle(balances);
        const left = new Map(balances.map((b) => [b.personId, b.balanceCents]));
        for (const t of transfers) {
          expect(t.amountCents).toBeGreaterThan(0);
          left.set(t.fromId, left.get(t.fromId)! + t.amountCents);
          left.set(t.toId, left.get(t.toId)! - t.amountCents);
        }
        expect([...left.values()].every((v) => v === 0)).toBe(true);
        expect(transfers.length).toBeLessThanOrEqual(Math.max(0, balances.length - 1));
      }),
    );
  });

  it('refuses balances that do not sum to zero', () => {
    expect(() => settle([{ personId: 'a', name: 'A', paidCents: 0, shareCents: 0, balanceCents: 5 }])).toThrow(/sum to zero/);
  });
});

describe('money in and out', () => {
  it('formats cents as US dollars (ECMA-402 Intl.NumberFormat en-US, USD)', () => {
    expect(formatCents(12_000)).toBe('$120.00');
    expect(formatCents(123_456_789)).toBe('$1,234,567.89');
    expect(formatCents(5)).toBe('$0.05');
  });

  it('reads typed dollars into exact cents, with no float rounding (0.29 × 100 = 28.999… in IEEE 754)', () => {
    expect(0.29 * 100).not.toBe(29);
    expect(dollarsToCents('0.29')).toBe(29);
    expect(dollarsToCents(0.29)).toBe(29);
    expect(dollarsToCents('$1,204.5')).toBe(120_450);
    expect(dollarsToCents('120')).toBe(12_000);
    for (const bad of ['12.345', '-5', 'abc', '1,20', '', '1e3']) expect(dollarsToCents(bad), bad).toBeNull();
  });

  it('the form schema turns the amount into cents and names the bad field', () => {
    const ok = expenseSchema.parse({
      plotId: '', season: 'fall', year: '2027', spentOn: '2027-08-30', category: 'seed', description: 'Clover seed',
      amount: '89.99', paidBy: '00000000-0000-4000-8000-000000000001',
    });
    expect(ok).toMatchObject({ plotId: null, year: 2027, amount: 8_999, splitAmong: [] });
    const labour = expenseSchema.safeParse({ ...ok, amount: '0', category: 'labour', plotId: null });
    expect(labour.error?.issues.map((i) => i.path.join('.'))).toEqual(['labourHours']);
    const amount = expenseSchema.safeParse({ ...ok, amount: '12.345' });
    expect(amount.error?.issues[0]).toMatchObject({ path: ['amount'], message: expect.stringMatching(/dollars and cents/) });
  });
});
