import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';

export function Card({ className, ...rest }: ComponentProps<'section'>) {
  return <section className={cn('rounded-card border border-ground-line bg-ground-raised p-5 shadow-sm sm:p-6', className)} {...rest} />;
}

export function CardHeader({ title, description, action, id }: { title: ReactNode; description?: ReactNode; action?: ReactNode; id?: string }) {
  return (
    <div className="mb-4 flex flex-wrap items-start justify-between gap-3">
      <div className="min-w-0">
        <h2 id={id} className="text-lg font-semibold text-loam">
          {title}
        </h2>
        {description ? <p className="mt-0.5 text-sm text-loam-soft">{description}</p> : null}
      </div>
      {action ? <div className="flex flex-wrap gap-2">{action}</div> : null}
    </div>
  );
}
