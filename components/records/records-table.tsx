'use client';

import { useQuery } from '@tanstack/react-query';
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
  type ColumnFiltersState,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown, Download, FilePenLine, Plus } from 'lucide-react';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import { ButtonLink, buttonClasses } from '@/components/ui/button';
import { Field, Input, Select } from '@/components/ui/field';
import { LoadError } from '@/components/ui/load-error';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch } from '@/lib/client/api';
import { formatLocalDate, formatNumber } from '@/lib/client/format';
import type { ApplicationRecordDto } from '@/lib/data/application-records';
import { APPLICATION_KIND_LABELS, APPLICATION_KINDS } from '@/lib/validations/application-record';

const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  columnFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
});

const helper = createColumnHelper<typeof features, ApplicationRecordDto>();

const includesText = (value: unknown, needle: string) => String(value ?? '').toLowerCase().includes(needle.trim().toLowerCase());

const columns = helper.columns([
  helper.accessor('appliedAt', {
    id: 'applied',
    header: 'Applied',
    sortFn: 'basic',
    // [from, to] as local dates; either may be blank.
    filterFn: (row, _id, value: [string, string]) => {
      const day = row.original.appliedOn;
      return (!value[0] || day >= value[0]) && (!value[1] || day <= value[1]);
    },
    cell: ({ row }) => (
      <span className="tabular whitespace-nowrap">
        {formatLocalDate(row.original.appliedOn)}
        <span className="block text-xs text-loam-soft">
          {row.original.appliedTime} {row.original.timeZone}
        </span>
      </span>
    ),
  }),
  helper.accessor('plotName', {
    id: 'plot',
    header: 'Plot',
    sortFn: 'alphanumeric',
    filterFn: (row, _id, plotId: string) => row.original.plotId === plotId,
    cell: ({ row }) => (
      <span>
        {row.original.plotName}
        <span className="tabular block text-xs text-loam-soft">{formatNumber(row.original.areaAcres)} ac treated</span>
      </span>
    ),
  }),
  helper.accessor('kind', {
    id: 'kind',
    header: 'Kind',
    sortFn: 'alphanumeric',
    filterFn: (row, _id, kind: string) => row.original.kind === kind,
    cell: ({ getValue }) => APPLICATION_KIND_LABELS[getValue()],
  }),
  helper.accessor('productName', {
    id: 'product',
    header: 'Product',
    sortFn: 'alphanumeric',
    filterFn: (row, _id, text: string) => includesText(row.original.productName, text),
    cell: ({ row }) => (
      <span>
        {row.original.productName}
        {row.original.epaRegNo ? <span className="block text-xs text-loam-soft">EPA Reg. No. {row.original.epaRegNo}</span> : null}
        {row.original.restrictedUse ? <span className="block text-xs font-semibold text-ember">Restricted use</span> : null}
      </span>
    ),
  }),
  helper.accessor('totalProductValue', {
    id: 'amount',
    header: 'Rate and total',
    sortFn: 'basic',
    cell: ({ row }) => (
      <span className="tabular whitespace-nowrap">
        {formatNumber(row.original.rateValue)} {row.original.rateUnit}
        <span className="block text-xs text-loam-soft">
          {formatNumber(row.original.totalProductValue)} {row.original.totalProductUnit}
          {row.original.waterGal !== null ? ` in ${formatNumber(row.original.waterGal)} gal water` : ''}
        </span>
      </span>
    ),
  }),
  helper.accessor('applicatorName', {
    id: 'applicator',
    header: 'Applicator',
    sortFn: 'alphanumeric',
    cell: ({ row }) => (
      <span>
        {row.original.applicatorName}
        {row.original.applicatorLicense ? <span className="block text-xs text-loam-soft">Cert. {row.original.applicatorLicense}</span> : null}
      </span>
    ),
  }),
  helper.accessor('windMph', {
    id: 'weather',
    header: 'Weather',
    sortFn: 'basic',
    cell: ({ row }) => <WeatherCell record={row.original} />,
  }),
]);

