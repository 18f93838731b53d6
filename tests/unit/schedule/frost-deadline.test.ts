// Frost deadline: every planting, whatever its season label, gives each species the growing days it needs
// before its killing freeze (lib/agronomy/growing-days.ts). Frost-tender species (soybeans: about 70 days, from
// memory) die at the first 32 °F freeze; hardy ones survive a light freeze and are counted to a hard freeze
// (National Weather Service: 28 °F), recorded for the property or estimated as the first frost + 14 days
// (NOAA/NCEI freeze tables for Michigan stations, 12–20 days at the 50 % dates; secondary). Crimson clover:
// 6 weeks (Michigan State University Extension / University of Georgia: 6–8 weeks). The old rule held every
// blend to fixed weeks before the average first frost and skipped spring plantings; issue 11 calls both wrong,
// so the Michigan-style crimson deadline below moved from Fri 3 Sep (6 weeks before 15 Oct) to Fri 17 Sep
// (6 weeks before the estimated hard freeze, 29 Oct). The spring margin of 7 days is common practice, no source.
// Weekdays are checked against Intl (ECMA-402) through intlDay, independent of the engine's own formatting.
import { describe, expect, it } from 'vitest';
import { blendProfile } from '@/lib/agronomy/species';
import { checkStepDate, planPlanting } from '@/lib/schedule/plan';
import {
  FROST_DEADLINE_DEFAULTS,
  FROST_DEADLINE_SOURCES,
  fallFreezeDates,
  frostBounds,
  frostDeadlineOn,
} from '@/lib/schedule/rules/frost-deadline';
import type { PlantingInput, RuleDecision } from '@/lib/schedule/types';
import { PlanInputError } from '@/lib/schedule/validate';
import { localNoon, makeForecast } from './forecast-fixture';
import { intlDay, planting, step } from './plantings';

const frostRule = (rules: RuleDecision[]): RuleDecision => {
  const found = rules.find((r) => r.rule === 'frost-deadline');
  if (!found) throw new Error(`no frost-deadline decision among ${rules.map((r) => r.rule).join(', ')}`);
  return found;
};
const boundsOf = (input: PlantingInput) => frostBounds(input, blendProfile(input.blend), FROST_DEADLINE_DEFAULTS);

/** A summer soybean plot where the average first fall frost is Sat 10 Oct 2026. */
const soybeans = (targetSeedDate: string) =>
  planting({ season: 'spring', blend: [{ speciesId: 'soybeans', share: 1 }], avgLastSpringFrost: '04-20', avgFirstFallFrost: '10-10', targetSeedDate });

describe('frost deadline: warm-season plantings against the first fall freeze', () => {
  it('fails soybeans seeded 20 days before the average first fall frost, though the planting is labelled spring', () => {
    const seed = step(planPlanting(soybeans('2026-09-20'), null, localNoon('2026-09-01')), 'seed');
    expect(seed.date).toBe('2026-09-20');
    const decision = frostRule(seed.rules);
    expect(decision.ok).toBe(false);
    const frost = intlDay('2026-10-10', true);
    expect(frost).toBe('Sat 10 Oct');
    expect(decision.reason).toContain(`soybeans need about 70 days of growth before a killing freeze; the average first fall frost here is ${frost}, 20 days after seeding`);
    // By hand: 10 Oct − 70 days = 1 Aug.
    expect(decision.reason).toContain(`latest date ${intlDay('2026-08-01', true)}`);
    expect(seed.warnings.join(' ')).toContain(`the latest date is ${intlDay('2026-08-01', true)}`);
  });

  it('passes soybeans with enough growing days, and draws the line 70 days before the frost', () => {
    const seed = step(planPlanting(soybeans('2026-05-15'), null, localNoon('2026-05-01')), 'seed');
    expect(frostRule(seed.rules).ok).toBe(true);
    // 15 May → 10 Oct is 148 days, by hand.
    expect(frostRule(seed.rules).reason).toContain('148 days of growth before the average first fall frost');
    const bounds = boundsOf(soybeans('2026-05-15'));
    expect(bounds.fallLatest).toBe('2026-08-01');
    expect(frostDeadlineOn('2026-08-01', bounds, FROST_DEADLINE_DEFAULTS).decision.ok).toBe(true);
    expect(frostDeadlineOn('2026-08-02', bounds, FROST_DEADLINE_DEFAULTS).decision.ok).toBe(false);
  });

  it('refuses a soybean seeding dragged to 20 days before the frost', () => {
    const input = soybeans('2026-05-15');
    const now = localNoon('2026-05-01');
    const decisions = checkStepDate(input, planPlanting(input, null, now), 'seed', '2026-09-20', null, now);
    expect(frostRule(decisions)).toMatchObject({ ok: false });
    expect(frostRule(decisions).reason).toContain('20 days after seeding');
  });

  it('still holds frost-tender spring seed until the average last frost plus the margin', () => {
    expect(FROST_DEADLINE_DEFAULTS.springMarginDays).toBe(7);
    const input = planting({ blend: [{ speciesId: 'soybeans', share: 1 }], season: 'spring', avgLastSpringFrost: '04-20', targetSeedDate: '2027-04-15' });
    const seed = step(planPlanting(input, null, localNoon('2027-03-20')), 'seed');
    expect(seed.date).toBe('2027-04-27');
    expect(seed.warnings.join(' ')).toContain('before Tue 27 Apr');
    expect(frostRule(seed.rules)).toMatchObject({ ok: true });
    const tooEarly = frostDeadlineOn('2027-04-20', boundsOf(input), FROST_DEADLINE_DEFAULTS).decision;
    expect(tooEarly).toMatchObject({ ok: false });
    expect(tooEarly.reason).toMatch(/too early for frost-tender seed/);
  });

  it('does not hold back a spring blend with no frost-tender species', () => {
    const input = planting({ season: 'spring', avgLastSpringFrost: '04-20', targetSeedDate: '2027-04-01' });
    expect(step(planPlanting(input, null, localNoon('2027-03-20')), 'seed').date).toBe('2027-04-01');
  });
});

