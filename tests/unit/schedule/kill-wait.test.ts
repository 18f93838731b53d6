// Kill wait: the end is spray date + the wait (default 14 days, common practice, no source; the label's
// interval governs), and it counts from the real spray date once spraying is done.
import { describe, expect, it } from 'vitest';
import { checkStepDate, planPlanting, replan } from '@/lib/schedule/plan';
import { KILL_WAIT_DEFAULTS } from '@/lib/schedule/rules/kill-wait';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const input = planting({ cover: 'grass-weeds', targetSeedDate: '2027-10-01' });

describe('kill wait', () => {
  it('ends 14 days after spraying by default, as a dated step of its own', () => {
    expect(KILL_WAIT_DEFAULTS.killWaitDays).toBe(14);
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    const spray = step(plan, 'spray');
    const wait = step(plan, 'kill-wait');
    expect(spray.date).toBe('2027-09-17');
    expect(wait.date).toBe('2027-10-01');
    expect(wait.window).toEqual({ earliest: '2027-09-17', latest: '2027-10-01' });
    expect(wait.reason).toBe('kill wait of 14 days after the planned spraying on Fri 17 Sep ends Fri 1 Oct');
    expect(step(plan, 'seed').date >= wait.date).toBe(true);
  });

  it('takes the planting\'s own kill wait', () => {
    const plan = planPlanting({ ...input, killWaitDays: 10 }, null, localNoon('2027-08-20'));
    expect(step(plan, 'spray').date).toBe('2027-09-21');
    expect(step(plan, 'kill-wait').date).toBe('2027-10-01');
  });

  it('counts from the real spray date, and the seeding follows it', () => {
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    const done = withStep(plan, 'spray', { status: 'done', doneOn: '2027-09-20' });
    const now = localNoon('2027-09-21');
    const { plan: next, changes } = replan(input, done, makeForecast({ startDate: '2027-09-21' }), now);
    expect(step(next, 'spray').date).toBe('2027-09-17'); // a done step never moves; its real date is doneOn
    expect(step(next, 'kill-wait').date).toBe('2027-10-04');
    expect(step(next, 'seed').date).toBe('2027-10-04');
    const wait = changes.find((c) => c.key === 'kill-wait')!;
    expect(wait.reason).toBe('moved the end of the kill wait from Fri 1 to Mon 4: kill wait of 14 days after spraying on Mon 20 Sep ends Mon 4 Oct');
    expect(changes.find((c) => c.key === 'spray')).toBeUndefined();
  });

  it('explains why seeding cannot be dragged into the kill wait (the till goes with the seeding)', () => {
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    const early = checkStepDate(input, plan, 'seed', '2027-09-28', null);
    expect(early.find((r) => r.rule === 'kill-wait')).toMatchObject({
      ok: false,
      reason: 'before the kill wait ends on Fri 1 Oct (14 days after spraying on Fri 17 Sep)',
    });
    const sequence = early.find((r) => r.rule === 'sequence')!;
    expect(sequence.ok).toBe(false);
    expect(sequence.reason).toContain('the end of the kill wait (Fri 1)');
    expect(sequence.reason).not.toContain('raking');
    const later = checkStepDate(input, plan, 'seed', '2027-10-03', null);
    expect(later.filter((r) => r.rule === 'kill-wait' || r.rule === 'sequence').every((r) => r.ok)).toBe(true);
  });
});
