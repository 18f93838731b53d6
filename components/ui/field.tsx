import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';

const control =
  'block w-full min-h-11 rounded-lg border border-loam-faint/70 bg-white px-3 py-2 text-base text-loam shadow-inner shadow-ground/60 ' +
  'placeholder:text-loam-faint focus:border-rain focus:outline-none focus:ring-2 focus:ring-rain/30 ' +
  'aria-[invalid=true]:border-ember aria-[invalid=true]:ring-ember/20 disabled:bg-ground disabled:text-loam-soft';

/** The ids and ARIA links a control needs so its hint and error are read with it. */
export function controlAria(id: string, error?: string, hint?: ReactNode) {
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ');
  return {
    id,
    'aria-invalid': error ? (true as const) : undefined,
    'aria-describedby': describedBy || undefined,
  };
}

export function Field({
  label,
  htmlFor,
  error,
  hint,
  optional,
  className,
  children,
}: {
  label: ReactNode;
  htmlFor: string;
  error?: string;
  hint?: ReactNode;
  optional?: boolean;
  className?: string;
  children: ReactNode;
}) {
  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <label htmlFor={htmlFor} className="text-sm font-semibold text-loam">
        {label}
        {optional ? <span className="ml-1.5 font-normal text-loam-soft">(optional)</span> : null}
      </label>
      {children}
      <FieldError id={`${htmlFor}-error`} message={error} />
      {hint ? (
        <p id={`${htmlFor}-hint`} className="text-xs text-loam-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

export function FieldError({ id, message }: { id?: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="text-sm font-medium text-ember">
      {message}
    </p>
  );
}

export function Input({ className, ...rest }: ComponentProps<'input'>) {
  return <input className={cn(control, className)} {...rest} />;
}

export function Select({ className, ...rest }: ComponentProps<'select'>) {
  return <select className={cn(control, 'pr-8', className)} {...rest} />;
}

export function Textarea({ className, ...rest }: ComponentProps<'textarea'>) {
  return <textarea className={cn(control, 'min-h-24', className)} {...rest} />;
}
