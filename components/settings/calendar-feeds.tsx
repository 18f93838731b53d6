'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { CalendarPlus, Copy, Link2, Trash2 } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Input } from '@/components/ui/field';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, ApiError, errorMessage } from '@/lib/client/api';
import { formatInstantDate } from '@/lib/client/format';
import type { CalendarFeedDto } from '@/lib/data/calendar-feeds';

const FEEDS_KEY = ['settings', 'calendar-feeds'] as const;

/** Secret iCalendar feed URLs of the person's steps: make one per phone, copy it once, revoke it any time. */
export function CalendarFeeds() {
  const queryClient = useQueryClient();
  const [label, setLabel] = useState('');
  const [made, setMade] = useState<{ url: string; label: string | null } | null>(null);
  const [copied, setCopied] = useState(false);

  const query = useQuery({ queryKey: FEEDS_KEY, queryFn: () => apiFetch<{ feeds: CalendarFeedDto[] }>('/api/settings/calendar-feeds') });
  const create = useMutation({
    mutationFn: (body: { label: string }) => apiFetch<{ feed: CalendarFeedDto; url: string }>('/api/settings/calendar-feeds', { method: 'POST', body }),
    onSuccess: (answer) => {
      setMade({ url: answer.url, label: answer.feed.label });
      setCopied(false);
      setLabel('');
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: FEEDS_KEY }),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiFetch<void>(`/api/settings/calendar-feeds/${id}`, { method: 'DELETE' }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: FEEDS_KEY }),
  });

  async function copy(url: string) {
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
    } catch {
      // Without clipboard access (plain http, an older browser) the address stays selected for a manual copy.
      (document.getElementById('feed-url') as HTMLInputElement | null)?.select();
    }
  }

  const labelError = create.error instanceof ApiError ? create.error.fields.label : undefined;
  const feeds = query.data?.feeds ?? [];

  return (
    <Card aria-labelledby="feeds-heading">
      <CardHeader
        id="feeds-heading"
        title="Your steps in a phone calendar"
        description="A private calendar address (iCalendar) with the steps of every property you belong to, in each property’s local time. Anyone who has the address can read your steps, so keep it to yourself and revoke it if it leaks."
      />
      <div className="space-y-5">
        <form
          className="flex flex-col gap-3 sm:flex-row sm:items-end"
          onSubmit={(event) => {
            event.preventDefault();
            create.mutate({ label });
          }}
        >
          <Field label="Label" htmlFor="feed-label" optional error={labelError} hint="So you can tell your feeds apart, e.g. “My phone”." className="sm:flex-1">
            <Input id="feed-label" value={label} maxLength={60} onChange={(e) => setLabel(e.target.value)} aria-invalid={labelError ? true : undefined} />
          </Field>
          <Button type="submit" pending={create.isPending} className="sm:mb-6">
            <CalendarPlus className="size-4" aria-hidden="true" />
            Make a calendar address
          </Button>
        </form>
        {create.isError && !labelError ? <Notice tone="error">{errorMessage(create.error)}</Notice> : null}

        {made ? (
          <div className="space-y-3 rounded-lg border border-clover/40 bg-clover-light px-4 py-3" data-testid="new-feed">
            <p className="font-semibold">Copy this address now{made.label ? ` for “${made.label}”` : ''}</p>
            <p className="text-sm">Sowcast keeps only a fingerprint of it and cannot show it again. If you lose it, make a new one and revoke this one.</p>
            <div className="flex flex-col gap-2 sm:flex-row">
              <Input id="feed-url" readOnly value={made.url} aria-label="Your calendar address" onFocus={(e) => e.currentTarget.select()} className="font-mono text-sm" />
              <Button variant="secondary" onClick={() => void copy(made.url)}>
                <Copy className="size-4" aria-hidden="true" />
                {copied ? 'Copied' : 'Copy'}
              </Button>
            </div>
          </div>
        ) : null}

        <div>
          <h3 className="mb-2 font-semibold">Your calendar addresses</h3>
          {revoke.isError ? <Notice tone="error" className="mb-3">{errorMessage(revoke.error)}</Notice> : null}
          {query.isPending ? (
            <LoadingBlock label="Loading your calendar addresses" rows={2} />
          ) : query.isError ? (
            <LoadError title="Your calendar addresses did not load" error={query.error} onRetry={() => void query.refetch()} />
          ) : feeds.length === 0 ? (
            <p className="text-sm text-loam-soft">None yet. Make one above for each phone or calendar you want your steps in.</p>
          ) : (
            <ul className="divide-y divide-ground-line rounded-lg border border-ground-line bg-white">
              {feeds.map((feed) => (
                <li key={feed.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
                  <div className="flex min-w-0 items-start gap-3">
                    <Link2 className="mt-0.5 size-5 shrink-0 text-loam-faint" aria-hidden="true" />
                    <div className="min-w-0 text-sm">
                      <p className="text-base font-semibold">{feed.label ?? 'Unlabelled address'}</p>
                      <p className="text-loam-soft">
                        Made <span className="tabular">{formatInstantDate(feed.createdAt)}</span> ·{' '}
                        {feed.lastUsedAt ? <>last read <span className="tabular">{formatInstantDate(feed.lastUsedAt)}</span></> : 'not read yet'}
                      </p>
                    </div>
                  </div>
                  <Button size="sm" variant="danger-quiet" pending={revoke.isPending && revoke.variables === feed.id} onClick={() => revoke.mutate(feed.id)}>
                    <Trash2 className="size-4" aria-hidden="true" />
                    Revoke<span className="sr-only"> {feed.label ?? 'this address'}</span>
                  </Button>
                </li>
              ))}
            </ul>
          )}
        </div>

        <details className="rounded-lg border border-ground-line bg-ground-raised px-4 py-3 text-sm">
          <summary className="cursor-pointer font-semibold">How to subscribe on a phone</summary>
          <ul className="mt-2 list-disc space-y-1.5 pl-5">
            <li>
              <strong>iPhone or iPad:</strong> open Settings → Calendar → Accounts → Add Account → Other → Add Subscribed Calendar, and
              paste the address.
            </li>
            <li>
              <strong>Android (Google Calendar):</strong> on a computer, open Google Calendar on the web, choose Other calendars → + → From
              URL, and paste the address; it then appears on the phone signed in to the same account.
            </li>
            <li>
              <strong>Other calendar apps:</strong> look for “subscribe”, “add calendar from URL” or “internet calendar”.
            </li>
          </ul>
          <p className="mt-2 text-loam-soft">
            Subscribed calendars are read-only and refresh on the phone’s own schedule (often every few hours), so a moved step can take a
            while to show. Mark steps done in Sowcast, not in the calendar.
          </p>
        </details>
      </div>
    </Card>
  );
}
