import { requireRole } from '@/lib/auth/roles';
import { createPlot, DuplicatePlotName, listPlots } from '@/lib/data/plots';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { plotSchema } from '@/lib/validations/plot';

type Context = { params: Promise<{ propertyId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'viewer');
  return json({ plots: await listPlots(propertyId) });
});

export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'manager');
  const input = await parseBody(request, plotSchema);
  try {
    return json({ plot: await createPlot(propertyId, input) }, 201);
  } catch (error) {
    if (error instanceof DuplicatePlotName) throw new HttpError(409, error.message, { name: error.message });
    throw error;
  }
});
