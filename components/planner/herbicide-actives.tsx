import type { UseFormRegisterReturn } from 'react-hook-form';
import { FieldError } from '@/components/ui/field';
import { blendCropGroups, CROP_GROUP_WORDS, getHerbicideActive, HERBICIDE_ACTIVES, LABEL_IS_THE_LAW } from '@/lib/agronomy/herbicides';
import { SPECIES } from '@/lib/agronomy/species';

const known = new Set(SPECIES.map((s) => s.id));

/**
 * The product's active ingredients, picked from the catalog, with what each one means for this blend: the
 * typical plant-back before each of its crop groups, the kill wait and rainfast — and that the label governs.
 */
export function HerbicideActives({
  registration,
  selected,
  blendSpeciesIds,
  error,
}: {
  registration: UseFormRegisterReturn;
  selected: string[];
  blendSpeciesIds: string[];
  error?: string;
}) {
  const groups = blendCropGroups(blendSpeciesIds.filter((id) => known.has(id)).map((speciesId) => ({ speciesId, share: 1 })));
  const chosen = selected.filter((id) => HERBICIDE_ACTIVES.some((a) => a.id === id)).map(getHerbicideActive);
  return (
    <fieldset className="space-y-2 sm:col-span-2" aria-describedby="herbicide-actives-note">
      <legend className="text-sm font-semibold text-loam">
        Active ingredients <span className="ml-1.5 font-normal text-loam-soft">(optional — from the label)</span>
      </legend>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-5">
        {HERBICIDE_ACTIVES.map((a) => (
          <label key={a.id} className="flex min-h-11 cursor-pointer items-center gap-2 rounded-lg border border-ground-line bg-white px-3 py-2 text-sm">
            <input type="checkbox" value={a.id} className="size-5 accent-clover" {...registration} />
            {a.name}
          </label>
        ))}
      </div>
      <FieldError message={error} />
      <p id="herbicide-actives-note" className="text-xs text-loam-soft">
        The actives set the plant-back before seeding, the kill wait and the rainfast period; values you enter from the label win. Shown are{' '}
        {LABEL_IS_THE_LAW}.
      </p>
      {chosen.length ? (
        <ul aria-label="What the actives mean for this blend" className="space-y-1 rounded-lg border border-ground-line border-l-4 border-l-ember bg-ground-raised px-4 py-2 text-sm">
          {chosen.map((a) => {
            const backs = groups.map((g) => ({ g, days: a.plantBack[g].days })).filter((b) => b.days > 0);
            return (
              <li key={a.id}>
                <span className="font-semibold">{a.name}</span> — kills {a.controls.join(', ')}
                {a.soilActive ? '; active in the soil' : '; no soil activity'}; rainfast about {a.rainfastHours} h; kill wait about {a.killWaitDays} days;{' '}
                {backs.length
                  ? `plant-back before ${backs.map((b) => `${CROP_GROUP_WORDS[b.g]}: ${b.days} days`).join(', ')}`
                  : groups.length
                    ? 'no plant-back before this blend'
                    : 'pick the blend to see its plant-back'}
                .
              </li>
            );
          })}
        </ul>
      ) : null}
    </fieldset>
  );
}
