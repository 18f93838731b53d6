import { CircleCheck, Info, TriangleAlert, OctagonAlert } from 'lucide-react';
import type { ReactNode } from 'react';
import { cn } from './cn';

type Tone = 'info' | 'success' | 'error' | 'caution';

const tones: Record<Tone, { box: string; icon: typeof Info }> = {
  info: { box: 'border-rain/40 bg-rain-light text-loam', icon: Info },
  success: { box: 'border-clover/40 bg-clover-light text-loam', icon: CircleCheck },
  error: { box: 'border-ember/50 bg-ember-light text-loam', icon: OctagonAlert },
  // Cautions are calm and in the flow of the page: an ember edge and plain words, never a pop-up.
  caution: { box: 'border-l-4 border-ember bg-ground-raised text-loam', icon: TriangleAlert },
};

export function Notice({ tone = 'info', title, children, className }: { tone?: Tone; title?: ReactNode; children?: ReactNode; className?: string }) {
  const { box, icon: Icon } = tones[tone];
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={cn('flex gap-3 rounded-lg border px-4 py-3 text-sm', box, className)}
    >
      <Icon className={cn('mt-0.5 size-5 shrink-0', tone === 'info' ? 'text-rain' : tone === 'success' ? 'text-clover' : 'text-ember')} aria-hidden="true" />
      <div className="min-w-0 space-y-1">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className="text-loam">{children}</div> : null}
      </div>
    </div>
  );
}
