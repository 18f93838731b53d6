// Herbicide actives in the plan: the plant-back of the mix holds the seeding back, the kill wait and rainfast
// come from the actives unless the label's values are entered, a selective active over an existing stand must
// spare it. Sources per check: Penn State Extension, "Including 2,4-D in the Burndown" (2,4-D ester: 30 days
// before crops other than corn, soybeans, sorghum and small grains); Illinois IPM Bulletin 2012 (no tillage
// for 7 days after a 2,4-D ester); glyphosate label (no soil residual activity); NDSU Crop & Pest Report 2016
// (glyphosate to tillage); Select 2 EC label (clethodim: grass only, rainfast 1 h). Forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { mphToKmh } from '@/lib/agronomy/units';
import { checkStepDate, planPlanting } from '@/lib/schedule/plan';
import { plantingInputIssues } from '@/lib/schedule/validate';
import type { HerbicidePlan } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step } from './plantings';

const NOW = localNoon('2027-03-01');
const herbicide = (activeIngredients: string[], extra: Partial<HerbicidePlan> = {}): HerbicidePlan => ({
  productName: 'Example burndown',
  activeIngredients,
  rate: { percentSolution: 2 },
  ...extra,
});
const burndown = (activeIngredients: string[], extra: Partial<HerbicidePlan> = {}) =>
  planting({
    season: 'spring',
    cover: 'grass-weeds',
    targetSeedDate: '2027-04-15',
    herbicide: herbicide(activeIngredients, extra),
    sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  });
// FAO-56 eq. 47: a 10-m wind for 5 mph at 2 m, inside the 3–8 mph stewardship band.
const CALM_KMH = mphToKmh(5 / (4.87 / Math.log(67.8 * 10 - 5.42)));

describe('herbicide actives in the plan', () => {
  it('a 2,4-D ester burndown before clover moves seeding past its 30-day plant-back and says why (Penn State Extension)', () => {
    const plan = planPlanting(burndown(['glyphosate', '2,4-d-ester']), null, NOW);
    const spray = step(plan, 'spray');
    // Kill wait from the actives: 7 days, the longest of glyphosate (NDSU, up to 7 for perennials) and the ester (Illinois IPM).
    expect(step(plan, 'kill-wait').date).toBe('2027-04-15');
    expect(spray.date).toBe('2027-04-08');
    expect(step(plan, 'kill-wait').reason).toContain('7 days is typical for glyphosate');
    const seed = step(plan, 'seed');
    // 8 Apr + 30 days = 8 May.
    expect(seed.date).toBe('2027-05-08');
    expect(seed.reason).toMatch(/^held until the plant-back ends Sat 8 May: 2,4-D ester typically needs 30 days between spraying and sowing clovers and other legumes/);
    expect(seed.reason).toContain('the label on your jug is the law');
    expect(seed.warnings.join(' ')).toContain('Seeding moved from Thu 15 Apr to Sat 8 May');
    expect(plan.warnings.join(' ')).toContain('spray at least 30 days before it');
    expect(seed.rules.find((r) => r.rule === 'plant-back')).toMatchObject({ ok: true });
  });

  it('a glyphosate-only burndown has no plant-back: the seeding keeps its date (glyphosate label: no soil residual activity)', () => {
    const plan = planPlanting(burndown(['glyphosate']), null, NOW);
    const seed = step(plan, 'seed');
    expect(seed.date).toBe('2027-04-15');
    expect(seed.rules.some((r) => r.rule === 'plant-back')).toBe(false);
    expect(seed.reason).not.toContain('plant-back');
    expect(plan.warnings.join(' ')).not.toContain('plant-back');
  });

  it('explains a plant-back violation when seeding is dragged too early', () => {
    const input = burndown(['glyphosate', '2,4-d-ester']);
    const plan = planPlanting(input, null, NOW);
    const decisions = checkStepDate(input, plan, 'seed', '2027-04-20', null, NOW);
    expect(decisions.find((r) => r.rule === 'plant-back')).toMatchObject({
      ok: false,
      reason: expect.stringContaining('before the plant-back ends on Sat 8 May (spraying Thu 8 Apr): 2,4-D ester typically needs 30 days'),
    });
  });

  it('spray-and-seed says plainly it cannot seed into the dying cover with a 30-day plant-back, and moves the seeding', () => {
    const input = { ...burndown(['glyphosate', '2,4-d-ester']), method: 'spray-and-seed' as const };
    const plan = planPlanting(input, null, NOW);
    const spray = step(plan, 'spray');
    const seed = step(plan, 'seed');
    expect(spray.date).toBe('2027-04-14'); // the usual day before the target
    expect(seed.date).toBe('2027-05-14');
    expect(seed.warnings.join(' ')).toMatch(/Spray-and-seed sows within 2 days of spraying, but 2,4-D ester typically needs 30 days/);
    expect(seed.warnings.join(' ')).toContain('glyphosate alone (no plant-back)');
    expect(seed.rules.filter((r) => !r.ok)).toEqual([]);
    // Glyphosate alone keeps the usual spray-and-seed gap.
    const quick = planPlanting({ ...input, herbicide: herbicide(['glyphosate']) }, null, NOW);
    expect([step(quick, 'spray').date, step(quick, 'seed').date]).toEqual(['2027-04-14', '2027-04-15']);
  });

  it('takes the kill wait from the actives unless the planting gives one (the label value wins)', () => {
    // Triclopyr: 14 days for brush to brown out (from memory) outlasts glyphosate's 7.
    expect(step(planPlanting(burndown(['glyphosate', 'triclopyr']), null, NOW), 'spray').date).toBe('2027-04-01');
    const own = planPlanting({ ...burndown(['glyphosate']), killWaitDays: 10 }, null, NOW);
    expect(step(own, 'spray').date).toBe('2027-04-05');
    expect(step(own, 'kill-wait').reason).not.toContain('typical for');
    // No actives: the 14-day default (KILL_WAIT_SOURCES, common practice).
    expect(step(planPlanting(burndown([]), null, NOW), 'spray').date).toBe('2027-04-01');
  });

  it('takes the rainfast period from the actives unless the label value is entered', () => {
    const forecast = makeForecast({ startDate: '2027-04-05', days: 8, airTempC: 20, windKmh: CALM_KMH });
    const now = localNoon('2027-04-05');
    // Generic glyphosate 41 % labels ask up to 6 h; Gannon & Yelverton (2008) measured ≥ 90 % control after 1 h.
    const glyphosate = step(planPlanting(burndown(['glyphosate']), forecast, now), 'spray');
    expect(glyphosate.reason).toContain('no rain for 6 h after (typical for glyphosate)');
    // Clethodim: do not apply if rain is expected within 1 hour (Select 2 EC label).
    const clethodim = step(planPlanting({ ...burndown(['clethodim']), blend: [{ speciesId: 'white-clover', share: 1 }] }, forecast, now), 'spray');
    expect(clethodim.reason).toContain('no rain for 1 h after (typical for clethodim)');
    const label = step(planPlanting(burndown(['glyphosate'], { rainfastHours: 2 }), forecast, now), 'spray');
    expect(label.reason).toContain('no rain for 2 h after (the label)');
  });
});

