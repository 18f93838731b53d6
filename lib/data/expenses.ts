import { getDb } from '@/db';
import { costSplit, costSummary, type CostExpense, type CostPerson, type CostPlot } from '@/lib/planning/costs';
import type { ExpenseCategory, ExpenseInput } from '@/lib/validations/expense';

export interface ExpenseDto extends CostExpense {
  propertyId: string;
  plotName: string | null;
  spentOn: string;
  description: string;
  paidByName: string | null;
  createdAt: string;
}

type Row = {
  id: string;
  property_id: string;
  plot_id: string | null;
  plot_name: string | null;
  season: 'spring' | 'fall';
  year: number;
  spent_on: string;
  category: ExpenseCategory;
  description: string;
  amount_cents: number;
  labour_hours: number | null;
  paid_by: string | null;
  paid_by_name: string | null;
  split_among: string[];
  created_at: Date | string;
};

const toDto = (r: Row): ExpenseDto => ({
  id: r.id,
  propertyId: r.property_id,
  plotId: r.plot_id,
  plotName: r.plot_name,
  season: r.season,
  year: r.year,
  spentOn: r.spent_on,
  category: r.category,
  description: r.description,
  amountCents: r.amount_cents,
  labourHours: r.labour_hours,
  paidBy: r.paid_by,
  paidByName: r.paid_by_name,
  splitAmong: r.split_among,
  createdAt: new Date(r.created_at).toISOString(),
});

function expenseQuery() {
  return getDb()
    .selectFrom('expenses')
    .leftJoin('plots', 'plots.id', 'expenses.plot_id')
    .leftJoin('users as payer', 'payer.id', 'expenses.paid_by')
    .select([
      'expenses.id',
      'expenses.property_id',
      'expenses.plot_id',
      'plots.name as plot_name',
      'expenses.season',
      'expenses.year',
      'expenses.spent_on',
      'expenses.category',
      'expenses.description',
      'expenses.amount_cents',
      'expenses.labour_hours',
      'expenses.paid_by',
      'payer.name as paid_by_name',
      'expenses.split_among',
      'expenses.created_at',
    ]);
}

export async function listExpenses(propertyId: string, filter: { season?: 'spring' | 'fall'; year?: number } = {}): Promise<ExpenseDto[]> {
  let query = expenseQuery().where('expenses.property_id', '=', propertyId);
  if (filter.season) query = query.where('expenses.season', '=', filter.season);
  if (filter.year) query = query.where('expenses.year', '=', filter.year);
  const rows = await query.orderBy('expenses.spent_on', 'desc').orderBy('expenses.created_at', 'desc').execute();
  return rows.map(toDto);
}

export async function createExpense(propertyId: string, input: ExpenseInput, userId: string): Promise<ExpenseDto> {
  const { id } = await getDb()
    .insertInto('expenses')
    .values({
      property_id: propertyId,
      plot_id: input.plotId,
      season: input.season,
      year: input.year,
      spent_on: input.spentOn,
      category: input.category,
      description: input.description,
      amount_cents: input.amount,
      labour_hours: input.labourHours ?? null,
      paid_by: input.paidBy,
      split_among: JSON.stringify(input.splitAmong),
      created_by: userId,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return toDto(await expenseQuery().where('expenses.id', '=', id).executeTakeFirstOrThrow());
}

/** Deletes the expense when it belongs to the property; false when there was none. */
export async function deleteExpense(propertyId: string, expenseId: string): Promise<boolean> {
  const result = await getDb().deleteFrom('expenses').where('property_id', '=', propertyId).where('id', '=', expenseId).executeTakeFirst();
  return Number(result.numDeletedRows) > 0;
}

/** Who shares the club's costs by default: the owners, managers and members (viewers only look). */
export async function costSharers(propertyId: string): Promise<CostPerson[]> {
  const rows = await getDb()
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name'])
    .where('memberships.property_id', '=', propertyId)
    .where('memberships.role', 'in', ['owner', 'manager', 'member'])
    .orderBy('users.name')
    .execute();
  return rows;
}

/** Names of people an old expense still mentions, members or not. */
export async function peopleByIds(ids: string[]): Promise<CostPerson[]> {
  if (ids.length === 0) return [];
  return getDb().selectFrom('users').select(['id', 'name']).where('id', 'in', ids).execute();
}

export async function costPlots(propertyId: string): Promise<CostPlot[]> {
  return getDb().selectFrom('plots').select(['id', 'name', 'acres']).where('property_id', '=', propertyId).orderBy('name').execute();
}

/** Everything the costs page and the CSV show for a property, in one read. */
export async function costReport(propertyId: string, filter: { season?: 'spring' | 'fall'; year?: number } = {}) {
  const [expenses, plots, sharers] = await Promise.all([listExpenses(propertyId, filter), costPlots(propertyId), costSharers(propertyId)]);
  const known = new Set(sharers.map((s) => s.id));
  const mentioned = [...new Set(expenses.flatMap((e) => [...e.splitAmong, ...(e.paidBy ? [e.paidBy] : [])]))].filter((id) => !known.has(id));
  const others = await peopleByIds(mentioned);
  return { expenses, plots, sharers, others, summary: costSummary(expenses, plots), split: costSplit(expenses, sharers, others) };
}
