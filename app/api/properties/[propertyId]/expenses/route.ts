import { requireRole } from '@/lib/auth/roles';
import { costPlots, costReport, costSharers, createExpense } from '@/lib/data/expenses';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { expenseSchema, parseExpenseFilter } from '@/lib/validations/expense';

type Context = { params: Promise<{ propertyId: string }> };

/**
 * The property's expenses with their totals (per plot, per acre, per season, per category) and the split.
 * Money is the club's business: owners and managers only. ?season=fall&year=2027 narrows to one season.
 */
export const GET = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'manager');
  return json(await costReport(propertyId, parseExpenseFilter(request.url)));
});

export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  const { user } = await requireRole(propertyId, 'manager');
  const input = await parseBody(request, expenseSchema);
  const [plots, sharers] = await Promise.all([costPlots(propertyId), costSharers(propertyId)]);
  if (input.plotId && !plots.some((p) => p.id === input.plotId)) {
    throw new HttpError(400, 'Plot must be one of this property’s plots (plotId)', { plotId: 'Plot must be one of this property’s plots' });
  }
  const people = new Set(sharers.map((s) => s.id));
  if (!people.has(input.paidBy)) {
    throw new HttpError(400, 'Who paid must be an owner, manager or member of this property (paidBy)', { paidBy: 'Who paid must be an owner, manager or member of this property' });
  }
  if (input.splitAmong.some((id) => !people.has(id))) {
    throw new HttpError(400, 'Split among may only name owners, managers and members of this property (splitAmong)', {
      splitAmong: 'Split among may only name owners, managers and members of this property',
    });
  }
  return json({ expense: await createExpense(propertyId, input, user.id) }, 201);
});
