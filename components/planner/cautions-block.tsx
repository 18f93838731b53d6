import { TriangleAlert } from 'lucide-react';
import type { Caution } from '@/lib/schedule/types';

const TOPIC_TITLES: Record<Caution['topic'], string> = {
  herbicide: 'Herbicide',
  fire: 'Fire',
  chainsaw: 'Saw and brush cutter',
  fertilizer: 'Fertilizer',
};

/** The engine's cautions in its own words: calm, in the flow of the plan, an ember edge — never a pop-up. */
export function CautionsBlock({ cautions }: { cautions: Caution[] }) {
  if (!cautions.length) return null;
  const topics = [...new Set(cautions.map((c) => c.topic))];
  return (
    <section aria-label="Cautions" className="rounded-lg border border-ground-line border-l-4 border-l-ember bg-ground-raised px-4 py-3 text-sm text-loam">
      <p className="flex items-center gap-2 font-semibold">
        <TriangleAlert className="size-4 shrink-0 text-ember" aria-hidden="true" />
        Cautions — {topics.map((t) => TOPIC_TITLES[t]).join(', ').toLowerCase()}
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {cautions.map((caution, i) => (
          <li key={i}>{caution.text}</li>
        ))}
      </ul>
    </section>
  );
}
