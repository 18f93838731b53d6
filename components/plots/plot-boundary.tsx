'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Ruler, Trash2, Upload, X } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { FOOT_M } from '@/lib/agronomy/units';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { formatAcres, formatLocalDate } from '@/lib/client/format';
import type { PlotBoundaryDto } from '@/lib/data/plot-boundaries';
import { UploadProgress, uploadForm } from './upload-request';

const boundaryKey = (plotId: string) => ['plots', plotId, 'boundary'] as const;
// The plot's size is kept to hundredths of an acre, as the plot form takes it.
const toHundredths = (acres: number) => Math.round(acres * 100) / 100;

/** The plot's outline from a walked GPX track, a KML polygon or GeoJSON, its geodesic area, and the drawing. */
export function PlotBoundary({ plotId, canManage }: { plotId: string; canManage: boolean }) {
  const queryClient = useQueryClient();
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [chosen, setChosen] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [cancel, setCancel] = useState<(() => void) | null>(null);
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const boundary = useQuery({
    queryKey: boundaryKey(plotId),
    queryFn: () => apiFetch<{ boundary: PlotBoundaryDto | null }>(`/api/plots/${plotId}/boundary`),
  });
  const refresh = () => queryClient.invalidateQueries({ queryKey: boundaryKey(plotId) });

  async function upload() {
    if (!chosen) return;
    setMessage(null);
    const form = new FormData();
    form.append('file', chosen);
    const request = uploadForm<{ boundary: PlotBoundaryDto }>(`/api/plots/${plotId}/boundary`, form, setProgress);
    setProgress(0);
    setCancel(() => request.cancel);
    try {
      const { boundary: saved } = await request.done;
      queryClient.setQueryData(boundaryKey(plotId), { boundary: saved });
      setMessage({ tone: 'success', text: `Read the outline from “${chosen.name}”: ${formatAcres(saved.acres)}.` });
      setChosen(null);
      if (input.current) input.current.value = '';
    } catch (error) {
      setMessage({ tone: 'error', text: errorMessage(error) });
    } finally {
      setProgress(null);
      setCancel(null);
    }
  }

  const adoptAcres = useMutation({
    mutationFn: (acres: number) => apiFetch(`/api/plots/${plotId}`, { method: 'PATCH', body: { acres } }),
    onSuccess: async (_data, acres) => {
      setMessage({ tone: 'success', text: `The plot’s size is now ${formatAcres(acres)}; new plans use it.` });
      await refresh();
      router.refresh();
    },
    onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
  });
  const clear = useMutation({
    mutationFn: () => apiFetch<void>(`/api/plots/${plotId}/boundary`, { method: 'DELETE' }),
    onSuccess: async () => {
      setMessage({ tone: 'success', text: 'Removed the outline. The plot keeps its size.' });
      await refresh();
    },
    onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
  });

  const data = boundary.data?.boundary ?? null;
  const offered = data ? toHundredths(data.acres) : null;
  const uploading = progress !== null;

  return (
    <Card aria-labelledby="plot-boundary-heading">
      <CardHeader
        id="plot-boundary-heading"
        title="Boundary"
        description="Walk the plot’s edge with a GPS or phone and upload the track (GPX), or a KML or GeoJSON outline."
      />
      {boundary.isPending ? <LoadingBlock label="Loading the outline" rows={2} /> : null}
      {boundary.isError ? <Notice tone="error">The outline did not load: {errorMessage(boundary.error)}</Notice> : null}
      {data ? (
        <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_16rem]">
          <BoundaryDrawing feature={data.feature} label={`Outline of the plot, ${formatAcres(data.acres)}`} />
          <div className="space-y-3 text-sm">
            <div>
              <p className="font-semibold text-loam-soft">Area inside the outline</p>
              <p className="tabular text-2xl font-semibold text-loam" data-testid="boundary-acres">
                {formatAcres(data.acres)}
              </p>
              <p className="text-xs text-loam-soft">Measured on the WGS84 ellipsoid; holes left out.</p>
            </div>
            <p className="text-loam-soft">
              Planned with <span className="tabular font-semibold text-loam">{formatAcres(data.plotAcres)}</span>.
            </p>
            {data.upload ? (
              <p className="break-all text-xs text-loam-soft">
                From {data.upload.filename}, {formatLocalDate(data.upload.uploadedAt.slice(0, 10))}
              </p>
            ) : null}
            {canManage && offered !== null && offered > 0 && Math.abs(offered - data.plotAcres) >= 0.005 ? (
              <Button size="sm" pending={adoptAcres.isPending} onClick={() => adoptAcres.mutate(offered)}>
                <Ruler className="size-4" aria-hidden="true" />
                Use {formatAcres(offered)} as the plot’s size
              </Button>
            ) : null}
            {canManage ? (
              <Button variant="danger-quiet" size="sm" pending={clear.isPending} onClick={() => clear.mutate()}>
                <Trash2 className="size-4" aria-hidden="true" />
                Remove the outline
              </Button>
            ) : null}
          </div>
        </div>
      ) : boundary.isSuccess ? (
        <p className="text-sm text-loam-soft">No outline yet.</p>
      ) : null}

      {canManage ? (
        <div className="mt-4 space-y-3 border-t border-ground-line pt-4">
          <div className="flex flex-wrap items-end gap-3">
            <div className="flex min-w-56 flex-1 flex-col gap-1.5">
              <label htmlFor="boundary-file" className="text-sm font-semibold">
                {data ? 'Replace with another file' : 'Outline file'}
              </label>
              <input
                ref={input}
                id="boundary-file"
                type="file"
                accept=".gpx,.kml,.geojson,.json"
                disabled={uploading}
                className="block w-full min-h-11 text-sm file:mr-3 file:min-h-11 file:rounded-lg file:border file:border-ground-line file:bg-white file:px-3 file:font-semibold file:text-loam"
                onChange={(e) => {
                  setChosen(e.target.files?.[0] ?? null);
                  setMessage(null);
                }}
              />
              <p className="text-xs text-loam-soft">GPX, KML or GeoJSON, up to 2 MB.</p>
            </div>
            {uploading ? (
              <>
                <UploadProgress fraction={progress} label="Uploading the outline" />
                <Button variant="secondary" size="sm" onClick={() => cancel?.()}>
                  <X className="size-4" aria-hidden="true" />
                  Cancel
                </Button>
              </>
            ) : (
              <Button size="sm" disabled={!chosen} onClick={upload}>
                <Upload className="size-4" aria-hidden="true" />
                Upload outline
              </Button>
            )}
          </div>
        </div>
      ) : null}
      {message ? <Notice tone={message.tone} className="mt-3">{message.text}</Notice> : null}
    </Card>
  );
}

