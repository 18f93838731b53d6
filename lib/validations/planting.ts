import { z } from 'zod';
import { HERBICIDE_ACTIVE_IDS, isHerbicideActive } from '@/lib/agronomy/herbicides';
import { SPECIES } from '@/lib/agronomy/species';
import { localDate, optionalLocalDate, optionalNumber, requiredNumber, requiredText } from './common';

export const SEASONS = ['spring', 'fall'] as const;
export const METHODS = ['spray-and-seed', 'prepared-seedbed', 'frost-seeding'] as const;
export const METHOD_LABELS: Record<(typeof METHODS)[number], string> = {
  'spray-and-seed': 'Spray and seed into the dying cover',
  'prepared-seedbed': 'Prepared seedbed (spray, wait, burn or till, then seed)',
  'frost-seeding': 'Frost seeding into an existing stand',
};
export const SOIL_TEXTURES = [
  'sand', 'loamy-sand', 'sandy-loam', 'loam', 'silt-loam', 'silt', 'silty-clay-loam', 'silty-clay', 'clay',
] as const;

const speciesIds = new Set(SPECIES.map((s) => s.id));

const blendPart = z.object({
  speciesId: requiredText('Species', 60).refine((id) => speciesIds.has(id), 'Species must be one of the catalog'),
  share: z
    .number({ error: 'Share must be a number' })
    .gt(0, 'Share must be more than 0')
    .max(1, 'Share must be at most 1 (the full pure-stand rate)'),
});

/** A blend's rows: shared by the planting form and the property's saved blends. */
export const blendParts = z
  .array(blendPart, { error: 'Blend must list species' })
  .min(1, 'Pick at least one species')
  .max(8, 'A blend holds at most 8 species')
  .refine((parts) => new Set(parts.map((p) => p.speciesId)).size === parts.length, 'Each species may appear once in a blend');

const herbicide = z
  .object({
    productName: requiredText('Herbicide product name', 120),
    activeIngredients: z
      .array(
        z.string({ error: 'Herbicide actives must be ids from the list' }).refine(isHerbicideActive, {
          message: `Herbicide actives must be from the list: ${HERBICIDE_ACTIVE_IDS.join(', ')}`,
        }),
        { error: 'Herbicide actives must be a list' },
      )
      .max(HERBICIDE_ACTIVE_IDS.length, 'List each herbicide active once')
      .refine((ids) => new Set(ids).size === ids.length, 'List each herbicide active once')
      .optional(),
    activeIngredientPct: optionalNumber('Active ingredient', 0, 100, ' %'),
    rateKind: z.enum(['percent-solution', 'fl-oz-per-acre'], { error: 'Rate must be a percent solution or fl oz per acre' }),
    rate: z.preprocess(
      (v) => (v === '' || (typeof v === 'number' && Number.isNaN(v)) ? undefined : v),
      z.number({ error: 'Rate must be a number' }).gt(0, 'Rate must be more than 0').max(1000, 'Rate must be at most 1000'),
    ),
    rainfastHours: optionalNumber('Rainfast period', 0, 72, ' h'),
    maxWindMph: optionalNumber('Label wind limit', 1, 30, ' mph'),
    minTempF: optionalNumber('Lowest label temperature', -20, 120, ' °F'),
    maxTempF: optionalNumber('Highest label temperature', -20, 120, ' °F'),
  })
  .refine((h) => h.rateKind !== 'percent-solution' || h.rate <= 100, {
    message: 'A percent solution must be at most 100 %',
    path: ['rate'],
  })
  .refine((h) => h.minTempF === undefined || h.maxTempF === undefined || h.minTempF < h.maxTempF, {
    message: 'The lowest label temperature must be below the highest',
    path: ['minTempF'],
  });

const nutrient = (label: string) => optionalNumber(label, 0, 500, ' lb/acre');

const fertilizer = z
  .object({
    grade: z.tuple([
      requiredNumber('Fertilizer N', 0, 100, ' %'),
      requiredNumber('Fertilizer P₂O₅', 0, 100, ' %'),
      requiredNumber('Fertilizer K₂O', 0, 100, ' %'),
    ]),
    target: z.object({ n: nutrient('N target'), p2o5: nutrient('P₂O₅ target'), k2o: nutrient('K₂O target') }),
    bagLb: optionalNumber('Fertilizer bag size', 1, 2000, ' lb'),
  })
  .refine((f) => f.grade[0] + f.grade[1] + f.grade[2] <= 100, {
    message: 'A fertilizer grade cannot add up to more than 100 %',
    path: ['grade'],
  })
  .refine((f) => Object.values(f.target).some((v) => v !== undefined && v > 0), {
    message: 'Give at least one nutrient target (lb per acre)',
    path: ['target'],
  });

export const plantingSchema = z
  .object({
    season: z.enum(SEASONS, { error: 'Season must be spring or fall' }),
    method: z.enum(METHODS, { error: 'Method must be spray-and-seed, prepared-seedbed or frost-seeding' }),
    blend: blendParts,
    targetSeedDate: localDate('Planned seeding date'),
    readyBy: optionalLocalDate('Ready-by date'),
    clearBrush: z.boolean().optional(),
    burn: z.object({ planned: z.boolean(), permitInHand: z.boolean() }).nullable().optional(),
    rakeOrTill: z.boolean().optional(),
    coverSeed: z.boolean().optional(),
    killWaitDays: z.preprocess(
      (v) => (v === '' || (typeof v === 'number' && Number.isNaN(v)) ? undefined : v),
      z.number({ error: 'Kill wait must be a number of days' }).int('Kill wait must be whole days').min(0, 'Kill wait must be at least 0 days').max(60, 'Kill wait must be at most 60 days').optional(),
    ),
    herbicide: herbicide.nullable().optional(),
    sprayer: z
      .object({
        tankGal: requiredNumber('Sprayer tank', 0.5, 2000, ' gal'),
        carrierGalPerAcre: requiredNumber('Spray volume', 1, 200, ' gal/acre'),
      })
      .nullable()
      .optional(),
    fertilizer: fertilizer.nullable().optional(),
    lime: z
      .object({
        tonsPerAcre: requiredNumber('Lime', 0.1, 10, ' tons/acre'),
        bagLb: optionalNumber('Lime bag size', 1, 4000, ' lb'),
      })
      .nullable()
      .optional(),
    seedBagLb: optionalNumber('Seed bag size', 0.5, 200, ' lb'),
    // What the bag's label says it covers: `lb` of this seed plants `acres` (the seeding rate starts from it).
    seedBag: z
      .object({
        lb: requiredNumber("Seed on the bag's label", 0.1, 500, ' lb'),
        acres: requiredNumber("Acres the bag's label covers", 0.01, 100, ' acres'),
      })
      .nullable()
      .optional(),
    soilTexture: z.enum(SOIL_TEXTURES, { error: 'Soil texture must be one of the listed kinds' }).optional(),
    upkeep: z.boolean().optional(),
  })
  .refine((p) => p.method === 'frost-seeding' || !p.herbicide || p.sprayer, {
    message: 'Give the sprayer (tank size and gallons per acre) so Sowcast can work out the fills',
    path: ['sprayer'],
  })
  .refine((p) => !p.readyBy || p.readyBy >= p.targetSeedDate, {
    message: 'The ready-by date must not be before the planned seeding date',
    path: ['readyBy'],
  });

export type PlantingFormInput = z.infer<typeof plantingSchema>;
