'use client';

import {
  Axe, Droplets, Hourglass, Flame, Shovel, Sprout, Layers, FlaskConical, Mountain, Search, Scissors, SprayCan,
  Snowflake, TestTube, ListChecks, X, type LucideIcon,
} from 'lucide-react';
import { useId, useState } from 'react';
import { cn } from '@/components/ui/cn';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import type { StepKind } from '@/lib/schedule/types';

/**
 * Sowcast's look for each kind of step: an icon and a colour, always together, so the kind is readable
 * without colour (WCAG 2.2, 1.4.1 Use of Color). Colours follow the palette's meanings: ember for the
 * cautious work (spray, burn, brush), straw for waiting, clover for seed and stand, rain for water-borne
 * inputs, frost for cold-season work, loam for ground work.
 */
interface KindLook {
  icon: LucideIcon;
  /** Tinted chip: a light fill, a strong edge and the colour of the icon. */
  chip: string;
  /** Strong colour alone, for the icon on a neutral ground. */
  text: string;
}

export const STEP_KIND_LOOK: Record<StepKind, KindLook> = {
  'clear-brush': { icon: Axe, chip: 'border-ember bg-ember-light', text: 'text-ember' },
  spray: { icon: SprayCan, chip: 'border-ember bg-ember-light', text: 'text-ember' },
  'kill-wait': { icon: Hourglass, chip: 'border-straw bg-straw-light', text: 'text-[#8a6a1e]' },
  burn: { icon: Flame, chip: 'border-ember bg-ember-light', text: 'text-ember' },
  'rake-till': { icon: Shovel, chip: 'border-loam-soft bg-ground-line/60', text: 'text-loam-soft' },
  seed: { icon: Sprout, chip: 'border-clover bg-clover-light', text: 'text-clover-dark' },
  'cover-seed': { icon: Layers, chip: 'border-clover bg-clover-light', text: 'text-clover-dark' },
  fertilize: { icon: FlaskConical, chip: 'border-rain bg-rain-light', text: 'text-rain' },
  lime: { icon: Mountain, chip: 'border-loam-soft bg-ground-line/60', text: 'text-loam-soft' },
  'check-germination': { icon: Search, chip: 'border-clover bg-clover-light', text: 'text-clover-dark' },
  mow: { icon: Scissors, chip: 'border-clover bg-clover-light', text: 'text-clover-dark' },
  'spot-spray-grass': { icon: Droplets, chip: 'border-ember bg-ember-light', text: 'text-ember' },
  'frost-seed': { icon: Snowflake, chip: 'border-frost bg-frost-light', text: 'text-[#4f6b80]' },
  'soil-test': { icon: TestTube, chip: 'border-rain bg-rain-light', text: 'text-rain' },
};

export const STEP_KIND_ORDER = Object.keys(STEP_KINDS) as StepKind[];

/** A short label for a kind, without the parenthesised extras of the full title. */
export function stepKindLabel(kind: StepKind): string {
  return STEP_KINDS[kind].title.replace(/\s*\(.*\)$/, '');
}

export function StepKindIcon({ kind, className }: { kind: StepKind; className?: string }) {
  const { icon: Icon, text } = STEP_KIND_LOOK[kind];
  return <Icon className={cn('size-4 shrink-0', text, className)} aria-hidden="true" />;
}

/** Icon and name of a kind on its tinted chip. */
export function StepKindBadge({ kind, className }: { kind: StepKind; className?: string }) {
  const look = STEP_KIND_LOOK[kind];
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-md border-l-4 px-2 py-0.5 text-xs font-semibold text-loam', look.chip, className)}>
      <StepKindIcon kind={kind} />
      {stepKindLabel(kind)}
    </span>
  );
}

/** The key to every kind's icon and colour, behind one button so it is always a tap away. */
export function StepKindLegend({ className }: { className?: string }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  return (
    <div className={className}>
      <button
        type="button"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
        className="inline-flex min-h-11 items-center gap-2 rounded-lg border border-ground-line bg-ground-raised px-3 text-sm font-semibold text-loam hover:bg-white"
      >
        {open ? <X className="size-4" aria-hidden="true" /> : <ListChecks className="size-4" aria-hidden="true" />}
        Legend
      </button>
      {open ? (
        <div id={id} className="mt-2 rounded-lg border border-ground-line bg-ground-raised p-3">
          <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2 lg:grid-cols-3" aria-label="Step kinds">
            {STEP_KIND_ORDER.map((kind) => (
              <li key={kind}>
                <StepKindBadge kind={kind} />
              </li>
            ))}
          </ul>
          <p className="mt-3 text-xs text-loam-soft">
            A struck-through step with a tick is done; a pin means someone fixed its date, so the plan will not move it; a repeat
            sign marks recurring upkeep.
          </p>
        </div>
      ) : null}
    </div>
  );
}
