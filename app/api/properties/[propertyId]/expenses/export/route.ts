import { requireRole } from '@/lib/auth/roles';
import { toCsv } from '@/lib/csv';
import { costReport } from '@/lib/data/expenses';
import { getProperty } from '@/lib/data/properties';
import { notFound, route } from '@/lib/http';
import { EXPENSE_CATEGORY_LABELS, parseExpenseFilter } from '@/lib/validations/expense';

type Context = { params: Promise<{ propertyId: string }> };

const centsText = (cents: number) => (cents / 100).toFixed(2);

/**
 * The expenses as CSV (RFC 4180, written by papaparse), one row per expense, amounts as plain decimal dollars
 * so a spreadsheet can add them. A text cell that starts like a formula is escaped (lib/csv.ts), so a
 * description cannot run as a formula when the file is opened, even one that goes on over several lines.
 */
export const GET = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'manager');
  const filter = parseExpenseFilter(request.url);
  const [report, property] = await Promise.all([costReport(propertyId, filter), getProperty(propertyId)]);
  if (!property) throw notFound();
  const names = new Map([...report.sharers, ...report.others].map((p) => [p.id, p.name]));
  const rows = report.expenses.map((e) => [
    e.spentOn,
    e.season,
    e.year,
    e.plotName ?? 'Whole property',
    EXPENSE_CATEGORY_LABELS[e.category],
    e.description,
    centsText(e.amountCents),
    e.labourHours ?? '',
    e.paidByName ?? 'A former member',
    e.splitAmong.length ? e.splitAmong.map((id) => names.get(id) ?? 'A former member').join('; ') : 'Everyone who shares costs',
  ]);
  const csv = toCsv(['Date', 'Season', 'Year', 'Plot', 'Category', 'Description', 'Amount (USD)', 'Labour hours', 'Paid by', 'Split among'], rows);
  const slug = property.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'property';
  const season = filter.season && filter.year ? `-${filter.season}-${filter.year}` : '';
  return new Response(csv, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="sowcast-expenses-${slug}${season}.csv"`,
      'Cache-Control': 'no-store',
    },
  });
});
