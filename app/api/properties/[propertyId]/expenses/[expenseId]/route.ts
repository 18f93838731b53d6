import { requireRole } from '@/lib/auth/roles';
import { deleteExpense } from '@/lib/data/expenses';
import { notFound, route } from '@/lib/http';
import { uuid } from '@/lib/validations/common';

type Context = { params: Promise<{ propertyId: string; expenseId: string }> };

/** Removes an expense booked by mistake; the totals and the split are read afresh each time. */
export const DELETE = route(async (_request, { params }: Context) => {
  const { propertyId, expenseId } = await params;
  await requireRole(propertyId, 'manager');
  if (!uuid.safeParse(expenseId).success || !(await deleteExpense(propertyId, expenseId))) throw notFound();
  return new Response(null, { status: 204 });
});
