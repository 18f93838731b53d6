// Engine benchmark: replan 10,000 plantings against 16-day hourly forecasts, the way the worker does after a
// forecast refresh — one new forecast per property, every active planting of that property replanned against
// it. Plantings and weather are invented and generated from a fixed seed, so runs are comparable.
// Run with `npm run bench` (bench/run.ts); it is not a timed unit test.
import { fromZonedTime } from 'date-fns-tz';
import { addDays } from '@/lib/schedule/local-dates';
import { planPlanting, replan } from '@/lib/schedule/plan';
import type { Forecast, ForecastHour, Plan, PlantingInput } from '@/lib/schedule/types';

const HOUR_MS = 3_600_000;

/** Mulberry32: a small seeded PRNG, so every run sees the same plantings and weather. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

const ZONES = ['America/Chicago', 'America/New_York', 'America/Denver', 'America/Los_Angeles', 'America/Phoenix'];
const BLENDS: PlantingInput['blend'][] = [
  [{ speciesId: 'white-clover', share: 1 }],
  [
    { speciesId: 'white-clover', share: 0.4 },
    { speciesId: 'chicory', share: 0.4 },
  ],
  [
    { speciesId: 'cereal-rye', share: 0.5 },
    { speciesId: 'crimson-clover', share: 0.5 },
  ],
  [
    { speciesId: 'turnip', share: 0.5 },
    { speciesId: 'forage-radish', share: 0.5 },
  ],
  [
    { speciesId: 'oats', share: 0.6 },
    { speciesId: 'red-clover', share: 0.4 },
  ],
];
const METHODS: PlantingInput['method'][] = ['spray-and-seed', 'prepared-seedbed', 'prepared-seedbed', 'frost-seeding'];

interface Property {
  timeZone: string;
  latitudeDeg: number;
  longitudeDeg: number;
}

export function hourlyForecast(property: Property, startDate: string, random: () => number, days = 16): Forecast {
  const start = fromZonedTime(`${startDate}T00:00:00`, property.timeZone).getTime();
  const hours: ForecastHour[] = [];
  const base = 8 + random() * 14;
  const spells = Array.from({ length: Math.floor(random() * 4) }, () => ({
    at: start + Math.floor(random() * days * 24) * HOUR_MS,
    hours: 2 + Math.floor(random() * 10),
    mmPerHour: random() * 4,
  }));
  for (let i = 0; i < days * 24; i++) {
    const ms = start + i * HOUR_MS;
    const hourOfDay = i % 24;
    const rainMm = spells.reduce((sum, s) => sum + (ms > s.at && ms <= s.at + s.hours * HOUR_MS ? s.mmPerHour : 0), 0);
    hours.push({
      time: new Date(ms).toISOString(),
      rainMm,
      rainProbabilityPct: rainMm > 0 ? 70 : 10,
      airTempC: base + 6 * Math.sin(((hourOfDay - 9) * Math.PI) / 12) + (random() - 0.5) * 2,
      relativeHumidityPct: Math.min(98, 45 + 25 * Math.cos(((hourOfDay - 4) * Math.PI) / 12) + (rainMm > 0 ? 20 : 0)),
      windKmh: 4 + random() * 16,
      soilTempC: base + 1,
    });
  }
  return { timeZone: property.timeZone, fetchedAt: new Date(start).toISOString(), hours };
}

export interface BenchRow {
  name: string;
  plantings: number;
  forecasts: number;
  seconds: number;
  plantingsPerSecond: number;
  moves: number;
}

export function runEngineBenchmark(o: { plantings?: number; perProperty?: number; coldSample?: number; seed?: number } = {}): BenchRow[] {
  const total = o.plantings ?? 10_000;
  const perProperty = o.perProperty ?? 20;
  const random = prng(o.seed ?? 20270906);
  const startDate = '2027-09-06';
  const nextDate = addDays(startDate, 1);
  const properties: Property[] = Array.from({ length: Math.ceil(total / perProperty) }, (_, i) => ({
    timeZone: ZONES[i % ZONES.length],
    latitudeDeg: 31 + random() * 14,
    longitudeDeg: -(80 + random() * 35),
  }));
  const first = properties.map((p) => hourlyForecast(p, startDate, random));
  const plantings: { property: number; input: PlantingInput; plan: Plan }[] = [];
  for (let i = 0; i < total; i++) {
    const property = Math.floor(i / perProperty);
    const p = properties[property];
    const method = METHODS[i % METHODS.length];
    const input: PlantingInput = {
      timeZone: p.timeZone,
      latitudeDeg: p.latitudeDeg,
      longitudeDeg: p.longitudeDeg,
      elevationM: 200,
      avgLastSpringFrost: '04-05',
      avgFirstFallFrost: '10-30',
      acres: 0.25 + random() * 4,
      cover: method === 'frost-seeding' ? 'existing-stand' : i % 3 === 0 ? 'brush' : 'grass-weeds',
      season: 'fall',
      method,
      blend: BLENDS[i % BLENDS.length],
      targetSeedDate: addDays(startDate, Math.floor(random() * 30)),
      burn: i % 7 === 0 ? { planned: true, permitInHand: true } : null,
      herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
      sprayer: { tankGal: 4 + (i % 3) * 11, carrierGalPerAcre: 15 },
      fertilizer: { grade: [13, 13, 13], target: { n: 30, p2o5: 30, k2o: 30 } },
      lime: i % 2 === 0 ? { tonsPerAcre: 1 } : null,
      upkeep: i % 2 === 1,
    };
    const now = fromZonedTime(`${startDate}T06:00:00`, p.timeZone);
    plantings.push({ property, input, plan: planPlanting(input, first[property], now) });
  }

  // The worker's case: the next morning's forecast for each property, shared by its plantings.
  const refreshed = properties.map((p) => hourlyForecast(p, nextDate, random));
  let moves = 0;
  let t0 = performance.now();
  for (const x of plantings) {
    const now = fromZonedTime(`${nextDate}T06:00:00`, properties[x.property].timeZone);
    moves += replan(x.input, x.plan, refreshed[x.property], now).changes.length;
  }
  const warm = (performance.now() - t0) / 1000;
  const rows: BenchRow[] = [
    { name: 'replan, one forecast per property', plantings: total, forecasts: properties.length, seconds: warm, plantingsPerSecond: total / warm, moves },
  ];

  // Worst case: every planting brings its own forecast, so each replan also reads a whole forecast.
  const sample = Math.min(o.coldSample ?? 1_000, total);
  const own = plantings.slice(0, sample).map((x) => hourlyForecast(properties[x.property], nextDate, random));
  moves = 0;
  t0 = performance.now();
  for (let i = 0; i < sample; i++) {
    const x = plantings[i];
    const now = fromZonedTime(`${nextDate}T06:00:00`, properties[x.property].timeZone);
    moves += replan(x.input, x.plan, own[i], now).changes.length;
  }
  const cold = (performance.now() - t0) / 1000;
  rows.push({ name: 'replan, a forecast of its own each', plantings: sample, forecasts: sample, seconds: cold, plantingsPerSecond: sample / cold, moves });
  return rows;
}
