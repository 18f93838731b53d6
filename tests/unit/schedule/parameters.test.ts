// Every default the rules use is exported with the place it comes from, and a planting can change it.
import { describe, expect, it } from 'vitest';
import { DEFAULT_SCHEDULE_PARAMETERS, SCHEDULE_PARAMETER_SOURCES } from '@/lib/schedule/parameters';
import { planPlanting } from '@/lib/schedule/plan';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step } from './plantings';

describe('rule parameters', () => {
  it('names a source for every default (a publication, "common practice", "from memory" or Sowcast\'s own choice)', () => {
    for (const [group, values] of Object.entries(DEFAULT_SCHEDULE_PARAMETERS)) {
      const sources = SCHEDULE_PARAMETER_SOURCES[group as keyof typeof SCHEDULE_PARAMETER_SOURCES] as Record<string, string>;
      for (const key of Object.keys(values)) {
        expect(typeof sources[key], `${group}.${key}`).toBe('string');
        expect(sources[key].length, `${group}.${key}`).toBeGreaterThan(20);
      }
    }
  });

  it('lets a planting override a default', () => {
    const forecast = makeForecast({ startDate: '2027-09-06', rain: [{ date: '2027-09-13', fromHour: 6, hours: 6, totalMm: 15 }] });
    const now = localNoon('2027-09-06');
    // Planned Wed 15; rain from Mon 13 06:00. With the default 48 h lead, Sun 12 qualifies (18 h).
    expect(step(planPlanting(planting({ targetSeedDate: '2027-09-15' }), forecast, now), 'seed').date).toBe('2027-09-12');
    // With a 12 h lead, Sun 12 midday is too far ahead; nothing qualifies and the planned date stays.
    const strict = planting({ targetSeedDate: '2027-09-15', parameters: { seedBeforeRain: { leadMaxHours: 12 } } });
    expect(step(planPlanting(strict, forecast, now), 'seed').date).toBe('2027-09-15');
    expect(DEFAULT_SCHEDULE_PARAMETERS.seedBeforeRain.leadMaxHours).toBe(48);
  });
});