describe('frost deadline: hardy fall plantings count to the hard freeze', () => {
  it('estimates the hard freeze two weeks after the first frost unless the property records it', () => {
    expect(FROST_DEADLINE_DEFAULTS.hardFreezeAfterFirstFrostDays).toBe(14);
    expect(FROST_DEADLINE_SOURCES.hardFreezeAfterFirstFrostDays).toMatch(/East Lansing/);
    expect(fallFreezeDates('2027-09-01', { avgFirstFallFrost: '10-15' }, FROST_DEADLINE_DEFAULTS)).toEqual({
      firstFallFrost: '2027-10-15',
      firstHardFreeze: '2027-10-29',
      hardFreezeEstimated: true,
    });
    // A recorded hard freeze in the new year belongs to the winter that the December frost begins.
    expect(fallFreezeDates('2027-10-01', { avgFirstFallFrost: '12-20', avgFirstHardFreeze: '01-08' }, FROST_DEADLINE_DEFAULTS)).toEqual({
      firstFallFrost: '2027-12-20',
      firstHardFreeze: '2028-01-08',
      hardFreezeEstimated: false,
    });
  });

  it('refuses a hard-freeze date that is not a month and day, naming the field', () => {
    let error: unknown;
    try {
      planPlanting(planting({ avgFirstHardFreeze: '12-32' }), null, localNoon('2027-08-20'));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(PlanInputError);
    expect((error as PlanInputError).issues.join(' | ')).toContain('The average first hard freeze "12-32" is not a month and day (MM-DD).');
  });

  it('white clover seeded two weeks before the average first frost fails: it needs about 8 weeks', () => {
    const input = planting({ targetSeedDate: '2027-11-06' }); // white clover; average first frost Sat 20 Nov
    const decision = frostRule(step(planPlanting(input, null, localNoon('2027-10-20')), 'seed').rules);
    expect(decision.ok).toBe(false);
    // Hard freeze 20 Nov + 14 = 4 Dec, 28 days after seeding; latest 4 Dec − 56 = 9 Oct, by hand.
    expect(decision.reason).toContain('white clover needs about 56 days of growth before a hard freeze (28 °F)');
    expect(decision.reason).toContain(`survives a light freeze; the hard freeze here is about ${intlDay('2027-12-04', true)}, 28 days after seeding`);
    expect(decision.reason).toContain(`latest date ${intlDay('2027-10-09', true)}`);
  });

  it('warns past the deadline and names the latest date, without moving the seeding (crimson clover, first frost 15 Oct)', () => {
    const input = planting({ blend: [{ speciesId: 'crimson-clover', share: 1 }], avgFirstFallFrost: '10-15', targetSeedDate: '2027-09-20' });
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    const seed = step(plan, 'seed');
    expect(seed.date).toBe('2027-09-20');
    // 15 Oct + 14 = 29 Oct; − 42 days = 17 Sep, by hand.
    const latest = intlDay('2027-09-17', true);
    expect(latest).toBe('Fri 17 Sep');
    expect(seed.warnings.join(' ')).toContain(`the latest date is ${latest}`);
    expect(plan.warnings.join(' ')).toContain(`the latest date is ${latest}`);
    expect(frostRule(seed.rules)).toMatchObject({ ok: false });
  });

  it('never lets the weather push a seeding past the deadline', () => {
    // Planned on the deadline, Fri 17 Sep; the only soaking rain comes later, Tue 21 Sep: seeding stays.
    const input = planting({ blend: [{ speciesId: 'crimson-clover', share: 1 }], avgFirstFallFrost: '10-15', targetSeedDate: '2027-09-17' });
    const forecast = makeForecast({ startDate: '2027-09-13', rain: [{ date: '2027-09-21', fromHour: 15, hours: 6, totalMm: 15 }] });
    const seed = step(planPlanting(input, forecast, localNoon('2027-09-13')), 'seed');
    expect(seed.date).toBe('2027-09-17');
    expect(seed.window?.latest).toBe('2027-09-17');
  });

  it('takes the species that must go in first as the blend’s deadline (cereal rye 14 days, crimson clover 42)', () => {
    const input = planting({
      blend: [
        { speciesId: 'cereal-rye', share: 0.5 },
        { speciesId: 'crimson-clover', share: 0.5 },
      ],
      avgFirstFallFrost: '10-15',
      targetSeedDate: '2027-09-01',
    });
    const bounds = boundsOf(input);
    expect(bounds.limiting.speciesId).toBe('crimson-clover');
    expect(bounds.fallLatest).toBe('2027-09-17');
    expect(bounds.species.find((s) => s.speciesId === 'cereal-rye')?.latest).toBe('2027-10-15');
    const late = frostDeadlineOn('2027-09-25', bounds, FROST_DEADLINE_DEFAULTS).decision;
    expect(late.ok).toBe(false);
    expect(late.reason).toMatch(/^crimson clover needs about 42 days/);
  });

  it('fails a seeding after this fall’s frost has passed, and takes next winter’s frost where the first frost comes in January', () => {
    const past = planting({ avgFirstFallFrost: '10-15', targetSeedDate: '2027-11-15' });
    expect(frostRule(step(planPlanting(past, null, localNoon('2027-11-01')), 'seed').rules).reason).toContain('already 17 days before seeding');
    // Central Florida: average first freeze about 11 Jan (1991–2020 normal as reported for an inland station; secondary).
    expect(fallFreezeDates('2027-11-01', { avgFirstFallFrost: '01-11' }, FROST_DEADLINE_DEFAULTS)?.firstFallFrost).toBe('2028-01-11');
  });
});

describe('frost deadline: north Florida crimson clover inside the UF/IFAS window', () => {
  // UF/IFAS Extension (Taylor County), Wildlife and Game Food Plots, planting dates for north Florida: crimson clover
  // Oct. 1 – Nov. 15 (see also UF/IFAS EDIS SS-AGR-28, cool-season forage recommendations for wildlife food plots in
  // north Florida). A site in north Florida with no real plot behind it, on Eastern time.
  const northFlorida = (overrides: Partial<PlantingInput>) =>
    planting({
      timeZone: 'America/New_York',
      latitudeDeg: 30,
      longitudeDeg: -83,
      avgLastSpringFrost: '02-20',
      blend: [{ speciesId: 'crimson-clover', share: 1 }],
      targetSeedDate: '2027-11-01',
      ...overrides,
    });

  it('passes 1 November where the average first freeze is 1 Dec (the 1991–2020 normal reported for Gainesville; secondary)', () => {
    const input = northFlorida({ avgFirstFallFrost: '12-01' });
    const decision = frostRule(step(planPlanting(input, null, localNoon('2027-10-20')), 'seed').rules);
    expect(decision.ok).toBe(true);
    // Hard freeze estimated 1 Dec + 14 = 15 Dec: 44 days after 1 Nov, by hand; latest 15 Dec − 42 = 3 Nov.
    expect(decision.reason).toContain('44 days of growth before a hard freeze (28 °F)');
    expect(boundsOf(input).fallLatest).toBe('2027-11-03');
  });

  it('passes 1 November with the hard freeze the Tallahassee NWS office publishes (freeze 20 Nov, hard freeze 23 Dec, 1981–2010)', () => {
    const input = northFlorida({ avgFirstFallFrost: '11-20', avgFirstHardFreeze: '12-23' });
    const decision = frostRule(step(planPlanting(input, null, localNoon('2027-10-20')), 'seed').rules);
    expect(decision.ok).toBe(true);
    expect(decision.reason).toContain("52 days of growth before a hard freeze (28 °F) about Thu 23 Dec (the property's average first hard freeze)");
    // 23 Dec − 42 = 11 Nov: four days short of the UF/IFAS window's 15 Nov end (the NWS office's hard freeze is 25 °F).
    expect(boundsOf(input).fallLatest).toBe('2027-11-11');
    expect(frostDeadlineOn('2027-10-01', boundsOf(input), FROST_DEADLINE_DEFAULTS).decision.ok).toBe(true);
  });
});
