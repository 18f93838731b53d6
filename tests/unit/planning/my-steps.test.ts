// The phone list's grouping (lib/planning/my-steps.ts) over plain rows: each step by its own property's today,
// read here with Intl's IANA zone data (ECMA-402) independently of the code under test; and the schema of a
// completion (lib/validations/step.ts). Bounds are Sowcast's own (common practice, no source).
import { describe, expect, it } from 'vitest';
import type { MyStepRow } from '@/lib/data/my-steps';
import { mySteps } from '@/lib/planning/my-steps';
import { stepOutcomeSchema } from '@/lib/validations/step';

const NOW = new Date('2027-03-10T09:30:00Z');
const today = (timeZone: string, days = 0) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(NOW.getTime() + days * 86_400_000);

let n = 0;
function row(over: Partial<MyStepRow>): MyStepRow {
  n += 1;
  return {
    step_id: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
    kind: 'spray',
    title: 'Spray the burndown',
    local_date: today('America/Chicago'),
    position: n,
    status: 'planned',
    pinned: false,
    recurrence: null,
    hours: null,
    quantities: [],
    cautions: [],
    reason: '',
    warnings: [],
    notes: null,
    done_on: null,
    done_at: null,
    done_by_name: null,
    done_record: null,
    assignee_id: null,
    assignee_name: null,
    planting_id: 'p1',
    method: 'prepared-seedbed',
    blend: null,
    plot_id: 'plot1',
    plot_name: 'North strip',
    acres: 1,
    property_id: 'prop1',
    property_name: 'Test ground',
    time_zone: 'America/Chicago',
    role: 'member',
    ...over,
  };
}

describe('mySteps', () => {
  it('groups by each property’s own today: overdue, today, tomorrow, this week, later; drops past 14 days', () => {
    const tz = 'Pacific/Kiritimati'; // UTC+14: already the 10th's evening, i.e. its "today" is the 10th or 11th
    const rows = [
      row({ local_date: today(tz, -3), time_zone: tz }),
      row({ local_date: today(tz, 0), time_zone: tz }),
      row({ local_date: today(tz, 1), time_zone: tz }),
      row({ local_date: today(tz, 6), time_zone: tz }),
      row({ local_date: today(tz, 7), time_zone: tz }),
      row({ local_date: today(tz, 14), time_zone: tz }),
      row({ local_date: today(tz, 15), time_zone: tz }),
    ];
    const out = mySteps(rows, NOW);
    expect(out.map((s) => [s.group, s.inDays])).toEqual([
      ['overdue', -3],
      ['today', 0],
      ['tomorrow', 1],
      ['this-week', 6],
      ['later', 7],
      ['later', 14],
    ]);
    expect(out.every((s) => s.today === today(tz))).toBe(true);
  });

  it('the same stored date is today in one zone and tomorrow in another at the same instant', () => {
    const east = today('Pacific/Kiritimati');
    const out = mySteps([row({ local_date: east, time_zone: 'Pacific/Kiritimati' }), row({ local_date: east, time_zone: 'Pacific/Pago_Pago' })], NOW);
    expect(today('Pacific/Kiritimati')).not.toBe(today('Pacific/Pago_Pago'));
    expect(out.map((s) => s.group).sort()).toEqual(['today', 'tomorrow'].sort());
  });

  it('a viewer cannot complete, recurring upkeep expands per visit and is never completed whole', () => {
    const tz = 'America/Chicago';
    const out = mySteps(
      [
        row({ role: 'viewer' }),
        row({ kind: 'mow', recurrence: `DTSTART;TZID=${tz}:${today(tz).replace(/-/g, '')}T080000\nRRULE:FREQ=WEEKLY;INTERVAL=1`, time_zone: tz }),
      ],
      NOW,
    );
    expect(out.find((s) => s.kind === 'spray')!.canComplete).toBe(false);
    const visits = out.filter((s) => s.kind === 'mow');
    // Weekly from today over today..today+14 (RFC 5545 RRULE): three visits, on days 0, 7 and 14.
    expect(visits.map((s) => s.inDays)).toEqual([0, 7, 14]);
    expect(visits.every((s) => s.recurring && !s.canComplete && s.clock === '08:00')).toBe(true);
  });

  it('done today and yesterday show at the end; older ones and skipped ones do not', () => {
    const tz = 'America/Chicago';
    const out = mySteps(
      [
        row({ status: 'done', done_on: today(tz), local_date: today(tz) }),
        row({ status: 'done', done_on: today(tz, -1), local_date: today(tz, -1) }),
        row({ status: 'done', done_on: today(tz, -2), local_date: today(tz, -2) }),
        row({ status: 'skipped', local_date: today(tz) }),
        row({ local_date: today(tz, 2) }),
      ],
      NOW,
    );
    expect(out.map((s) => [s.group, s.status, s.inDays])).toEqual([
      ['this-week', 'planned', 2],
      ['recorded', 'done', 0],
      ['recorded', 'done', -1],
    ]);
    expect(out.every((s) => s.group !== 'recorded' || !s.canComplete)).toBe(true);
  });

  it('a seeding carries its planned seed, total and per species, for the record of what was broadcast', () => {
    const [step] = mySteps(
      [
        row({
          kind: 'seed',
          blend: [{ speciesId: 'cereal-rye', share: 0.6 }, { speciesId: 'crimson-clover', share: 0.4 }],
          quantities: [
            { item: 'seed', amount: 60, unit: 'lb', detail: '60 lb of seed — 2 bags' },
            { item: 'Cereal rye', amount: 45, unit: 'lb', detail: '45 lb of cereal rye' },
          ],
        }),
      ],
      NOW,
    );
    expect(step.seed!.plannedLb).toBe(60);
    expect(step.seed!.parts.map((p) => p.speciesId)).toEqual(['cereal-rye', 'crimson-clover']);
  });
});

describe('stepOutcomeSchema (additions)', () => {
  it('takes an RFC 3339 instant with offset or Z, and a seed record whose parts add up', () => {
    expect(stepOutcomeSchema.safeParse({ status: 'done', doneAt: '2027-03-10T08:30:00-06:00' }).success).toBe(true);
    expect(stepOutcomeSchema.safeParse({ status: 'done', doneAt: '2027-03-10T14:30:00.000Z' }).success).toBe(true);
    expect(stepOutcomeSchema.safeParse({ status: 'done', doneAt: '2027-03-10 08:30' }).success).toBe(false);
    expect(stepOutcomeSchema.safeParse({ status: 'done', record: { seedLb: 20, species: [{ speciesId: 'oats', lb: 12 }, { speciesId: 'red-clover', lb: 8 }] } }).success).toBe(true);
    const off = stepOutcomeSchema.safeParse({ status: 'done', record: { seedLb: 20, species: [{ speciesId: 'oats', lb: 12 }] } });
    expect(off.success).toBe(false);
    expect(off.error!.issues[0].path).toEqual(['record', 'species']);
    expect(stepOutcomeSchema.safeParse({ status: 'done', record: { seedLb: 20, extra: 1 } }).success).toBe(false);
    expect(stepOutcomeSchema.safeParse({ status: 'done', record: { seedLb: 10_001 } }).success).toBe(false);
  });
});
