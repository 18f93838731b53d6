import { requirePlotRole } from '@/lib/auth/roles';
import { deletePlot, DuplicatePlotName, toPlotDto, updatePlot } from '@/lib/data/plots';
import { HttpError, json, notFound, parsePatch, route } from '@/lib/http';
import { plotUpdateSchema } from '@/lib/validations/plot';

type Context = { params: Promise<{ plotId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  const { plot, role } = await requirePlotRole(plotId, 'viewer');
  return json({ plot: toPlotDto(plot), role });
});

export const PATCH = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'manager');
  const { data, keys } = await parsePatch(request, plotUpdateSchema);
  try {
    const plot = await updatePlot(plotId, data, keys);
    if (!plot) throw notFound();
    return json({ plot });
  } catch (error) {
    if (error instanceof DuplicatePlotName) throw new HttpError(409, error.message, { name: error.message });
    throw error;
  }
});

export const DELETE = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'manager');
  await deletePlot(plotId);
  return new Response(null, { status: 204 });
});
