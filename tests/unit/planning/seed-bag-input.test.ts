// The seed bag's label rate from the planting form to the engine: the shared zod schema names the field that is
// wrong, the engine's own check refuses a label that covers nothing, and the form's value reaches PlantingInput.
import { describe, expect, it } from 'vitest';
import { buildPlantingInput } from '@/lib/planning/input';
import { plantingInputIssues } from '@/lib/schedule/validate';
import { fieldErrors } from '@/lib/validations/common';
import { plantingSchema } from '@/lib/validations/planting';

const FORM = {
  season: 'fall',
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-09-14',
};
const PROPERTY = {
  time_zone: 'America/Chicago',
  latitude: 36.41,
  longitude: -90.12,
  elevation_m: 105,
  avg_last_spring_frost: '04-05',
  avg_first_fall_frost: '10-28',
};

describe('seed bag label rate', () => {
  it('passes a label of 8.5 lb per acre through to the engine', () => {
    const form = plantingSchema.parse({ ...FORM, seedBagLb: 8.5, seedBag: { lb: 8.5, acres: 1 } });
    const input = buildPlantingInput(PROPERTY, { acres: 0.5, cover: 'grass-weeds' }, form);
    expect(input.seedBag).toEqual({ lb: 8.5, acres: 1 });
    expect(plantingInputIssues(input)).toEqual([]);
    // Without one, the input carries none (the engine keeps to the published broadcast range).
    expect(buildPlantingInput(PROPERTY, { acres: 0.5, cover: 'grass-weeds' }, plantingSchema.parse(FORM)).seedBag).toBeUndefined();
  });

  it('names the half of the pair that is missing or out of range', () => {
    const missing = plantingSchema.safeParse({ ...FORM, seedBag: { lb: 8.5 } });
    expect(missing.success).toBe(false);
    expect(fieldErrors(missing.error!)['seedBag.acres']).toBe("Acres the bag's label covers must be a number");
    const zero = plantingSchema.safeParse({ ...FORM, seedBag: { lb: 0, acres: 1 } });
    expect(fieldErrors(zero.error!)['seedBag.lb']).toBe("Seed on the bag's label must be at least 0.1 lb");
  });

  it('the engine refuses a label that covers no acres, by name', () => {
    const input = buildPlantingInput(PROPERTY, { acres: 0.5, cover: 'grass-weeds' }, plantingSchema.parse(FORM));
    expect(plantingInputIssues({ ...input, seedBag: { lb: 8.5, acres: 0 } })).toEqual([
      "Acres the bag's label covers must be a number greater than 0 (got 0).",
    ]);
  });
});
