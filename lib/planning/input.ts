import type { Plot, Property } from '@/db/database';
import type { PlantingInput } from '@/lib/schedule/types';
import type { PlantingFormInput } from '@/lib/validations/planting';

/**
 * The engine's input for a planting: what the planner chose (the form), joined with the facts of the
 * property and plot as they are now — so an edited acreage or frost date reaches the next replan.
 */
export function buildPlantingInput(
  property: Pick<Property, 'time_zone' | 'latitude' | 'longitude' | 'elevation_m' | 'avg_last_spring_frost' | 'avg_first_fall_frost'> &
    Partial<Pick<Property, 'avg_first_hard_freeze'>>,
  plot: Pick<Plot, 'acres' | 'cover'>,
  form: PlantingFormInput,
): PlantingInput {
  const { herbicide } = form;
  return {
    timeZone: property.time_zone,
    latitudeDeg: property.latitude,
    longitudeDeg: property.longitude,
    elevationM: property.elevation_m,
    avgLastSpringFrost: property.avg_last_spring_frost,
    avgFirstFallFrost: property.avg_first_fall_frost,
    avgFirstHardFreeze: property.avg_first_hard_freeze ?? null,
    acres: plot.acres,
    cover: plot.cover,
    soilTexture: form.soilTexture,
    season: form.season,
    method: form.method,
    blend: form.blend,
    targetSeedDate: form.targetSeedDate,
    readyBy: form.readyBy ?? null,
    clearBrush: form.clearBrush,
    burn: form.burn ?? null,
    rakeOrTill: form.rakeOrTill,
    coverSeed: form.coverSeed,
    killWaitDays: form.killWaitDays,
    herbicide: herbicide
      ? {
          productName: herbicide.productName,
          ...(herbicide.activeIngredients?.length ? { activeIngredients: herbicide.activeIngredients } : {}),
          activeIngredientPct: herbicide.activeIngredientPct ?? null,
          rate:
            herbicide.rateKind === 'percent-solution'
              ? { percentSolution: herbicide.rate }
              : { flOzPerAcre: herbicide.rate },
          rainfastHours: herbicide.rainfastHours ?? null,
          maxWindMph: herbicide.maxWindMph ?? null,
          minTempF: herbicide.minTempF ?? null,
          maxTempF: herbicide.maxTempF ?? null,
        }
      : null,
    sprayer: form.sprayer ?? null,
    fertilizer: form.fertilizer
      ? {
          grade: form.fertilizer.grade,
          target: form.fertilizer.target,
          ...(form.fertilizer.bagLb ? { bagLb: form.fertilizer.bagLb } : {}),
        }
      : null,
    lime: form.lime ? { tonsPerAcre: form.lime.tonsPerAcre, ...(form.lime.bagLb ? { bagLb: form.lime.bagLb } : {}) } : null,
    ...(form.seedBagLb ? { seedBagLb: form.seedBagLb } : {}),
    ...(form.seedBag ? { seedBag: { lb: form.seedBag.lb, acres: form.seedBag.acres } } : {}),
    upkeep: form.upkeep,
  };
}
