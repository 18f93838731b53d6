// What the plots cost and who owes whom. Pure: plain data in, plain data out; money in integer cents
// throughout, so every total adds up to the cent and nothing is lost to floating-point rounding.
//
// The rules, stated once (the costs page repeats them in plain words):
// - An expense booked to a plot is that plot's cost. An expense for the whole property (no plot) is spread
//   over the property's plots in proportion to their acres.
// - Cost per acre is a plot's total over its acres; the property's is the grand total over all plot acres.
// - An expense is shared equally among the people it names; naming nobody means everyone who shares the
//   club's costs (owners, managers and members — not the landowner's read-only viewer seat) at the time the
//   split is read.
// - Whenever cents do not divide evenly, the largest-remainder (Hamilton) method hands out the odd cents,
//   so the parts always sum exactly to the amount.
import type { ExpenseCategory } from '@/lib/validations/expense';

export interface CostExpense {
  id: string;
  plotId: string | null;
  season: 'spring' | 'fall';
  year: number;
  category: ExpenseCategory;
  amountCents: number;
  labourHours: number | null;
  /** null when the account that paid no longer exists; such an expense counts in the totals, not in the split. */
  paidBy: string | null;
  /** Empty = everyone in `sharers` at reading time. */
  splitAmong: string[];
}

export interface CostPlot {
  id: string;
  name: string;
  acres: number;
}

export interface CostPerson {
  id: string;
  name: string;
}

const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });

/** 12345 → "$123.45". */
export function formatCents(cents: number): string {
  return usd.format(cents / 100);
}

/**
 * Splits `totalCents` in proportion to `weights` so the parts are whole cents that sum exactly to the total:
 * each part gets the floor of its exact quota, and the cents left over go one each to the largest fractional
 * remainders (Hamilton's largest-remainder method); equal remainders go in list order.
 */
export function largestRemainder(totalCents: number, weights: number[]): number[] {
  if (!Number.isInteger(totalCents) || totalCents < 0) throw new Error('The amount must be a whole, non-negative number of cents.');
  if (weights.length === 0) throw new Error('There must be at least one part to share the amount.');
  if (weights.some((w) => !Number.isFinite(w) || w < 0)) throw new Error('Weights must be non-negative numbers.');
  const sum = weights.reduce((a, b) => a + b, 0);
  if (sum <= 0) throw new Error('At least one weight must be positive.');
  const quotas = weights.map((w) => (totalCents * w) / sum);
  const parts = quotas.map(Math.floor);
  let left = totalCents - parts.reduce((a, b) => a + b, 0);
  const order = quotas.map((q, i) => ({ i, remainder: q - Math.floor(q) })).sort((a, b) => b.remainder - a.remainder || a.i - b.i);
  for (const { i } of order) {
    if (left <= 0) break;
    parts[i] += 1;
    left -= 1;
  }
  return parts;
}

/** An equal split of an amount among `count` people: largest remainder with equal weights. */
export function equalShares(totalCents: number, count: number): number[] {
  return largestRemainder(totalCents, Array.from({ length: count }, () => 1));
}

export interface PlotCost {
  plotId: string;
  plotName: string;
  acres: number;
  /** Expenses booked to this plot. */
  directCents: number;
  /** Its part of the whole-property expenses, by acres. */
  sharedCents: number;
  totalCents: number;
  /** totalCents / acres, unrounded (format it for display). */
  perAcreCents: number;
}

export interface SeasonCost {
  season: 'spring' | 'fall';
  year: number;
  totalCents: number;
  labourHours: number;
  byCategory: Partial<Record<ExpenseCategory, number>>;
}

export interface CostSummary {
  totalCents: number;
  labourHours: number;
  /** Whole-property expenses, and whether they could be spread (a property without plots cannot). */
  propertyWideCents: number;
  unspreadCents: number;
  totalAcres: number;
  perAcreCents: number | null;
  plots: PlotCost[];
  seasons: SeasonCost[];
  byCategory: Partial<Record<ExpenseCategory, number>>;
}

const seasonOrder = (s: { year: number; season: 'spring' | 'fall' }) => s.year * 2 + (s.season === 'fall' ? 1 : 0);

/** Totals per plot (with whole-property costs spread by acres), per acre, per season and per category. */
export function costSummary(expenses: CostExpense[], plots: CostPlot[]): CostSummary {
  const byPlot = new Map(plots.map((p) => [p.id, { plot: p, direct: 0, shared: 0 }]));
  const spreadable = plots.filter((p) => p.acres > 0);
  let total = 0;
  let hours = 0;
  let propertyWide = 0;
  let unspread = 0;
  const byCategory: Partial<Record<ExpenseCategory, number>> = {};
  const seasons = new Map<string, SeasonCost>();

  for (const e of expenses) {
    total += e.amountCents;
    hours += e.labourHours ?? 0;
    byCategory[e.category] = (byCategory[e.category] ?? 0) + e.amountCents;
    const key = `${e.year}-${e.season}`;
    const season = seasons.get(key) ?? { season: e.season, year: e.year, totalCents: 0, labourHours: 0, byCategory: {} };
    season.totalCents += e.amountCents;
    season.labourHours += e.labourHours ?? 0;
    season.byCategory[e.category] = (season.byCategory[e.category] ?? 0) + e.amountCents;
    seasons.set(key, season);

    const own = e.plotId ? byPlot.get(e.plotId) : undefined;
    if (own) {
      own.direct += e.amountCents;
      continue;
    }
    // No plot, or a plot since deleted: the cost belongs to the whole property.
    propertyWide += e.amountCents;
    if (spreadable.length === 0) {
      unspread += e.amountCents;
      continue;
    }
    const parts = largestRemainder(e.amountCents, spreadable.map((p) => p.acres));
    spreadable.forEach((p, i) => (byPlot.get(p.id)!.shared += parts[i]));
  }

  const totalAcres = plots.reduce((a, p) => a + p.acres, 0);
  return {
    totalCents: total,
    labourHours: hours,
    propertyWideCents: propertyWide,
    unspreadCents: unspread,
    totalAcres,
    perAcreCents: totalAcres > 0 ? (total - unspread) / totalAcres : null,
    plots: [...byPlot.values()].map(({ plot, direct, shared }) => ({
      plotId: plot.id,
      plotName: plot.name,
      acres: plot.acres,
      directCents: direct,
      sharedCents: shared,
      totalCents: direct + shared,
      perAcreCents: plot.acres > 0 ? (direct + shared) / plot.acres : 0,
    })),
    seasons: [...seasons.values()].sort((a, b) => seasonOrder(a) - seasonOrder(b)),
    byCategory,
  };
}

