// Step sequences per method, as the issue describes the trade's practice (common practice, no source):
// spray-and-seed: clear → spray → seed within 0–2 days → check germination → fertilize once up;
// prepared seedbed: clear → spray → kill wait → burn → fertilize → rake/till → seed → cover → check, with the
// lime months ahead (Mississippi State Extension: 3–6 months before planting) and the fertilizer down before
// the final seedbed pass that works it in (the issue: P and K worked in, not spread after the seed is covered);
// frost seeding: late-winter broadcast onto frozen ground of an existing stand.
import { describe, expect, it } from 'vitest';
import { daysBetween } from '@/lib/schedule/local-dates';
import { planPlanting } from '@/lib/schedule/plan';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import { PlanInputError } from '@/lib/schedule/validate';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step } from './plantings';

const NOW = localNoon('2027-08-01');
const keys = (p: ReturnType<typeof planPlanting>) => p.steps.filter((s) => !s.recurrence).map((s) => s.key);

describe('methods', () => {
  it('names every step kind in the trade\'s words', () => {
    expect(Object.values(STEP_KINDS).map((k) => k.title)).toEqual([
      'Clear brush',
      'Spray the burndown',
      'Kill wait',
      'Burn (optional)',
      'Rake or till',
      'Broadcast seed',
      'Cover the seed (drag or cultipack)',
      'Fertilize',
      'Lime',
      'Check germination',
      'Mow',
      'Spot-spray grass',
      'Frost seed',
      'Soil test',
    ]);
  });

  it('spray-and-seed: clear, spray, seed into the dying cover a day later, check, then fertilize', () => {
    const plan = planPlanting(
      planting({ method: 'spray-and-seed', cover: 'brush', targetSeedDate: '2027-09-14', fertilizer: { grade: [13, 13, 13], target: { n: 20 } } }),
      null,
      NOW,
    );
    expect(keys(plan)).toEqual(['soil-test', 'clear-brush', 'spray', 'seed', 'check-germination', 'fertilize']);
    expect(daysBetween(step(plan, 'spray').date, step(plan, 'seed').date)).toBe(1);
    expect(step(plan, 'clear-brush').date < step(plan, 'spray').date).toBe(true);
    expect(step(plan, 'fertilize').after).toEqual(['check-germination']);
  });

  it('prepared seedbed: lime months ahead, then spray, kill wait, burn (permit in hand), fertilize, till, seed, cover, check', () => {
    const plan = planPlanting(
      planting({
        cover: 'grass-weeds',
        targetSeedDate: '2027-09-20',
        burn: { planned: true, permitInHand: true },
        lime: { tonsPerAcre: 1 },
        coverSeed: true,
        fertilizer: { grade: [13, 13, 13], target: { n: 20 } },
      }),
      null,
      localNoon('2027-05-01'),
    );
    // Until this issue the lime went on with the seedbed work, the day of seeding, and the fertilizer after the
    // seed was covered; both were wrong (lime needs months; P and K must be worked in).
    expect(keys(plan)).toEqual(['soil-test', 'lime', 'spray', 'kill-wait', 'burn', 'fertilize', 'rake-till', 'seed', 'cover-seed', 'check-germination']);
    const d = (k: string) => step(plan, k).date;
    expect(daysBetween(d('spray'), d('kill-wait'))).toBe(14);
    expect(d('burn') >= d('kill-wait')).toBe(true);
    expect(d('seed') > d('burn')).toBe(true);
    expect(d('fertilize')).toBe(d('seed'));
    expect(d('rake-till')).toBe(d('seed'));
    // The soil test went on today; the lab's numbers two weeks later; the lime then, 128 days before seeding.
    expect(d('soil-test')).toBe('2027-05-01');
    expect(d('lime')).toBe('2027-05-15');
    expect(step(plan, 'rake-till').after).toEqual(['burn', 'lime', 'fertilize']);
    expect(step(plan, 'lime').warnings).toEqual([]);
    expect(step(plan, 'soil-test').warnings).toEqual([]);
  });

  it('notes that lime needs months when the soil test comes late', () => {
    const plan = planPlanting(planting({ targetSeedDate: '2027-08-20', lime: { tonsPerAcre: 1 } }), null, NOW);
    expect(step(plan, 'soil-test').warnings.join(' ')).toContain('lime works slowly');
  });

  it('frost seeding: one late-winter broadcast onto a frozen morning, then a check in spring', () => {
    const input = planting({
      method: 'frost-seeding',
      cover: 'existing-stand',
      season: 'spring',
      blend: [{ speciesId: 'red-clover', share: 1 }],
      targetSeedDate: '2028-02-20',
      avgLastSpringFrost: '04-10',
    });
    const forecast = makeForecast({
      startDate: '2028-02-14',
      // Freezing nights and thawing days only on Wed 23 and Fri 25; mild otherwise (invented).
      airTempC: ({ date, hour }) => (date === '2028-02-23' || date === '2028-02-25' ? (hour < 9 ? -4 : 6) : 4),
      soilTempC: 2,
    });
    const plan = planPlanting(input, forecast, localNoon('2028-02-14'));
    expect(keys(plan)).toEqual(['frost-seed', 'check-germination']);
    const seed = step(plan, 'frost-seed');
    expect(seed.date).toBe('2028-02-23');
    expect(seed.reason).toContain('freeze-thaw');
    // Frost seeding uses the published frost-seeding rate, not a share of a bag rate (red clover 6–8 lb/acre: University
    // of Kentucky Extension column; University of Missouri Extension, Roberts).
    expect(seed.quantities[0].detail).toContain('published frost-seeding rate (red clover 6–8 lb/acre)');
    // Seedlings come as the soil warms, around the average last frost.
    expect(step(plan, 'check-germination').date).toBe('2028-04-10');
  });

  it('refuses bad input with one clear message per problem', () => {
    const bad = planting({ acres: 0, timeZone: 'Mars/Olympus', targetSeedDate: '2027-02-30', blend: [{ speciesId: 'kudzu', share: 1 }] });
    let error: unknown;
    try {
      planPlanting(bad, null, NOW);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(PlanInputError);
    const issues = (error as PlanInputError).issues.join(' | ');
    expect(issues).toContain('Unknown time zone "Mars/Olympus"');
    expect(issues).toContain('Plot size must be more than 0 acres');
    expect(issues).toContain('"2027-02-30" is not a date');
    expect(issues).toContain('Unknown species "kudzu"');
  });
});
