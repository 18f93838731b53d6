import { requirePlotRole } from '@/lib/auth/roles';
import { getProperty } from '@/lib/data/properties';
import { HttpError, json, notFound, parseBody, route } from '@/lib/http';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import { plantingSchema } from '@/lib/validations/planting';

type Context = { params: Promise<{ plotId: string }> };

/**
 * The plan the engine would make for this plot and these choices, without saving anything. Uses no
 * forecast until forecasts are stored (the plan then keeps the planned dates and says so).
 */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { plot } = await requirePlotRole(plotId, 'member');
  const form = await parseBody(request, plantingSchema);
  const property = await getProperty(plot.property_id);
  if (!property) throw notFound();
  const input = buildPlantingInput(property, plot, form);
  try {
    const plan = planPlanting(input, null, new Date());
    return json({ plan, input });
  } catch (error) {
    // The engine refuses impossible requests (a grade that cannot supply a nutrient) with a RangeError.
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
});
