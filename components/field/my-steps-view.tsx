'use client';

import { useQueryClient } from '@tanstack/react-query';
import { CloudOff, CloudUpload, FileText, RefreshCw, ShieldCheck, Trash2, Wifi } from 'lucide-react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useCallback, useState, type ReactNode } from 'react';
import { longDay } from '@/components/calendar/calendar-data';
import { StepKindLegend } from '@/components/steps/step-kind';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { errorMessage } from '@/lib/client/api';
import { discardOutcome, enqueueOutcome, newClientId, retryOutcome, type QueuedOutcome } from '@/lib/client/outbox';
import { MY_STEP_GROUP_TITLES, MY_STEP_GROUPS, type MyStep } from '@/lib/planning/my-steps';
import type { StepKind } from '@/lib/schedule/types';
import type { StepOutcomeInput } from '@/lib/validations/step';
import { DoneForm } from './done-form';
import { StepCard } from './step-card';
import { myStepsKey, useMySteps, useOfflineCopy, useOnline, useOutbox } from './use-field';

/** Work that leaves an application record (7 CFR 110 for restricted-use pesticides; fertilizer and lime by the same form). */
const RECORDED_KINDS: StepKind[] = ['spray', 'spot-spray-grass', 'fertilize', 'lime'];
export const recordPath = (propertyId: string, stepId: string) => `/properties/${propertyId}/records/new?step=${stepId}`;

const clock = (iso: string) => new Date(iso).toLocaleString('en-US', { weekday: 'short', day: 'numeric', month: 'short', hour: 'numeric', minute: '2-digit' });

