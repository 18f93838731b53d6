// What the seed step says beyond its date: how sure its rate is, large seed left uncovered, and the
// cultipacking that small seed on a prepared seedbed wants. Plain sentences for the step's warnings.
import { cultipackAdvice, uncoveredLargeSeedWarning } from '@/lib/agronomy/seed-cover';
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
  const cultipack = input.method === 'prepared-seedbed' ? cultipackAdvice(input.blend) : null;
  if (cultipack) notes.push(cultipack);
  return notes;
}
