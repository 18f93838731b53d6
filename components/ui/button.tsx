import Link from 'next/link';
import type { ComponentProps } from 'react';
import { cn } from './cn';

type Variant = 'primary' | 'secondary' | 'danger' | 'danger-outline' | 'quiet' | 'danger-quiet';
type Size = 'md' | 'sm';

const base =
  'inline-flex items-center justify-center gap-2 whitespace-nowrap rounded-lg font-semibold transition-colors select-none ' +
  'disabled:cursor-not-allowed disabled:opacity-55 aria-disabled:pointer-events-none aria-disabled:opacity-55';

const variants: Record<Variant, string> = {
  primary: 'bg-clover text-white shadow-sm hover:bg-clover-dark',
  secondary: 'border border-ground-line bg-ground-raised text-loam hover:border-loam-faint hover:bg-white',
  danger: 'bg-ember text-white shadow-sm hover:bg-[#9c4222]',
  'danger-outline': 'border border-ember/50 bg-ground-raised text-ember hover:bg-ember-light',
  quiet: 'text-loam-soft hover:bg-ground-line/60 hover:text-loam',
  'danger-quiet': 'text-ember hover:bg-ember-light',
};

// Phones need targets of at least 44 px (WCAG 2.2 target size, enhanced level); "sm" stays at 40 px.
const sizes: Record<Size, string> = {
  md: 'min-h-11 px-4 text-base',
  sm: 'min-h-10 px-3 text-sm',
};

export function buttonClasses(variant: Variant = 'primary', size: Size = 'md', className?: string) {
  return cn(base, variants[variant], sizes[size], className);
}

type ButtonProps = ComponentProps<'button'> & { variant?: Variant; size?: Size; pending?: boolean };

export function Button({ variant, size, pending, disabled, className, children, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...rest}
    >
      {pending ? <Spinner /> : null}
      {children}
    </button>
  );
}

type ButtonLinkProps = ComponentProps<typeof Link> & { variant?: Variant; size?: Size };

export function ButtonLink({ variant, size, className, ...rest }: ButtonLinkProps) {
  return <Link className={buttonClasses(variant, size, className)} {...rest} />;
}

export function Spinner({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={cn('size-4 animate-spin', className)} aria-hidden="true">
      <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeOpacity="0.3" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
}
