import { requirePlotRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { forecastStatus, latestForecast } from '@/lib/data/forecasts';
import { getStepRows, listPlantingsForPlot, rowToPlanStep } from '@/lib/data/plantings';
import { getProperty } from '@/lib/data/properties';
import { json, notFound, route } from '@/lib/http';
import { buildPlantingInput } from '@/lib/planning/input';
import { currentPlanting, FORECAST_STALE_AFTER_HOURS, forecastFreshness, plotWeather, type PlotWeatherPlanting } from '@/lib/planning/plot-weather';
import { localDateOf } from '@/lib/schedule/local-dates';
import { plantingSchema } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';

type Context = { params: Promise<{ plotId: string }> };

/**
 * The plot's weather chart: the stored forecast read in local days as the engine reads it, with the current
 * planting's blend minimum, spray limits, seeding date and seed-zone moisture. No forecast yet, or a stale
 * one, is a state of the answer, not an error. Everyone who may see the plot, the landowner included.
 */
export const GET = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  const { plot } = await requirePlotRole(plotId, 'viewer');
  const property = await getProperty(plot.property_id);
  if (!property) throw notFound();
  const gridKey = gridCellKey(property.latitude, property.longitude);
  const [stored, status, plantings] = await Promise.all([latestForecast(gridKey), forecastStatus(gridKey), listPlantingsForPlot(plotId)]);
  const at = now();
  const today = localDateOf(at, property.time_zone);

  const active = plantings.filter((p) => p.status === 'active');
  const withSteps = await Promise.all(
    active.map(async (p) => ({ row: p, status: p.status, targetSeedDate: p.target_seed_date, steps: (await getStepRows(p.id)).map(rowToPlanStep) })),
  );
  const current = currentPlanting(withSteps, today);
  let planting: PlotWeatherPlanting | null = null;
  let plantingNote: string | null = null;
  if (current) {
    const form = plantingSchema.safeParse(current.row.input);
    if (form.success) planting = { input: buildPlantingInput(property, plot, form.data), steps: current.steps };
    // A planting saved under older rules still has its steps; the chart then shows the weather alone.
    else plantingNote = `The ${current.row.season} ${current.row.year} planting could not be read (${form.error.issues[0]?.message ?? 'invalid'}); the chart shows the weather without it.`;
  }

  const base = {
    timeZone: property.time_zone,
    now: at.toISOString(),
    today,
    staleAfterHours: FORECAST_STALE_AFTER_HOURS,
    planting: current
      ? { id: current.row.id, season: current.row.season, year: current.row.year, method: current.row.method, targetSeedDate: current.row.target_seed_date }
      : null,
    plantingNote,
  };
  if (!stored) {
    return json({ ...base, state: 'no-forecast', forecast: null, chart: null });
  }
  const failingSince = status?.failingSince ?? null;
  const chart = plotWeather({
    forecast: { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours },
    place: { timeZone: property.time_zone, latitudeDeg: property.latitude, longitudeDeg: property.longitude },
    planting,
    now: at,
  });
  return json({
    ...base,
    state: chart.days.length ? 'ready' : 'no-days',
    forecast: { provider: stored.provider, fetchedAt: stored.fetchedAt, failingSince, ...forecastFreshness({ fetchedAt: stored.fetchedAt, now: at, failingSince }) },
    chart,
  });
});
