// The cautions shown with an application record: the herbicide ones the planner shows with a spray step,
// and what a restricted-use product and the state add. Sowcast keeps the record; the label and the state
// decide what is allowed.
import { FERTILIZER_CAUTIONS, HERBICIDE_CAUTIONS } from '@/lib/schedule/cautions';
import type { Caution } from '@/lib/schedule/types';
import type { ApplicationKind } from '@/lib/validations/application-record';

export const RESTRICTED_USE_CAUTIONS: readonly Caution[] = [
  {
    topic: 'herbicide',
    text:
      'A restricted-use product may only be applied by a certified applicator or someone under their direct supervision; ' +
      'the record must carry the certified applicator’s name and certification number.',
  },
  {
    topic: 'herbicide',
    text: 'Your state may ask for more than this record holds, or for it sooner; its pesticide rules come first.',
  },
];

export function recordCautions(kind: ApplicationKind): Caution[] {
  return kind === 'herbicide' ? [...HERBICIDE_CAUTIONS, ...RESTRICTED_USE_CAUTIONS] : [...FERTILIZER_CAUTIONS];
}
