'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { ReactNode } from 'react';
import { cn } from '@/components/ui/cn';

export function NavLink({ href, children }: { href: string; children: ReactNode }) {
  const pathname = usePathname();
  const current = pathname === href || pathname.startsWith(`${href}/`) || (href === '/properties' && pathname.startsWith('/plots/'));
  return (
    <Link
      href={href}
      aria-current={current ? 'page' : undefined}
      className={cn(
        'inline-flex min-h-11 items-center rounded-lg px-2.5 text-base font-medium sm:px-3',
        current ? 'bg-clover-light text-clover-dark' : 'text-loam-soft hover:bg-ground-line/60 hover:text-loam',
      )}
    >
      {children}
    </Link>
  );
}
