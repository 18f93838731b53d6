// The plot weather chart's route: GET /api/plots/[plotId]/weather, over real HTTP with real sessions, a forecast
// stored the way the worker stores one (lib/data/forecasts.ts) and a planting saved through the planner's route.
// The role matrix for the route is in access.test.ts; this file checks what it says. Sources: NIST SP 811 B.8–B.9
// (1 in = 25.4 mm; t/°F = 1.8 t/°C + 32); NDSU's 50 °F soybean minimum as the species catalog cites it.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getSpecies } from '@/lib/agronomy/species';
import { recordForecastFailure, storeForecast } from '@/lib/data/forecasts';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/grid';
import { testDb } from '../support/db';
import { createPlot, createProperty, signedInUser, type Client } from '../support/http';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
const TIME_ZONE = 'America/Chicago';

/** Local date of an instant from the runtime's ICU zone data (en-CA gives YYYY-MM-DD), no project code. */
const localDate = (ms: number) => new Intl.DateTimeFormat('en-CA', { timeZone: TIME_ZONE, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);
const localHour = (ms: number) => Number(new Intl.DateTimeFormat('en-US', { timeZone: TIME_ZONE, hour: 'numeric', hourCycle: 'h23' }).format(ms));
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T12:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
/** 'Tue 8 Sep', weekday and month as ECMA-402 Intl spells them. */
const spoken = (date: string) => {
  const d = new Date(`${date}T12:00:00Z`);
  const part = (o: Intl.DateTimeFormatOptions) => new Intl.DateTimeFormat('en-US', { ...o, timeZone: 'UTC' }).format(d);
  return `${part({ weekday: 'short' })} ${d.getUTCDate()} ${part({ month: 'short' })}`;
};

function localMidnightMs(nowMs: number): number {
  const today = localDate(nowMs);
  let ms = Math.floor(nowMs / HOUR_MS) * HOUR_MS;
  while (localDate(ms - HOUR_MS) === today) ms -= HOUR_MS;
  return ms;
}

/**
 * 16 local days from local midnight: 16 °C and 60 % all day, wind 10 km/h at 10 m; soil 8 °C (46.4 °F) for six
 * days, 12 °C (53.6 °F) after; on day 2, 25.4 mm — one inch — from 13:00 to 18:00 local at 90 %.
 */
function syntheticHours(startMs: number): ForecastHour[] {
  const hours: ForecastHour[] = [];
  for (let i = 0; i < 16 * 24; i++) {
    const ms = startMs + i * HOUR_MS;
    const day = Math.floor((ms - startMs) / DAY_MS);
    const hour = localHour(ms);
    const wet = day === 2 && hour >= 14 && hour <= 18;
    hours.push({
      time: new Date(ms).toISOString(),
      rainMm: wet ? 25.4 / 5 : 0,
      rainProbabilityPct: wet ? 90 : 10,
      airTempC: 16,
      relativeHumidityPct: 60,
      windKmh: 10,
      windGustKmh: null,
      soilTempC: day < 6 ? 8 : 12,
    });
  }
  return hours;
}

const db = testDb();
let owner: Client;

beforeAll(async () => {
  ({ client: owner } = await signedInUser('plot-weather'));
});

afterAll(async () => {
  await db.destroy();
});

/** A property in a 0.1° grid cell of its own (no other test's forecast lands there) with one plot. */
async function plotOnOwnGround(o: { fetchedAgoMs?: number; forecast?: boolean } = {}) {
  const place = { latitude: 30 + randomInt(0, 800) / 100, longitude: -(80 + randomInt(0, 1500) / 100) };
  const property = await createProperty(owner, { ...place, timeZone: TIME_ZONE });
  const plot = await createPlot(owner, property.id, { acres: 0.5, cover: 'grass-weeds' });
  const gridKey = gridCellKey(place.latitude, place.longitude);
  const nowMs = Date.now();
  const startMs = localMidnightMs(nowMs);
  if (o.forecast !== false) {
    const fetchedAt = new Date(nowMs - (o.fetchedAgoMs ?? HOUR_MS)).toISOString();
    await storeForecast({ gridKey, ...place, provider: 'open-meteo', forecast: { timeZone: TIME_ZONE, fetchedAt, hours: syntheticHours(startMs) } });
  }
  return { property, plot, gridKey, today: localDate(nowMs) };
}

async function plantSoybeans(plotId: string, today: string, herbicide: Record<string, unknown> = {}) {
  const res = await owner.post(`/api/plots/${plotId}/plantings`, {
    season: 'spring',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'soybeans', share: 1 }],
    targetSeedDate: plusDays(today, 8),
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2, ...herbicide },
    sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  });
  expect(res.status, res.text).toBe(201);
  return res.body as { planting: { id: string }; steps: { key: string; date: string; reason: string }[] };
}

