'use client';

import { useQuery, useQueryClient } from '@tanstack/react-query';
import { FileText, Upload, X } from 'lucide-react';
import { useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Input, Select } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, ApiError, errorMessage } from '@/lib/client/api';
import { formatLocalDate, formatNumber } from '@/lib/client/format';
import { limeForSoilTest } from '@/lib/agronomy/lime';
import type { BlendPart } from '@/lib/agronomy/species';
import type { SoilTestDto } from '@/lib/data/soil-tests';
import { UploadProgress, uploadForm } from './upload-request';

export const soilTestsKey = (plotId: string) => ['plots', plotId, 'soil-tests'] as const;

/** The latest soil test of a plot (newest sample first), for the planting form's "fill from" button. */
export async function fetchSoilTests(plotId: string) {
  return apiFetch<{ soilTests: SoilTestDto[] }>(`/api/plots/${plotId}/soil-tests`);
}

const TYPED = [
  ['sampledOn', 'Date sampled', 'date'],
  ['labName', 'Lab', 'text'],
  ['ph', 'Soil pH', 'number'],
  ['bufferPh', 'Buffer pH', 'number'],
  ['acidityMeq', 'Acidity Ac (meq/100 cm³)', 'number'],
  ['pPpm', 'P (ppm)', 'number'],
  ['kPpm', 'K (ppm)', 'number'],
  ['organicMatterPct', 'Organic matter (%)', 'number'],
  ['limeTonsPerAcre', 'Lime (tons/acre)', 'number'],
  ['nLbPerAcre', 'N (lb/acre)', 'number'],
  ['p2o5LbPerAcre', 'P₂O₅ (lb/acre)', 'number'],
  ['k2oLbPerAcre', 'K₂O (lb/acre)', 'number'],
] as const;

const show = (value: number | null, unit = '') => (value === null ? '—' : `${formatNumber(value)}${unit}`);
const BUFFER_LABELS = { smp: 'SMP', mehlich: 'Mehlich' } as const;