function WeatherCell({ record: r }: { record: ApplicationRecordDto }) {
  const parts = [
    r.windMph !== null ? `wind ${formatNumber(r.windMph)} mph${r.windDirection ? ` ${r.windDirection}` : ''}` : r.windDirection ? `wind ${r.windDirection}` : null,
    r.airTempF !== null ? `${formatNumber(r.airTempF)} °F` : null,
    r.humidityPct !== null ? `${formatNumber(r.humidityPct)} % RH` : null,
  ].filter(Boolean);
  if (!parts.length) return <span className="text-loam-soft">Not recorded</span>;
  return (
    <span className="tabular">
      {parts.join(', ')}
      {r.weatherSource ? <span className="block text-xs text-loam-soft">{r.weatherSource === 'forecast' ? 'from the forecast' : r.weatherSource}</span> : null}
    </span>
  );
}

type Filters = { plot: string; product: string; from: string; to: string; kind: string };
const NO_FILTERS: Filters = { plot: '', product: '', from: '', to: '', kind: '' };
const emptyRecords: ApplicationRecordDto[] = [];

function toColumnFilters(f: Filters): ColumnFiltersState {
  const out: ColumnFiltersState = [];
  if (f.plot) out.push({ id: 'plot', value: f.plot });
  if (f.kind) out.push({ id: 'kind', value: f.kind });
  if (f.product.trim()) out.push({ id: 'product', value: f.product });
  if (f.from || f.to) out.push({ id: 'applied', value: [f.from, f.to] });
  return out;
}

/** The export asks the server for the same records the table shows: the same filters, as query parameters. */
function exportHref(propertyId: string, f: Filters): string {
  const params = new URLSearchParams(Object.entries(f).filter(([, v]) => v.trim() !== ''));
  const query = params.toString();
  return `/api/properties/${propertyId}/records/export${query ? `?${query}` : ''}`;
}

