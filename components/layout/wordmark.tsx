import Link from 'next/link';
import { cn } from '@/components/ui/cn';

/** Sowcast's mark: a sprout rising out of a raindrop — seed timed to the rain. */
export function SowcastMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={cn('size-8', className)} aria-hidden="true" focusable="false">
      <path d="M16 16c3.2 4 5.6 6.8 5.6 9.2a5.6 5.6 0 0 1-11.2 0c0-2.4 2.4-5.2 5.6-9.2Z" fill="#2d6a98" />
      <path d="M13.4 25.1a2.7 2.7 0 0 0 2.2 2.5" fill="none" stroke="#e1ecf5" strokeWidth="1.4" strokeLinecap="round" />
      <path d="M16 18.5V8.5" stroke="#3d7a3a" strokeWidth="2" strokeLinecap="round" />
      <path d="M16 12.2c-4.6.3-8-2-8.6-6.6 4.5-.4 7.9 2 8.6 6.6Z" fill="#3d7a3a" />
      <path d="M16 9.6c.4-4.3 3.5-6.9 8.4-6.8-.3 4.5-3.6 7-8.4 6.8Z" fill="#5a9a4f" />
    </svg>
  );
}

export function Wordmark({ href = '/', className }: { href?: string; className?: string }) {
  return (
    <Link href={href} className={cn('inline-flex min-h-11 items-center gap-2 rounded-lg', className)}>
      <SowcastMark />
      <span className="text-xl font-bold tracking-tight text-loam">Sowcast</span>
    </Link>
  );
}
