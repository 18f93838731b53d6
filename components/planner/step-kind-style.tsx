import {
  Axe,
  Eye,
  FlaskConical,
  Flame,
  Hourglass,
  Layers,
  Mountain,
  Scissors,
  Shovel,
  Snowflake,
  SprayCan,
  Sprout,
  TestTube,
  Crosshair,
  type LucideIcon,
} from 'lucide-react';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import type { StepKind } from '@/lib/schedule/types';
import { cn } from '@/components/ui/cn';

/**
 * Each step kind gets an icon and a colour from the palette, never colour alone: the icon and the title
 * carry the meaning for anyone who cannot tell the colours apart. Ember marks the steps that carry
 * cautions (spray, burn, brush), straw the waiting, clover the seed and the stand, rain the water-bound
 * work, frost the cold.
 */
export const STEP_KIND_STYLE: Record<StepKind, { icon: LucideIcon; chip: string }> = {
  'clear-brush': { icon: Axe, chip: 'bg-ember-light text-ember border-ember/40' },
  spray: { icon: SprayCan, chip: 'bg-ember-light text-ember border-ember/40' },
  'kill-wait': { icon: Hourglass, chip: 'bg-straw-light text-loam border-straw' },
  burn: { icon: Flame, chip: 'bg-ember-light text-ember border-ember/40' },
  'rake-till': { icon: Shovel, chip: 'bg-ground text-loam border-loam-faint' },
  seed: { icon: Sprout, chip: 'bg-clover-light text-clover-dark border-clover/40' },
  'cover-seed': { icon: Layers, chip: 'bg-clover-light text-clover-dark border-clover/40' },
  fertilize: { icon: FlaskConical, chip: 'bg-rain-light text-rain border-rain/40' },
  lime: { icon: Mountain, chip: 'bg-rain-light text-rain border-rain/40' },
  'check-germination': { icon: Eye, chip: 'bg-clover-light text-clover-dark border-clover/40' },
  mow: { icon: Scissors, chip: 'bg-clover-light text-clover-dark border-clover/40' },
  'spot-spray-grass': { icon: Crosshair, chip: 'bg-ember-light text-ember border-ember/40' },
  'frost-seed': { icon: Snowflake, chip: 'bg-frost-light text-loam border-frost' },
  'soil-test': { icon: TestTube, chip: 'bg-ground text-loam border-loam-faint' },
};

export function StepKindBadge({ kind, className }: { kind: StepKind; className?: string }) {
  const { icon: Icon, chip } = STEP_KIND_STYLE[kind];
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-xs font-semibold', chip, className)}>
      <Icon className="size-3.5" aria-hidden="true" />
      {STEP_KINDS[kind].title}
    </span>
  );
}

/** The key to the icons and colours, folded away until asked for. */
export function StepKindLegend({ kinds }: { kinds?: StepKind[] }) {
  const list = kinds ?? (Object.keys(STEP_KINDS) as StepKind[]);
  return (
    <details className="text-sm">
      <summary className="inline-flex min-h-10 cursor-pointer items-center font-medium text-rain">What the step icons mean</summary>
      <ul className="mt-2 flex flex-wrap gap-2">
        {list.map((kind) => (
          <li key={kind}>
            <StepKindBadge kind={kind} />
          </li>
        ))}
      </ul>
    </details>
  );
}
