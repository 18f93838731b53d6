// The planner's side-by-side comparison gives the frost margin that binds: for a frost-tender spring blend, days
// after the earliest safe date (average last frost + 7 days, common practice, no source) or days to spare before
// the latest date (average first fall frost less the 70 days soybeans need, lib/agronomy/growing-days.ts, from
// memory) — whichever is smaller. Margins are worked by hand below; no forecast, so the engine's own rules decide.
import { describe, expect, it } from 'vitest';
import { compareSeedingDates } from '@/lib/planning/compare-seeding';
import type { PlantingFormInput } from '@/lib/validations/planting';
import { localNoon } from '../schedule/forecast-fixture';
import { ZONE } from '../schedule/plantings';

const property = {
  time_zone: ZONE, latitude: 38.6, longitude: -90.2, elevation_m: 150, avg_last_spring_frost: '04-10', avg_first_fall_frost: '11-20',
} as Parameters<typeof compareSeedingDates>[0]['property'];
const form = { season: 'spring', method: 'prepared-seedbed', blend: [{ speciesId: 'soybeans', share: 1 }], targetSeedDate: '2027-05-14' } as PlantingFormInput;

describe('compareSeedingDates: frost margin for a spring soybean planting', () => {
  it('takes the spring margin early in the year and the fall margin late in it', () => {
    const [may, september, late] = compareSeedingDates({
      property, plot: { acres: 1, cover: 'tilled' }, form, seedDates: ['2027-05-14', '2027-09-01', '2027-09-20'], forecast: null, now: localNoon('2027-05-01'),
    });
    // 10 Apr + 7 = 17 Apr; 14 May is 27 days after it. 20 Nov − 70 = 11 Sep, 120 days after 14 May: the spring margin binds.
    expect(may.frost).toMatchObject({ marginDays: 27, limitDate: '2027-04-17', frostDate: '2027-04-10', growingDaysNeeded: 70, weeksNeeded: 10 });
    // 1 Sep is 10 days before 11 Sep; 20 Sep is 9 days past it, and the engine's verdict fails.
    expect(september.frost).toMatchObject({ marginDays: 10, limitDate: '2027-09-11', frostDate: '2027-11-20' });
    expect(late.frost.marginDays).toBe(-9);
    expect(late.frost.note).toContain('soybeans need about 70 days of growth before the average first fall frost');
    expect(late.decisions.find((d) => d.rule === 'frost-deadline')?.ok).toBe(false);
    expect(late.ok).toBe(false);
  });
});
