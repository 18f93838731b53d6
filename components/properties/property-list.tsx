'use client';

import { useQuery } from '@tanstack/react-query';
import { ChevronRight, Clock, Sprout } from 'lucide-react';
import Link from 'next/link';
import { ButtonLink } from '@/components/ui/button';
import { LoadError } from '@/components/ui/load-error';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, queryKeys } from '@/lib/client/api';
import { formatAcres } from '@/lib/client/format';
import type { PropertySummary } from '@/lib/data/properties';
import { RoleBadge } from './role-badge';

export function PropertyList() {
  const query = useQuery({
    queryKey: queryKeys.properties,
    queryFn: () => apiFetch<{ properties: PropertySummary[] }>('/api/properties'),
  });

  if (query.isPending) return <LoadingBlock label="Loading your properties" rows={3} />;
  if (query.isError) {
    return <LoadError title="Your properties did not load" error={query.error} onRetry={() => void query.refetch()} />;
  }

  const properties = query.data.properties;
  if (properties.length === 0) {
    return (
      <div className="rounded-card border border-dashed border-loam-faint bg-ground-raised px-6 py-10 text-center">
        <Sprout className="mx-auto size-10 text-clover" aria-hidden="true" />
        <h2 className="mt-3 text-lg font-semibold">No properties yet</h2>
        <p className="mx-auto mt-1 max-w-md text-loam-soft">
          Start with the ground you plant: its location and time zone let Sowcast read the right forecast and
          date every step in local time. Then add its plots. If someone invited you to their property, open the
          link from their invitation and it will show up here.
        </p>
        <ButtonLink href="/properties/new" className="mt-5">
          New property
        </ButtonLink>
      </div>
    );
  }

  return (
    <ul className="grid gap-4 sm:grid-cols-2">
      {properties.map((property) => (
        <li key={property.id}>
          <Link
            href={`/properties/${property.id}`}
            className="group flex h-full flex-col gap-3 rounded-card border border-ground-line bg-ground-raised p-5 shadow-sm transition hover:border-clover/60 hover:shadow"
          >
            <div className="flex items-start justify-between gap-3">
              <h2 className="text-lg font-semibold group-hover:text-clover-dark">{property.name}</h2>
              <ChevronRight className="mt-1 size-5 shrink-0 text-loam-faint group-hover:text-clover" aria-hidden="true" />
            </div>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
              <div>
                <dt className="text-loam-soft">Plots</dt>
                <dd className="tabular font-semibold">{property.plotCount}</dd>
              </div>
              <div>
                <dt className="text-loam-soft">Total area</dt>
                <dd className="tabular font-semibold">{formatAcres(property.plotAcres)}</dd>
              </div>
              <div className="col-span-2 flex items-center gap-1.5 text-loam-soft">
                <dt className="sr-only">Time zone</dt>
                <Clock className="size-4" aria-hidden="true" />
                <dd>{property.timeZone}</dd>
              </div>
            </dl>
            <div className="mt-auto">
              <span className="sr-only">Your role: </span>
              <RoleBadge role={property.role} />
            </div>
          </Link>
        </li>
      ))}
    </ul>
  );
}
