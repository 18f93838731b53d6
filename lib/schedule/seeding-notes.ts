// What the seed step warns about beyond its date: a seeding rate to double-check, and large seed left
// uncovered. Plain sentences for the step's warnings (advice to carry out goes with the step's quantities).
import { uncoveredLargeSeedWarning } from '@/lib/agronomy/seed-cover';
import { seedingRate } from '@/lib/agronomy/seeding-rate';
import { coversSeed } from './methods';
import type { PlantingInput } from './types';

export function seedStepNotes(input: PlantingInput, key: string): string[] {
  if (key !== 'seed' && key !== 'frost-seed') return [];
  const method = key === 'frost-seed' ? 'frost-seeding' : input.method;
  const notes = [...seedingRate(input.blend, method, input.seedBag).notes];
  if (key === 'frost-seed') return notes;
  const uncovered = uncoveredLargeSeedWarning(input.blend, coversSeed(input));
  if (uncovered) notes.push(uncovered);
  return notes;
}
