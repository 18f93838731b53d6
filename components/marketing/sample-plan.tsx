import { Axe, CloudRain, Eye, Hourglass, SprayCan, Sprout, type LucideIcon } from 'lucide-react';
import { cn } from '@/components/ui/cn';

type Row = { icon: LucideIcon; tone: string; date: string; title: string; why: string };

// An invented plot and invented dates: it shows what a plan reads like, not a real forecast.
const ROWS: Row[] = [
  { icon: Axe, tone: 'bg-loam/10 text-loam', date: 'Aug 9', title: 'Clear brush', why: 'Before the spray, so it reaches the leaves' },
  { icon: SprayCan, tone: 'bg-ember-light text-ember', date: 'Aug 14', title: 'Burndown spray', why: 'Light wind and dry for a day after' },
  { icon: Hourglass, tone: 'bg-straw-light text-[#8a6a1f]', date: 'Aug 14–28', title: 'Kill wait', why: 'Two weeks for the old growth to die back' },
  { icon: Sprout, tone: 'bg-clover-light text-clover-dark', date: 'Aug 30', title: 'Seed the blend', why: 'Soil warm; a soaking rain is due the next day' },
  { icon: CloudRain, tone: 'bg-rain-light text-rain', date: 'Aug 31', title: 'Rain expected', why: 'About an inch, enough to settle the seed' },
  { icon: Eye, tone: 'bg-frost-light text-[#4f6b80]', date: 'Sep 13', title: 'Check germination', why: 'Walk the plot and record the stand' },
];

export function SamplePlan({ className }: { className?: string }) {
  return (
    <figure className={cn('rounded-card border border-ground-line bg-ground-raised p-5 shadow-md', className)}>
      <figcaption className="mb-4 flex items-baseline justify-between gap-3">
        <span className="font-semibold">Creek bottom · 1.2 ac</span>
        <span className="text-xs uppercase tracking-wide text-loam-soft">Example plan</span>
      </figcaption>
      <ol className="space-y-3">
        {ROWS.map((row) => (
          <li key={row.title} className="flex items-start gap-3">
            <span className={cn('grid size-10 shrink-0 place-items-center rounded-lg', row.tone)}>
              <row.icon className="size-5" aria-hidden="true" />
            </span>
            <div className="min-w-0 flex-1">
              <p className="flex flex-wrap items-baseline justify-between gap-x-3">
                <span className="font-semibold">{row.title}</span>
                <span className="tabular text-sm text-loam-soft">{row.date}</span>
              </p>
              <p className="text-sm text-loam-soft">{row.why}</p>
            </div>
          </li>
        ))}
      </ol>
    </figure>
  );
}