export function MyStepsView({ userId, userName }: { userId: string; userName: string }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const query = useMySteps();
  const online = useOnline();
  const [openForm, setOpenForm] = useState<string | null>(null);
  const [formErrors, setFormErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState<string | null>(null);
  const [sentRecords, setSentRecords] = useState<QueuedOutcome[]>([]);

  const onSent = useCallback((sent: QueuedOutcome[]) => {
    // Sent later from the queue: the application record is offered, not forced on a person who moved on.
    setSentRecords((old) => [...old, ...sent.filter((e) => e.body.status === 'done' && RECORDED_KINDS.includes(e.kind))]);
  }, []);
  const outbox = useOutbox(userId, onSent);
  // The browser's flag can say "online" while nothing gets through; an answer from the kept copy or a send
  // that found no network says otherwise.
  const reachable = online && !query.data?.storedAt && outbox.last?.stopped !== 'offline';
  const offline = useOfflineCopy(userId, reachable && query.isSuccess);

  async function complete(step: MyStep, body: StepOutcomeInput) {
    setPending(step.stepId);
    setFormErrors({});
    // Into the queue first: if the tab closes or the connection drops mid-send, the outcome is still there.
    const entry = await enqueueOutcome({
      clientId: newClientId(),
      userId,
      stepId: step.stepId,
      propertyId: step.propertyId,
      kind: step.kind,
      title: step.title,
      plotName: step.plotName,
      body,
    });
    try {
      const result = await outbox.send(entry.clientId);
      const refused = result.refused.find((e) => e.clientId === entry.clientId);
      if (refused) {
        // The person is right here: show the server's reasons in the form and keep nothing queued.
        await discardOutcome(entry.clientId);
        setFormErrors({ ...(refused.lastFields ?? {}), _: refused.lastError ?? 'Not saved.' });
        return;
      }
      setOpenForm(null);
      const sent = result.sent.some((e) => e.clientId === entry.clientId);
      if (sent && body.status === 'done' && RECORDED_KINDS.includes(step.kind)) {
        setSentRecords((old) => old.filter((e) => e.clientId !== entry.clientId));
        router.push(recordPath(step.propertyId, step.stepId));
      }
    } finally {
      setPending(null);
    }
  }

  const queuedByStep = new Map(outbox.entries.map((e) => [e.stepId, e.state] as const));
  const waiting = outbox.entries.filter((e) => e.state === 'waiting');
  const refused = outbox.entries.filter((e) => e.state === 'refused');

  return (
    <div className="space-y-5">
      <ConnectionBar online={reachable} storedAt={query.data?.storedAt ?? null} offline={offline} />

      {waiting.length ? (
        <section aria-labelledby="queue-heading" className="rounded-card border-2 border-straw bg-straw-light p-4" data-testid="outbox">
          <h2 id="queue-heading" className="flex items-center gap-2 text-lg font-bold text-loam">
            <CloudUpload className="size-5" aria-hidden="true" />
            Waiting to send ({waiting.length})
          </h2>
          <p className="mt-1 text-sm text-loam">
            Saved on this phone. {reachable ? 'Sending now…' : 'They go to Sowcast by themselves as soon as there is a connection — even after a reload.'}
            {outbox.last?.stopped === 'signed-out' ? ' Your session has ended: sign in again to send them.' : ''}
          </p>
          <ul className="mt-2 space-y-1">
            {waiting.map((e) => (
              <li key={e.clientId} className="text-base text-loam">
                <span className="font-semibold">{e.plotName}</span> · {e.title} — {e.body.status === 'done' ? `done ${e.body.date ? longDay(e.body.date) : 'today'}` : 'skipped'}
              </li>
            ))}
          </ul>
          {reachable ? (
            <Button variant="secondary" className="mt-3 min-h-12" onClick={() => void outbox.send()}>
              <RefreshCw className="size-5" aria-hidden="true" />
              Send now
            </Button>
          ) : null}
        </section>
      ) : null}

      {refused.map((e) => (
        <Notice key={e.clientId} tone="error" title={`Not saved: ${e.plotName} · ${e.title}`}>
          <p>{e.lastError}</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button variant="secondary" className="min-h-12" onClick={() => void retryOutcome(e.clientId).then(() => outbox.send(e.clientId))}>
              Try again
            </Button>
            <Button variant="danger-quiet" className="min-h-12" onClick={() => void discardOutcome(e.clientId)}>
              <Trash2 className="size-5" aria-hidden="true" />
              Discard
            </Button>
          </div>
        </Notice>
      ))}

      {sentRecords.map((e) => (
        <Notice key={e.clientId} tone="success" title={`Sent: ${e.plotName} · ${e.title}`}>
          <Link href={recordPath(e.propertyId, e.stepId)} className="inline-flex min-h-12 items-center gap-2 font-semibold text-rain underline">
            <FileText className="size-5" aria-hidden="true" />
            Fill in the application record
          </Link>
        </Notice>
      ))}

      {query.isPending ? (
        <LoadingBlock label="Loading your steps" rows={4} />
      ) : query.isError ? (
        <Notice tone="error" title="Your steps could not be loaded">
          {errorMessage(query.error)}{' '}
          <button type="button" className="min-h-11 font-semibold text-rain underline" onClick={() => void query.refetch()}>
            Try again
          </button>
        </Notice>
      ) : (
        <StepGroups
          steps={query.data.steps}
          render={(step) => (
            <StepCard
              key={step.id}
              step={step}
              queued={step.recurring ? null : (queuedByStep.get(step.stepId) ?? null)}
              formOpen={openForm === step.id}
              onMarkDone={() => {
                setFormErrors({});
                setOpenForm(step.id);
              }}
            >
              {openForm === step.id ? (
                <div className="mt-3">
                  <DoneForm
                    step={step}
                    userName={userName}
                    serverErrors={formErrors}
                    pending={pending === step.stepId}
                    onCancel={() => setOpenForm(null)}
                    onSubmit={(body) => void complete(step, body)}
                  />
                </div>
              ) : null}
            </StepCard>
          )}
        />
      )}

      <div className="flex flex-wrap items-center justify-between gap-3">
        <StepKindLegend />
        <button type="button" className="inline-flex min-h-12 items-center gap-2 font-semibold text-rain" onClick={() => void queryClient.invalidateQueries({ queryKey: myStepsKey })}>
          <RefreshCw className="size-5" aria-hidden="true" />
          Refresh
        </button>
      </div>
    </div>
  );
}

function StepGroups({ steps, render }: { steps: MyStep[]; render: (step: MyStep) => ReactNode }) {
  if (!steps.length) {
    return <p className="rounded-card border border-ground-line bg-ground-raised p-4 text-lg text-loam">Nothing for you in the next two weeks. Enjoy the quiet.</p>;
  }
  return (
    <>
      {MY_STEP_GROUPS.map((group) => {
        const inGroup = steps.filter((s) => s.group === group);
        if (!inGroup.length) return null;
        return (
          <section key={group} aria-labelledby={`group-${group}`} className="space-y-3">
            <h2 id={`group-${group}`} className={group === 'overdue' ? 'text-xl font-bold text-ember' : 'text-xl font-bold text-loam'}>
              {MY_STEP_GROUP_TITLES[group]} <span className="text-base font-semibold text-loam-soft">({inGroup.length})</span>
            </h2>
            {inGroup.map(render)}
          </section>
        );
      })}
    </>
  );
}

function ConnectionBar({ online, storedAt, offline }: { online: boolean; storedAt: string | null; offline: ReturnType<typeof useOfflineCopy> }) {
  if (!online || storedAt) {
    return (
      <div role="status" className="flex items-start gap-3 rounded-card border-2 border-loam bg-ground-raised px-4 py-3 text-base text-loam" data-connection="offline">
        <CloudOff className="mt-0.5 size-6 shrink-0" aria-hidden="true" />
        <p>
          <span className="font-bold">Offline.</span>{' '}
          {storedAt ? `Showing your steps as of ${clock(storedAt)}.` : 'Showing what this page last loaded.'} Steps you mark done wait on this phone and are sent
          when the connection is back.
        </p>
      </div>
    );
  }
  return (
    <p className="flex min-h-11 items-center gap-2 text-sm text-loam-soft" data-connection="online" data-offline-copy={offline.state}>
      {offline.state === 'ready' ? (
        <>
          <ShieldCheck className="size-5 text-clover-dark" aria-hidden="true" />
          Online · kept on this phone for reading offline
        </>
      ) : offline.state === 'unsupported' || offline.state === 'failed' ? (
        <>
          <Wifi className="size-5" aria-hidden="true" />
          Online · {offline.why}
        </>
      ) : (
        <>
          <Wifi className="size-5" aria-hidden="true" />
          Online
        </>
      )}
    </p>
  );
}