describe('GET /api/plots/[plotId]/weather', () => {
  it('before any forecast: a clear state, no chart, not an error', async () => {
    const { plot, today } = await plotOnOwnGround({ forecast: false });
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body).toMatchObject({ state: 'no-forecast', forecast: null, chart: null, planting: null, timeZone: TIME_ZONE, today });
  });

  it('without a planting: the local days of the stored forecast, in inches and °F, with default spray limits', async () => {
    const { plot, today } = await plotOnOwnGround();
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body.state).toBe('ready');
    expect(res.body.forecast).toMatchObject({ provider: 'open-meteo', stale: false, staleReason: null });
    const { chart } = res.body;
    expect(chart.today).toBe(today);
    expect(chart.blend).toBeNull();
    expect(chart.seeding).toBeNull();
    expect(chart.moisture).toBeNull();
    // 3–8 mph and 6 h: the spray-window rule's defaults without a label (Pesticide Environmental Stewardship).
    expect(chart.spray).toMatchObject({ windMinMph: 3, windMaxMph: 8, rainfastHours: 6, fromLabel: false });
    expect(chart.days[0].date).toBe(today);
    expect(chart.days.length).toBeGreaterThanOrEqual(15);
    const wet = chart.days.find((d: { date: string }) => d.date === plusDays(today, 2));
    expect(wet.rainMm).toBeCloseTo(25.4, 6);
    expect(wet.rainIn).toBeCloseTo(1, 9); // 25.4 mm = 1 in exactly (NIST SP 811 B.8)
    expect(wet.rainProbabilityMaxPct).toBe(90);
    expect(wet.airMaxF).toBeCloseTo(60.8, 9); // 16 °C × 1.8 + 32 (NIST SP 811 B.9)
    expect(chart.days[1].soilTempF).toBeCloseTo(46.4, 9);
    expect(chart.summary).toContain(`1 in of rain expected ${spoken(plusDays(today, 2))}.`);
    // Spraying needs daylight: the days away from the rain have suitable hours, none has all 24.
    const later = chart.days.slice(4, 10);
    for (const d of later) {
      expect(d.spray.suitableHours).toBeGreaterThan(0);
      expect(d.spray.suitableHours).toBeLessThan(24);
    }
  });

  it('with a planting: the blend minimum, the herbicide label’s limits, the planned seeding and its moisture outlook', async () => {
    const { plot, today } = await plotOnOwnGround();
    // The label's 3 mph limit: 10 km/h at 10 m is about 4.6 mph at spray height (FAO-56 eq. 47), so no window.
    const saved = await plantSoybeans(plot.id, today, { maxWindMph: 3 });
    const seed = saved.steps.find((s) => s.key === 'seed')!;
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.status, res.text).toBe(200);
    const { chart, planting } = res.body;
    expect(planting).toMatchObject({ id: saved.planting.id, season: 'spring', method: 'spray-and-seed' });
    expect(chart.blend).toMatchObject({ minSoilTempF: getSpecies('soybeans').minSoilTempF.value, limitingSpecies: getSpecies('soybeans').name });
    expect(chart.blend.minSoilTempF).toBe(50); // NDSU, as the catalog cites it
    // Soil 46.4 °F for six days, 53.6 °F from day 6: it reaches 50 °F on day 6.
    expect(chart.days.filter((d: { soilLevel: string }) => d.soilLevel === 'cold')).toHaveLength(6);
    expect(chart.summary[0]).toBe(`Soil reaches 50 °F, the blend minimum (${getSpecies('soybeans').name.toLowerCase()}), on ${spoken(plusDays(today, 6))}.`);
    expect(chart.spray).toMatchObject({ windMaxMph: 3, fromLabel: true, productName: 'Generic glyphosate 41%' });
    expect(chart.days.every((d: { spray: { suitableHours: number } }) => d.spray.suitableHours === 0)).toBe(true);
    // The seeding the chart marks is the stored plan's, with the engine's reason.
    expect(chart.seeding).toMatchObject({ key: 'seed', date: seed.date, status: 'planned', reason: seed.reason });
    if (chart.seeding.inForecast) {
      expect(chart.moisture.fromDate).toBe(seed.date);
      for (const d of chart.days) expect(d.moisture === null).toBe(d.date < seed.date);
    }
  });

  it('is stale once the forecast is more than 12 hours old, and still shows it', async () => {
    const { plot } = await plotOnOwnGround({ fetchedAgoMs: 13 * HOUR_MS });
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.status).toBe(200);
    expect(res.body.forecast).toMatchObject({ stale: true, staleReason: 'old' });
    expect(Date.parse(res.body.forecast.staleSince)).toBe(Date.parse(res.body.forecast.fetchedAt) + 12 * HOUR_MS);
    expect(res.body.chart.days.length).toBeGreaterThan(0);
  });

  it('names failing refreshes', async () => {
    const { plot, gridKey } = await plotOnOwnGround({ fetchedAgoMs: 3 * HOUR_MS });
    const since = new Date(Date.now() - 2 * HOUR_MS);
    since.setMilliseconds(0);
    await recordForecastFailure(gridKey, since, 'WeatherError: The forecast server answered HTTP 500.');
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.body.forecast).toMatchObject({ stale: true, staleReason: 'failing', failingSince: since.toISOString(), staleSince: since.toISOString() });
  });

  it('a stored planting that no longer validates: a plain note, and the weather without it', async () => {
    const { plot, today } = await plotOnOwnGround();
    const saved = await plantSoybeans(plot.id, today);
    await db
      .updateTable('plantings')
      .set({ input: JSON.stringify({ season: 'spring', method: 'spray-and-seed', blend: [{ speciesId: 'kudzu', share: 1 }], targetSeedDate: plusDays(today, 8) }) })
      .where('id', '=', saved.planting.id)
      .execute();
    const res = await owner.get(`/api/plots/${plot.id}/weather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body.planting.id).toBe(saved.planting.id);
    expect(res.body.plantingNote).toMatch(/could not be read/);
    expect(res.body.chart.blend).toBeNull();
    expect(res.body.chart.days.length).toBeGreaterThan(0);
  });

  it('answers 404 for a plot id that does not exist', async () => {
    const res = await owner.get('/api/plots/00000000-0000-4000-8000-000000000000/weather');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: 'Not found' });
  });
});
