import { CircleCheck, TriangleAlert, X } from 'lucide-react';
import { cn } from '@/components/ui/cn';
import type { StandVerdict } from '@/lib/agronomy/stand';

// Words, an icon and a colour for each verdict — never the colour alone.
const VERDICT: Record<StandVerdict, { label: string; icon: typeof CircleCheck; box: string }> = {
  good: { label: 'Good stand', icon: CircleCheck, box: 'border-clover bg-clover-light text-clover-dark' },
  fair: { label: 'Fair stand', icon: TriangleAlert, box: 'border-straw bg-straw-light text-loam' },
  poor: { label: 'Poor stand', icon: X, box: 'border-ember bg-ember-light text-ember' },
};

export function VerdictBadge({ verdict }: { verdict: StandVerdict }) {
  const v = VERDICT[verdict];
  const Icon = v.icon;
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-full border px-3 py-1 text-sm font-semibold', v.box)} data-verdict={verdict}>
      <Icon className="size-4" aria-hidden="true" />
      {v.label}
    </span>
  );
}