const WIDTH = 480;
const HEIGHT = 300;
const PAD = 24;
// IUGG mean Earth radius; only for drawing, where a 0.3% scale difference cannot be seen.
const EARTH_RADIUS_M = 6_371_008.8;
const NICE_FEET = [10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 2500, 5000, 10000];

/**
 * The outline drawn from its coordinates: lon/lat projected to metres on a local equirectangular frame
 * around the outline's middle (plots are small, so the frame's distortion is invisible), north up, holes
 * cut out with the even–odd rule, and a scale bar in feet. No tiles, no network.
 */
export function BoundaryDrawing({ feature, label }: { feature: PlotBoundaryDto['feature']; label: string }) {
  const polygons = feature.geometry.type === 'Polygon' ? [feature.geometry.coordinates] : feature.geometry.coordinates;
  const points = polygons.flat(2);
  const lons = points.map((p) => p[0]);
  const lats = points.map((p) => p[1]);
  const lon0 = (Math.min(...lons) + Math.max(...lons)) / 2;
  const lat0 = (Math.min(...lats) + Math.max(...lats)) / 2;
  const kx = (Math.PI / 180) * EARTH_RADIUS_M * Math.cos((lat0 * Math.PI) / 180);
  const ky = (Math.PI / 180) * EARTH_RADIUS_M;
  const xs = lons.map((lon) => (lon - lon0) * kx);
  const ys = lats.map((lat) => (lat - lat0) * ky);
  const spanX = Math.max(...xs) - Math.min(...xs) || 1;
  const spanY = Math.max(...ys) - Math.min(...ys) || 1;
  const metresPerPx = Math.max(spanX / (WIDTH - 2 * PAD), spanY / (HEIGHT - 2 * PAD - 24));
  const toX = (lon: number) => WIDTH / 2 + ((lon - lon0) * kx) / metresPerPx;
  const toY = (lat: number) => (HEIGHT - 24) / 2 - ((lat - lat0) * ky) / metresPerPx;
  const d = polygons
    .flatMap((rings) => rings.map((ring) => `M${ring.slice(0, -1).map((p) => `${toX(p[0]).toFixed(1)},${toY(p[1]).toFixed(1)}`).join('L')}Z`))
    .join('');
  // Rings are stored closed; the path's Z closes them, so the repeated last point is left out above.
  const feetPerPx = metresPerPx / FOOT_M;
  const barFeet = [...NICE_FEET].reverse().find((ft) => ft / feetPerPx <= WIDTH / 4) ?? NICE_FEET[0];
  const barPx = barFeet / feetPerPx;

  return (
    <figure className="min-w-0">
      <svg viewBox={`0 0 ${WIDTH} ${HEIGHT}`} role="img" aria-label={label} className="h-auto w-full rounded-lg border border-ground-line bg-white">
        <path d={d} fillRule="evenodd" className="fill-clover-light stroke-clover" strokeWidth={2.5} strokeLinejoin="round" data-testid="boundary-outline" />
        <g transform={`translate(${PAD},${HEIGHT - 16})`} className="text-loam">
          <line x1={0} x2={barPx} y1={0} y2={0} stroke="currentColor" strokeWidth={3} />
          <line x1={0} x2={0} y1={-5} y2={5} stroke="currentColor" strokeWidth={2} />
          <line x1={barPx} x2={barPx} y1={-5} y2={5} stroke="currentColor" strokeWidth={2} />
          {/* Sized for a phone, where the drawing is shown at about two thirds of its own width. */}
          <text x={barPx + 8} y={6} fontSize={18} fill="currentColor">
            {barFeet.toLocaleString('en-US')} ft
          </text>
        </g>
        <g transform={`translate(${WIDTH - PAD},${PAD + 4})`} className="text-loam-soft">
          <path d="M0,-12 L5,2 L0,-2 L-5,2 Z" fill="currentColor" />
          <text x={0} y={20} fontSize={17} fontWeight={600} textAnchor="middle" fill="currentColor">
            N
          </text>
        </g>
      </svg>
      <figcaption className="mt-1 text-sm text-loam-soft">
        North is up; the bar is {barFeet.toLocaleString('en-US')} ft.
      </figcaption>
    </figure>
  );
}