export interface PersonBalance {
  personId: string;
  name: string;
  paidCents: number;
  shareCents: number;
  /** paid − share: above zero they are owed money, below zero they owe. */
  balanceCents: number;
}

export interface Transfer {
  fromId: string;
  fromName: string;
  toId: string;
  toName: string;
  amountCents: number;
}

export interface CostSplit {
  people: PersonBalance[];
  transfers: Transfer[];
  /** Expenses left out of the split because the account that paid no longer exists. */
  unsplitCents: number;
}

/**
 * Each person's share, what they paid and their balance, and who pays whom to settle. `sharers` are the
 * people who share the club's costs at reading time (the default split); `people` names anyone else an
 * expense mentions (a former member still named on an old bill).
 */
export function costSplit(expenses: CostExpense[], sharers: CostPerson[], people: CostPerson[] = []): CostSplit {
  const names = new Map<string, string>();
  for (const p of [...people, ...sharers]) names.set(p.id, p.name);
  const balances = new Map<string, { paid: number; share: number }>();
  const entry = (id: string) => {
    let b = balances.get(id);
    if (!b) balances.set(id, (b = { paid: 0, share: 0 }));
    return b;
  };
  for (const s of sharers) entry(s.id);
  let unsplit = 0;

  for (const e of expenses) {
    const among = e.splitAmong.length ? e.splitAmong : sharers.map((s) => s.id);
    if (!e.paidBy || among.length === 0) {
      unsplit += e.amountCents;
      continue;
    }
    entry(e.paidBy).paid += e.amountCents;
    // A stable order for the odd cents: the people sorted by id, whatever order the expense listed them in.
    const ordered = [...among].sort();
    equalShares(e.amountCents, ordered.length).forEach((cents, i) => (entry(ordered[i]).share += cents));
  }

  const list: PersonBalance[] = [...balances].map(([id, b]) => ({
    personId: id,
    name: names.get(id) ?? 'A former member',
    paidCents: b.paid,
    shareCents: b.share,
    balanceCents: b.paid - b.share,
  }));
  list.sort((a, b) => a.name.localeCompare(b.name) || a.personId.localeCompare(b.personId));
  return { people: list, transfers: settle(list), unsplitCents: unsplit };
}

/**
 * A short way to settle: the person who owes most pays the person owed most, as much as one of them needs,
 * and again until everyone is even. At most n − 1 payments; ties are broken by name, then id.
 */
export function settle(balances: PersonBalance[]): Transfer[] {
  const byName = (a: PersonBalance, b: PersonBalance) => a.name.localeCompare(b.name) || a.personId.localeCompare(b.personId);
  const debtors = balances.filter((b) => b.balanceCents < 0).map((b) => ({ ...b, left: -b.balanceCents }));
  const creditors = balances.filter((b) => b.balanceCents > 0).map((b) => ({ ...b, left: b.balanceCents }));
  const owed = creditors.reduce((a, c) => a + c.left, 0);
  const owing = debtors.reduce((a, d) => a + d.left, 0);
  if (owed !== owing) throw new Error(`Balances do not sum to zero (${owed} owed, ${owing} owing).`);
  const transfers: Transfer[] = [];
  for (;;) {
    const debtor = debtors.filter((d) => d.left > 0).sort((a, b) => b.left - a.left || byName(a, b))[0];
    const creditor = creditors.filter((c) => c.left > 0).sort((a, b) => b.left - a.left || byName(a, b))[0];
    if (!debtor || !creditor) break;
    const amount = Math.min(debtor.left, creditor.left);
    transfers.push({ fromId: debtor.personId, fromName: debtor.name, toId: creditor.personId, toName: creditor.name, amountCents: amount });
    debtor.left -= amount;
    creditor.left -= amount;
  }
  return transfers;
}

/** "Dana paid $120.00, share $80.00, is owed $40.00" — the sentence the split table reads as. */
export function balanceSentence(p: PersonBalance): string {
  const state = p.balanceCents > 0 ? `is owed ${formatCents(p.balanceCents)}` : p.balanceCents < 0 ? `owes ${formatCents(-p.balanceCents)}` : 'is even';
  return `${p.name} paid ${formatCents(p.paidCents)}, share ${formatCents(p.shareCents)}, ${state}`;
}