export function RecordsTable({ propertyId, canWrite }: { propertyId: string; canWrite: boolean }) {
  const records = useQuery({
    queryKey: ['properties', propertyId, 'records'],
    queryFn: () => apiFetch<{ records: ApplicationRecordDto[] }>(`/api/properties/${propertyId}/records`),
  });
  const [filters, setFilters] = useState<Filters>(NO_FILTERS);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'applied', desc: true }]);
  const columnFilters = useMemo(() => toColumnFilters(filters), [filters]);
  const data = records.data?.records ?? emptyRecords;
  const table = useTable({
    features,
    columns,
    data,
    getRowId: (r) => r.id,
    state: { sorting, columnFilters },
    onSortingChange: setSorting,
    // The filter controls below own the filter values; the table only applies them.
    onColumnFiltersChange: () => {},
  });
  const byId = useMemo(() => new Map(data.map((r) => [r.id, r])), [data]);
  const plots = useMemo(() => {
    const seen = new Map<string, string>();
    for (const r of data) if (r.plotId && !seen.has(r.plotId)) seen.set(r.plotId, r.plotName);
    return [...seen].sort((a, b) => a[1].localeCompare(b[1]));
  }, [data]);
  const set = (key: keyof Filters) => (e: { target: { value: string } }) => setFilters((f) => ({ ...f, [key]: e.target.value }));

  if (records.isPending) return <LoadingBlock label="Loading the application records" rows={4} />;
  if (records.isError) return <LoadError title="The records did not load" error={records.error} onRetry={() => records.refetch()} />;

  const rows = table.getRowModel().rows;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-loam-soft" aria-live="polite">
          {rows.length === data.length ? `${data.length} record${data.length === 1 ? '' : 's'}` : `${rows.length} of ${data.length} records`}
        </p>
        <div className="flex flex-wrap gap-2">
          {canWrite ? (
            <ButtonLink href={`/properties/${propertyId}/records/new`}>
              <Plus className="size-4" aria-hidden="true" />
              New record
            </ButtonLink>
          ) : null}
          <a href={exportHref(propertyId, filters)} download className={buttonClasses('secondary')}>
            <Download className="size-4" aria-hidden="true" />
            Export CSV
          </a>
        </div>
      </div>

      <fieldset className="grid gap-3 rounded-lg border border-ground-line bg-white/50 p-3 sm:grid-cols-2 lg:grid-cols-5">
        <legend className="px-1 text-sm font-semibold">Filter</legend>
        <Field label="Plot" htmlFor="filter-plot">
          <Select id="filter-plot" value={filters.plot} onChange={set('plot')}>
            <option value="">All plots</option>
            {plots.map(([id, name]) => (
              <option key={id} value={id}>
                {name}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Product" htmlFor="filter-product">
          <Input id="filter-product" value={filters.product} onChange={set('product')} placeholder="Any product" />
        </Field>
        <Field label="Kind" htmlFor="filter-kind">
          <Select id="filter-kind" value={filters.kind} onChange={set('kind')}>
            <option value="">All kinds</option>
            {APPLICATION_KINDS.map((k) => (
              <option key={k} value={k}>
                {APPLICATION_KIND_LABELS[k]}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="From" htmlFor="filter-from">
          <Input id="filter-from" type="date" value={filters.from} onChange={set('from')} />
        </Field>
        <Field label="To" htmlFor="filter-to">
          <Input id="filter-to" type="date" value={filters.to} onChange={set('to')} />
        </Field>
      </fieldset>

      {data.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ground-line px-4 py-6 text-center text-loam-soft">
          No application records yet.{canWrite ? ' Record a spray, fertilizer or lime application after the work is done.' : ''}
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ground-line bg-white">
          <table className="min-w-[56rem] w-full text-left text-sm">
            <thead className="bg-ground-raised text-loam">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const sorted = header.column.getIsSorted();
                    const Icon = sorted === 'asc' ? ArrowUp : sorted === 'desc' ? ArrowDown : ArrowUpDown;
                    return (
                      <th key={header.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined} className="px-3 py-2 font-semibold">
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex min-h-10 items-center gap-1 hover:text-rain">
                          <table.FlexRender header={header} />
                          <Icon className="size-3.5 text-loam-soft" aria-hidden="true" />
                        </button>
                      </th>
                    );
                  })}
                  <th scope="col" className="px-3 py-2 font-semibold">
                    Status
                  </th>
                </tr>
              ))}
            </thead>
            <tbody>
              {rows.map((row) => {
                const r = row.original;
                const corrected = r.supersededBy !== null;
                return (
                  <tr key={row.id} id={`record-${r.id}`} data-record-status={corrected ? 'corrected' : 'current'} className={`border-t border-ground-line align-top ${corrected ? 'bg-ground text-loam-soft' : ''}`}>
                    {row.getAllCells().map((cell) => (
                      <td key={cell.id} className={`px-3 py-2 ${corrected ? 'line-through decoration-loam-faint' : ''}`}>
                        <table.FlexRender cell={cell} />
                      </td>
                    ))}
                    <td className="px-3 py-2">
                      <StatusCell record={r} original={r.supersedesId ? byId.get(r.supersedesId) ?? null : null} canWrite={canWrite} propertyId={propertyId} />
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function StatusCell({ record: r, original, canWrite, propertyId }: { record: ApplicationRecordDto; original: ApplicationRecordDto | null; canWrite: boolean; propertyId: string }) {
  return (
    <div className="space-y-1 text-xs">
      {r.supersededBy ? (
        <p className="font-semibold text-ember">
          Corrected by{' '}
          <a href={`#record-${r.supersededBy.id}`} className="text-rain underline">
            the record of {new Date(r.supersededBy.recordedAt).toLocaleDateString('en-US', { month: 'short', day: 'numeric', year: 'numeric' })}
          </a>
        </p>
      ) : (
        <p className="font-semibold text-clover">Current</p>
      )}
      {r.supersedesId ? (
        <p>
          Corrects{' '}
          <a href={`#record-${r.supersedesId}`} className="text-rain underline">
            {original ? `the record of ${formatLocalDate(original.appliedOn)}` : 'an earlier record'}
          </a>
          {r.correctionReason ? `: ${r.correctionReason}` : ''}
        </p>
      ) : null}
      {r.notes ? <p className="text-loam-soft">{r.notes}</p> : null}
      {canWrite && !r.supersededBy ? (
        <Link href={`/properties/${propertyId}/records/new?correct=${r.id}`} className="inline-flex min-h-10 items-center gap-1 font-semibold text-rain hover:underline">
          <FilePenLine className="size-3.5" aria-hidden="true" />
          Correct
        </Link>
      ) : null}
    </div>
  );
}
