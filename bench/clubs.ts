// Invented clubs for the benchmarks, written through the same data layer the app uses (lib/data/*), so the
// rows are what the planner and the pages really store: users, properties (owner membership), plots, and
// plantings planned by the engine. Generated from a fixed seed: every run builds the same clubs.
import { getDb } from '@/db';
import { createPlanting } from '@/lib/data/plantings';
import { createPlot } from '@/lib/data/plots';
import { createProperty } from '@/lib/data/properties';
import { createUser } from '@/lib/data/users';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import { addDays, localDateOf } from '@/lib/schedule/local-dates';
import { plotSchema } from '@/lib/validations/plot';
import { plantingSchema } from '@/lib/validations/planting';
import { propertySchema } from '@/lib/validations/property';
import { eachLimit, prng } from './support';

/** Rough time-zone bands by longitude across the lower 48 — invented places, so a band is close enough. */
function zoneFor(longitude: number): string {
  if (longitude > -87) return 'America/New_York';
  if (longitude > -101) return 'America/Chicago';
  if (longitude > -114) return 'America/Denver';
  return 'America/Los_Angeles';
}

const COVERS = ['grass-weeds', 'brush', 'grass-weeds', 'tilled'] as const;
const BLENDS = [
  [{ speciesId: 'cereal-rye', share: 1 }],
  [
    { speciesId: 'white-clover', share: 0.5 },
    { speciesId: 'chicory', share: 0.5 },
  ],
  [
    { speciesId: 'oats', share: 0.6 },
    { speciesId: 'crimson-clover', share: 0.4 },
  ],
  [
    { speciesId: 'turnip', share: 0.5 },
    { speciesId: 'forage-radish', share: 0.5 },
  ],
];

export interface Club {
  ownerId: string;
  propertyIds: string[];
  plots: number;
  plantings: number;
}

/**
 * `properties` properties with `plotsPerProperty` plots each and one fall planting per plot, seeded about
 * `seedInDays` days after `now`. `ownersShared`: one owner for all (a club), else one owner per property
 * (many small clubs). Each property sits in its own 0.1° forecast cell.
 */
export async function makeClubs(o: {
  tag: string;
  properties: number;
  plotsPerProperty: number;
  now: Date;
  seedInDays: number;
  ownersShared: boolean;
  passwordHash: string;
  seed?: number;
  concurrency?: number;
}): Promise<Club[]> {
  const random = prng(o.seed ?? 20270818);
  const concurrency = o.concurrency ?? 8;
  const places = Array.from({ length: o.properties }, (_, i) => {
    // A 0.3° × 0.5° lattice over the eastern and central states: distinct cells, a spread of zones.
    const latitude = Number((31 + (i % 40) * 0.3 + random() * 0.05).toFixed(3));
    const longitude = Number((-(78 + Math.floor(i / 40) * 0.5) - random() * 0.05).toFixed(3));
    return { latitude, longitude, timeZone: zoneFor(longitude) };
  });
  const ownerCount = o.ownersShared ? 1 : o.properties;
  const owners = await eachLimit(Array.from({ length: ownerCount }, (_, i) => i), concurrency, async (i) => {
    const user = await createUser({ email: `owner-${i + 1}.${o.tag}@bench.sowcast.test`, name: `Bench owner ${i + 1}`, passwordHash: o.passwordHash });
    if (!user) throw new Error(`bench user ${i + 1} of ${o.tag} exists already: use a fresh database`);
    return user.id;
  });
  const propertyIds = await eachLimit(places, concurrency, async (place, i) => {
    const input = propertySchema.parse({
      name: `Bench ground ${o.tag} ${i + 1}`,
      ...place,
      elevationM: 100 + Math.round(random() * 300),
      avgLastSpringFrost: '04-05',
      avgFirstFallFrost: '10-28',
      tenure: 'leased',
    });
    return (await createProperty(owners[o.ownersShared ? 0 : i], input)).id;
  });

  const plotJobs = propertyIds.flatMap((propertyId, p) => Array.from({ length: o.plotsPerProperty }, (_, k) => ({ propertyId, p, k })));
  let plantings = 0;
  await eachLimit(plotJobs, concurrency, async ({ propertyId, p, k }) => {
    const n = p * o.plotsPerProperty + k;
    const plot = await createPlot(
      propertyId,
      plotSchema.parse({ name: `Plot ${k + 1}`, acres: Number((0.25 + random() * 3).toFixed(2)), cover: COVERS[n % COVERS.length], sun: 'full' }),
    );
    const property = await getDb().selectFrom('properties').selectAll().where('id', '=', propertyId).executeTakeFirstOrThrow();
    const plotRow = await getDb().selectFrom('plots').selectAll().where('id', '=', plot.id).executeTakeFirstOrThrow();
    const today = localDateOf(o.now, property.time_zone);
    const form = plantingSchema.parse({
      season: 'fall',
      method: n % 3 === 0 ? 'spray-and-seed' : 'prepared-seedbed',
      blend: BLENDS[n % BLENDS.length],
      targetSeedDate: addDays(today, o.seedInDays + (n % 5)),
      herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
      sprayer: { tankGal: 4 + (n % 3) * 11, carrierGalPerAcre: 20 },
    });
    const plan = planPlanting(buildPlantingInput(property, plotRow, form), null, o.now);
    await createPlanting({ plotId: plot.id, form, plan, createdBy: owners[o.ownersShared ? 0 : p] });
    plantings++;
  });
  if (o.ownersShared) return [{ ownerId: owners[0], propertyIds, plots: plotJobs.length, plantings }];
  return propertyIds.map((id, i) => ({ ownerId: owners[i], propertyIds: [id], plots: o.plotsPerProperty, plantings: o.plotsPerProperty }));
}