export function SoilTests({ plotId, canManage }: { plotId: string; canManage: boolean }) {
  const queryClient = useQueryClient();
  const formRef = useRef<HTMLFormElement>(null);
  const [chosen, setChosen] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [cancel, setCancel] = useState<(() => void) | null>(null);
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const tests = useQuery({ queryKey: soilTestsKey(plotId), queryFn: () => fetchSoilTests(plotId) });
  const isCsv = chosen ? /\.csv$/i.test(chosen.name) : false;

  async function upload() {
    if (!chosen || !formRef.current) return;
    setMessage(null);
    setFieldErrors({});
    const form = new FormData(formRef.current);
    const request = uploadForm<{ soilTest: SoilTestDto }>(`/api/plots/${plotId}/soil-tests`, form, setProgress);
    setProgress(0);
    setCancel(() => request.cancel);
    try {
      await request.done;
      setMessage({ tone: 'success', text: `Saved the soil test from “${chosen.name}”.` });
      formRef.current?.reset();
      setChosen(null);
      await queryClient.invalidateQueries({ queryKey: soilTestsKey(plotId) });
    } catch (error) {
      setMessage({ tone: 'error', text: errorMessage(error) });
      if (error instanceof ApiError) setFieldErrors(error.fields);
    } finally {
      setProgress(null);
      setCancel(null);
    }
  }

  const list = tests.data?.soilTests ?? [];
  const uploading = progress !== null;

  return (
    <Card aria-labelledby="soil-tests-heading">
      <CardHeader id="soil-tests-heading" title="Soil tests" description="The lab’s report as a PDF or picture, or its CSV of results." />
      {tests.isPending ? <LoadingBlock label="Loading soil tests" rows={2} /> : null}
      {tests.isError ? <Notice tone="error">The soil tests did not load: {errorMessage(tests.error)}</Notice> : null}
      {tests.isSuccess && list.length === 0 ? <p className="text-sm text-loam-soft">No soil test yet.</p> : null}
      {list.length ? (
        <div className="-mx-1 overflow-x-auto">
          <table className="tabular w-full min-w-[40rem] text-left text-sm">
            <thead className="text-loam-soft">
              <tr>
                <th className="px-1 py-2 font-semibold">Sampled</th>
                <th className="px-1 py-2 font-semibold">pH</th>
                <th className="px-1 py-2 font-semibold">Buffer pH</th>
                <th className="px-1 py-2 font-semibold">P / K (ppm)</th>
                <th className="px-1 py-2 font-semibold">OM</th>
                <th className="px-1 py-2 font-semibold">Lime</th>
                <th className="px-1 py-2 font-semibold">N–P₂O₅–K₂O (lb/acre)</th>
                <th className="px-1 py-2 font-semibold">Report</th>
              </tr>
            </thead>
            <tbody>
              {list.map((t) => (
                <tr key={t.id} className="border-t border-ground-line align-top">
                  <td className="px-1 py-2">
                    {formatLocalDate(t.sampledOn) ?? `Uploaded ${formatLocalDate(t.createdAt.slice(0, 10))}`}
                    {t.labName ? <span className="block text-xs text-loam-soft">{t.labName}</span> : null}
                  </td>
                  <td className="px-1 py-2">{show(t.ph)}</td>
                  <td className="px-1 py-2">
                    {show(t.bufferPh)}
                    {t.bufferMethod ? <span className="block text-xs text-loam-soft">{BUFFER_LABELS[t.bufferMethod]}</span> : null}
                    {t.acidityMeq !== null ? <span className="block text-xs text-loam-soft">Ac {formatNumber(t.acidityMeq)}</span> : null}
                  </td>
                  <td className="px-1 py-2">
                    {show(t.pPpm)} / {show(t.kPpm)}
                  </td>
                  <td className="px-1 py-2">{show(t.organicMatterPct, '%')}</td>
                  <td className="px-1 py-2">{show(t.limeTonsPerAcre, ' t/acre')}</td>
                  <td className="px-1 py-2">
                    {show(t.nLbPerAcre)}–{show(t.p2o5LbPerAcre)}–{show(t.k2oLbPerAcre)}
                    {t.recommendation ? <span className="block max-w-64 text-xs text-loam-soft">{t.recommendation}</span> : null}
                  </td>
                  <td className="px-1 py-2">
                    {t.file ? (
                      <a href={t.file.url} className="inline-flex min-h-11 items-center gap-1 font-semibold text-rain underline" target="_blank" rel="noreferrer">
                        <FileText className="size-4" aria-hidden="true" />
                        <span className="max-w-40 truncate">{t.file.filename}</span>
                      </a>
                    ) : (
                      '—'
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}

      {canManage ? (
        <form
          ref={formRef}
          className="mt-4 space-y-3 border-t border-ground-line pt-4"
          onSubmit={(e) => {
            e.preventDefault();
            void upload();
          }}
        >
          <div className="flex flex-col gap-1.5">
            <label htmlFor="soil-test-file" className="text-sm font-semibold">
              Report file
            </label>
            <input
              id="soil-test-file"
              name="file"
              type="file"
              accept=".pdf,.jpg,.jpeg,.png,.csv,application/pdf,image/jpeg,image/png,text/csv"
              disabled={uploading}
              aria-invalid={fieldErrors.file ? true : undefined}
              className="block w-full min-h-11 text-sm file:mr-3 file:min-h-11 file:rounded-lg file:border file:border-ground-line file:bg-white file:px-3 file:font-semibold file:text-loam"
              onChange={(e) => {
                setChosen(e.target.files?.[0] ?? null);
                setMessage(null);
              }}
            />
            <p className="text-xs text-loam-soft">PDF, JPEG, PNG or the lab’s CSV, up to 10 MB. A CSV is read for its values.</p>
          </div>
          {chosen && !isCsv ? (
            <fieldset className="space-y-2">
              <legend className="text-sm font-semibold">Values from the report (optional)</legend>
              <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                {TYPED.map(([name, label, type]) => (
                  <Field key={name} label={label} htmlFor={`soil-${name}`} error={fieldErrors[name]}>
                    <Input id={`soil-${name}`} name={name} type={type} step={type === 'number' ? 'any' : undefined} inputMode={type === 'number' ? 'decimal' : undefined} disabled={uploading} />
                  </Field>
                ))}
                <Field label="Buffer method" htmlFor="soil-bufferMethod" error={fieldErrors.bufferMethod} hint="The buffer the lab used for the buffer pH.">
                  <Select id="soil-bufferMethod" name="bufferMethod" defaultValue="" disabled={uploading}>
                    <option value="">Not stated</option>
                    <option value="smp">SMP (or Sikora)</option>
                    <option value="mehlich">Mehlich</option>
                  </Select>
                </Field>
              </div>
            </fieldset>
          ) : null}
          <div className="flex flex-wrap items-center gap-3">
            {uploading ? (
              <>
                <UploadProgress fraction={progress} label="Uploading the soil test" />
                <Button variant="secondary" size="sm" onClick={() => cancel?.()}>
                  <X className="size-4" aria-hidden="true" />
                  Cancel
                </Button>
              </>
            ) : (
              <Button type="submit" size="sm" disabled={!chosen}>
                <Upload className="size-4" aria-hidden="true" />
                Upload soil test
              </Button>
            )}
          </div>
        </form>
      ) : null}
      {message ? <Notice tone={message.tone} className="mt-3">{message.text}</Notice> : null}
    </Card>
  );
}

export interface SoilTestFill {
  limeTonsPerAcre: number | null;
  target: { n: number | null; p2o5: number | null; k2o: number | null };
}

/** The lime line of the fill message: the rate worked out for this blend, and the lab's own when it gave one. */
function limeWords(latest: SoilTestDto, blend: BlendPart[], noTill: boolean): { tons: number | null; text: string } {
  const lab = latest.limeTonsPerAcre;
  const computed = limeForSoilTest({ soilPh: latest.ph, bufferPh: latest.bufferPh, bufferMethod: latest.bufferMethod, acidityMeq: latest.acidityMeq }, blend, { noTill });
  const labText = lab !== null ? ` The lab recommended ${formatNumber(lab)} t/acre.` : '';
  if (!computed.ok) return { tons: lab, text: lab !== null ? `Lime: the lab's ${formatNumber(lab)} t/acre (Sowcast could not work one out: ${computed.reason}).` : '' };
  // To the hundredth of a ton (20 lb an acre): finer than any spreader sets.
  const tons = Math.round(computed.tonsPerAcre * 100) / 100;
  const rate = tons > 0 ? `${formatNumber(tons)} ${computed.reference}` : 'none needed';
  return {
    tons,
    text: `Lime for this blend (target pH ${formatNumber(computed.targetPh)} for ${computed.speciesName.toLowerCase()}): ${rate}, from ${computed.basis}.${labText} You can type another rate.`,
  };
}

/**
 * For the planting form: puts the latest soil test's lime and N–P₂O₅–K₂O recommendations into the form. The
 * lime is worked out for the blend's target pH from the test's pH and buffer pH or acidity when it can be.
 */
export function FillFromSoilTest({
  plotId,
  onFill,
  blend,
  noTill = false,
}: {
  plotId: string;
  onFill: (fill: SoilTestFill) => void;
  /** The blend as the form holds it now. */
  blend: () => BlendPart[];
  /** Ground that is not worked (spray-and-seed, frost seeding): lime for the top 4 in. */
  noTill?: boolean;
}) {
  const [pending, setPending] = useState(false);
  const [message, setMessage] = useState<{ tone: 'success' | 'error' | 'info'; text: string } | null>(null);
  async function fill() {
    setPending(true);
    setMessage(null);
    try {
      const [latest] = (await fetchSoilTests(plotId)).soilTests;
      if (!latest) {
        setMessage({ tone: 'info', text: 'This plot has no soil test yet; upload one on the plot page.' });
        return;
      }
      const lime = limeWords(latest, blend(), noTill);
      const fillWith: SoilTestFill = {
        limeTonsPerAcre: lime.tons,
        target: { n: latest.nLbPerAcre, p2o5: latest.p2o5LbPerAcre, k2o: latest.k2oLbPerAcre },
      };
      const given = [fillWith.limeTonsPerAcre, fillWith.target.n, fillWith.target.p2o5, fillWith.target.k2o].some((v) => v !== null);
      if (!given) {
        setMessage({ tone: 'info', text: 'The latest soil test has no lime or fertilizer recommendation to fill in.' });
        return;
      }
      onFill(fillWith);
      const when = formatLocalDate(latest.sampledOn) ?? `uploaded ${formatLocalDate(latest.createdAt.slice(0, 10))}`;
      setMessage({ tone: 'success', text: `Filled from the soil test sampled ${when}. ${lime.text ? `${lime.text} ` : ''}Check the bag grade and sizes.` });
    } catch (error) {
      setMessage({ tone: 'error', text: errorMessage(error) });
    } finally {
      setPending(false);
    }
  }
  return (
    <div className="space-y-2">
      <Button variant="secondary" size="sm" pending={pending} onClick={fill}>
        <FileText className="size-4" aria-hidden="true" />
        Fill from the latest soil test
      </Button>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
    </div>
  );
}