describe('a selective herbicide over an existing stand', () => {
  const stand = (ids: string[]) =>
    planting({
      method: 'spray-and-seed',
      cover: 'existing-stand',
      blend: [{ speciesId: 'white-clover', share: 1 }],
      herbicide: herbicide(ids),
      sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
    });

  it('accepts clethodim over clover: a grass herbicide spares broadleaf stands (Select 2 EC label)', () => {
    expect(plantingInputIssues(stand(['clethodim']))).toEqual([]);
    expect(plantingInputIssues(stand(['sethoxydim']))).toEqual([]);
    const plan = planPlanting(stand(['clethodim']), null, localNoon('2027-08-20'));
    expect(step(plan, 'seed').date).toBe('2027-09-14'); // no plant-back before legumes
  });

  it('refuses 2,4-D, dicamba or triclopyr over clover, naming the active and the stand', () => {
    const issues = plantingInputIssues(stand(['2,4-d-ester']));
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatch(/^Herbicide actives: 2,4-D ester kills clovers and other legumes .* cannot go over the existing stand of white clover/);
    expect(issues[0]).toContain('clethodim or sethoxydim');
    expect(plantingInputIssues(stand(['dicamba', 'clethodim']))).toHaveLength(1);
    expect(plantingInputIssues(stand(['triclopyr']))[0]).toContain('triclopyr kills clovers');
    expect(() => planPlanting(stand(['2,4-d-amine']), null, NOW)).toThrow(/2,4-D amine kills clovers/);
  });

  it('lets a non-selective renovation burndown over the stand through; the plant-back then rules the reseeding', () => {
    expect(plantingInputIssues(stand(['glyphosate', '2,4-d-ester']))).toEqual([]);
  });

  it('refuses an unknown active by name, in the engine and in the planting schema (the 400 names the field)', () => {
    expect(plantingInputIssues(stand(['atrazine']))).toEqual([expect.stringMatching(/^Herbicide actives: unknown "atrazine"; use glyphosate, 2,4-d-ester/)]);
    const parsed = plantingSchema.safeParse({
      season: 'fall',
      method: 'spray-and-seed',
      blend: [{ speciesId: 'white-clover', share: 1 }],
      targetSeedDate: '2027-09-14',
      herbicide: { productName: 'Example', activeIngredients: ['atrazine'], rateKind: 'percent-solution', rate: 2 },
      sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
    });
    expect(parsed.success).toBe(false);
    const issue = parsed.error!.issues[0];
    expect(issue.path.join('.')).toBe('herbicide.activeIngredients.0');
    expect(issue.message).toMatch(/^Herbicide actives must be from the list/);
  });
});

describe('clearing before the burndown', () => {
  it('mowing the herbaceous cover holds the spray back for regrowth to the label stage (glyphosate label language, from memory)', () => {
    const input = { ...burndown(['glyphosate']), clearBrush: true };
    const plan = planPlanting(input, null, localNoon('2027-03-25'));
    const clear = step(plan, 'clear-brush');
    const spray = step(plan, 'spray');
    // Planned spray 8 Apr is only 14 days out: the mow goes today (25 Mar) and the spray waits 21 days, to 15 Apr.
    expect(clear.date).toBe('2027-03-25');
    expect(spray.date).toBe('2027-04-15');
    expect(clear.reason).toContain('mowed weeds must regrow');
    const dragged = checkStepDate(input, plan, 'spray', '2027-04-01', null, localNoon('2027-03-25'));
    expect(dragged.find((r) => !r.ok)?.reason).toBe("only 7 days after mowing; mowed weeds need about 21 days to regrow to the label's stage");
  });

  it('chainsaw work on woody brush does not delay spraying (common practice, no source)', () => {
    const input = { ...burndown(['glyphosate']), cover: 'brush' as const };
    const plan = planPlanting(input, null, localNoon('2027-03-25'));
    expect(step(plan, 'spray').date).toBe('2027-04-08');
    expect(step(plan, 'clear-brush').date).toBe('2027-04-07');
    expect(step(plan, 'clear-brush').reason).toContain('does not hold the spraying back');
  });
});
