'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Ban, BellOff, BellRing, Smartphone, Trash2 } from 'lucide-react';
import { useCallback, useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { ApiError, apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { formatInstantDate } from '@/lib/client/format';

interface Device {
  id: string;
  label: string | null;
  endpoint: string;
  service: string;
  createdAt: string;
  lastSentAt: string | null;
}

interface PushAnswer {
  publicKey: string;
  devices: Device[];
}

/** What this browser can do about phone notifications, found out once the page runs in it. */
type Support =
  | { state: 'checking' }
  | { state: 'unsupported'; why: string }
  | { state: 'blocked' }
  | { state: 'ready'; subscription: PushSubscription | null };

/** PushManager.subscribe wants the VAPID public key as bytes; the server gives it base64url (RFC 8292 §3.2). */
function keyBytes(base64url: string): Uint8Array<ArrayBuffer> {
  const base64 = base64url.replace(/-/g, '+').replace(/_/g, '/').padEnd(Math.ceil(base64url.length / 4) * 4, '=');
  const raw = atob(base64);
  const bytes = new Uint8Array(new ArrayBuffer(raw.length));
  for (let i = 0; i < raw.length; i++) bytes[i] = raw.charCodeAt(i);
  return bytes;
}

/** "Firefox on Android": enough for a person to tell their devices apart in the list. */
function deviceLabel(): string {
  const ua = navigator.userAgent;
  const browser = /Edg\//.test(ua) ? 'Edge' : /Firefox\//.test(ua) ? 'Firefox' : /Chrom(e|ium)\//.test(ua) ? 'Chrome' : /Safari\//.test(ua) ? 'Safari' : 'Browser';
  const system = /Android/.test(ua)
    ? 'Android'
    : /iPhone/.test(ua)
      ? 'iPhone'
      : /iPad/.test(ua)
        ? 'iPad'
        : /Mac OS X/.test(ua)
          ? 'Mac'
          : /Windows/.test(ua)
            ? 'Windows'
            : /Linux/.test(ua)
              ? 'Linux'
              : 'this device';
  return `${browser} on ${system}`;
}

async function currentSupport(): Promise<Support> {
  if (typeof window === 'undefined') return { state: 'checking' };
  if (!window.isSecureContext) {
    return { state: 'unsupported', why: 'Phone notifications need a secure (https) connection to Sowcast.' };
  }
  if (!('serviceWorker' in navigator) || !('PushManager' in window) || !('Notification' in window)) {
    return { state: 'unsupported', why: 'This browser cannot receive web push notifications. On an iPhone, add Sowcast to the home screen first.' };
  }
  if (Notification.permission === 'denied') return { state: 'blocked' };
  const registration = await navigator.serviceWorker.getRegistration('/');
  const subscription = registration ? await registration.pushManager.getSubscription() : null;
  return { state: 'ready', subscription };
}

const PERMISSION_CLOSED = 'The browser question was closed without an answer, so nothing was changed. Turn notifications on again to be asked once more.';

export function PushDevices() {
  const queryClient = useQueryClient();
  const [support, setSupport] = useState<Support>({ state: 'checking' });
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  const query = useQuery({
    queryKey: queryKeys.pushDevices,
    queryFn: () => apiFetch<PushAnswer>('/api/settings/push'),
  });

  const refreshSupport = useCallback(async () => {
    try {
      setSupport(await currentSupport());
    } catch (error) {
      setSupport({ state: 'unsupported', why: `This browser did not say whether it can receive notifications (${errorMessage(error)}).` });
    }
  }, []);

  useEffect(() => {
    void refreshSupport();
  }, [refreshSupport]);

  const remove = useMutation({
    mutationFn: (endpoint: string) => apiFetch<void>('/api/settings/push-subscriptions', { method: 'DELETE', body: { endpoint } }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.pushDevices }),
  });

  const devices = query.data?.devices ?? [];
  const thisEndpoint = support.state === 'ready' ? (support.subscription?.endpoint ?? null) : null;
  const known = thisEndpoint !== null && devices.some((d) => d.endpoint === thisEndpoint);
  const on = support.state === 'ready' && known;

  async function turnOn() {
    if (!query.data) return;
    setMessage(null);
    setBusy(true);
    let created: PushSubscription | null = null;
    try {
      const permission = await Notification.requestPermission();
      if (permission === 'denied') {
        setSupport({ state: 'blocked' });
        return;
      }
      if (permission !== 'granted') {
        setMessage({ tone: 'error', text: PERMISSION_CLOSED });
        return;
      }
      const registration = await navigator.serviceWorker.register('/sw.js');
      await navigator.serviceWorker.ready;
      const options = { userVisibleOnly: true, applicationServerKey: keyBytes(query.data.publicKey) };
      try {
        created = await registration.pushManager.subscribe(options);
      } catch (error) {
        // A subscription made with an older server key blocks a new one: drop it and ask again.
        const stale = await registration.pushManager.getSubscription();
        if (!stale || (error as DOMException)?.name !== 'InvalidStateError') throw error;
        await stale.unsubscribe();
        created = await registration.pushManager.subscribe(options);
      }
      const save = (sub: PushSubscription) =>
        apiFetch('/api/settings/push-subscriptions', { method: 'POST', body: { ...sub.toJSON(), label: deviceLabel() } });
      try {
        await save(created);
      } catch (error) {
        // 409: this browser's subscription belongs to another account (someone else used this browser).
        // The server never moves it; a fresh subscription gets a new endpoint of this person's own.
        if (!(error instanceof ApiError) || error.status !== 409) throw error;
        await created.unsubscribe();
        created = await registration.pushManager.subscribe(options);
        await save(created);
      }
      setMessage({ tone: 'success', text: 'This device will get Sowcast’s notifications.' });
    } catch (error) {
      // A subscription the server could not store would receive nothing: do not leave it behind.
      const orphan = created as PushSubscription | null;
      await orphan?.unsubscribe().catch(() => undefined);
      setMessage({ tone: 'error', text: `Notifications were not turned on: ${errorMessage(error)}` });
    } finally {
      setBusy(false);
      await refreshSupport();
      await queryClient.invalidateQueries({ queryKey: queryKeys.pushDevices });
    }
  }

  async function turnOff() {
    if (support.state !== 'ready' || !support.subscription) return;
    setMessage(null);
    setBusy(true);
    const endpoint = support.subscription.endpoint;
    try {
      await apiFetch<void>('/api/settings/push-subscriptions', { method: 'DELETE', body: { endpoint } });
      await support.subscription.unsubscribe();
      setMessage({ tone: 'success', text: 'This device will get no more notifications from Sowcast.' });
    } catch (error) {
      setMessage({ tone: 'error', text: `Notifications were not turned off: ${errorMessage(error)}` });
    } finally {
      setBusy(false);
      await refreshSupport();
      await queryClient.invalidateQueries({ queryKey: queryKeys.pushDevices });
    }
  }

  return (
    <Card aria-labelledby="devices-heading">
      <CardHeader
        id="devices-heading"
        title="Phone notifications on your devices"
        description="Each phone or browser that should ring for Sowcast subscribes once. Tapping a notification opens the step it is about."
      />
      <div className="space-y-5">
        <ThisDevice support={support} on={on} busy={busy} ready={!!query.data} onTurnOn={() => void turnOn()} onTurnOff={() => void turnOff()} />
        {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}

        <div>
          <h3 className="mb-2 font-semibold">Your devices</h3>
          {remove.isError ? <Notice tone="error" className="mb-3">{errorMessage(remove.error)}</Notice> : null}
          {query.isPending ? (
            <LoadingBlock label="Loading your devices" rows={2} />
          ) : query.isError ? (
            <div className="space-y-2">
              <Notice tone="error">{errorMessage(query.error)}</Notice>
              <Button variant="secondary" size="sm" onClick={() => void query.refetch()}>
                Try again
              </Button>
            </div>
          ) : devices.length === 0 ? (
            <p className="text-sm text-loam-soft">No devices yet. Turn notifications on above on each phone you want them on.</p>
          ) : (
            <ul className="divide-y divide-ground-line rounded-lg border border-ground-line bg-white">
              {devices.map((device) => {
                const mine = device.endpoint === thisEndpoint;
                return (
                  <li key={device.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
                    <div className="flex min-w-0 items-start gap-3">
                      <Smartphone className="mt-0.5 size-5 shrink-0 text-loam-faint" aria-hidden="true" />
                      <div className="min-w-0 text-sm">
                        <p className="font-semibold text-base">
                          {device.label ?? 'Unnamed device'}
                          {mine ? <span className="ml-2 rounded-full bg-clover-light px-2 py-0.5 text-xs font-semibold text-clover-dark">This device</span> : null}
                        </p>
                        <p className="text-loam-soft">
                          Added <span className="tabular">{formatInstantDate(device.createdAt)}</span> · via {device.service} ·{' '}
                          {device.lastSentAt ? <>last message <span className="tabular">{formatInstantDate(device.lastSentAt)}</span></> : 'no messages yet'}
                        </p>
                      </div>
                    </div>
                    <Button
                      size="sm"
                      variant="danger-quiet"
                      pending={remove.isPending && remove.variables === device.endpoint}
                      onClick={() =>
                        remove.mutate(device.endpoint, {
                          onSuccess: () => {
                            // Removing this browser here also ends its subscription, so the switch above agrees.
                            if (mine && support.state === 'ready') void support.subscription?.unsubscribe().then(refreshSupport);
                          },
                        })
                      }
                    >
                      <Trash2 className="size-4" aria-hidden="true" />
                      Remove<span className="sr-only"> {device.label ?? 'this device'}</span>
                    </Button>
                  </li>
                );
              })}
            </ul>
          )}
        </div>
      </div>
    </Card>
  );
}

function ThisDevice({
  support,
  on,
  busy,
  ready,
  onTurnOn,
  onTurnOff,
}: {
  support: Support;
  on: boolean;
  busy: boolean;
  ready: boolean;
  onTurnOn: () => void;
  onTurnOff: () => void;
}) {
  const box = 'flex flex-col gap-3 rounded-lg border px-4 py-3 sm:flex-row sm:items-center sm:justify-between';
  if (support.state === 'checking') return <LoadingBlock label="Checking what this browser supports" rows={1} />;
  if (support.state === 'unsupported') {
    return (
      <div className={`${box} border-ground-line bg-ground`} data-push-state="unsupported">
        <div className="flex items-start gap-3">
          <Ban className="mt-0.5 size-5 shrink-0 text-loam-soft" aria-hidden="true" />
          <div>
            <p className="font-semibold">This device: not supported</p>
            <p className="text-sm text-loam-soft">{support.why} E-mail still works.</p>
          </div>
        </div>
      </div>
    );
  }
  if (support.state === 'blocked') {
    return (
      <div className={`${box} border-ember/50 bg-ember-light`} data-push-state="blocked">
        <div className="flex items-start gap-3">
          <BellOff className="mt-0.5 size-5 shrink-0 text-ember" aria-hidden="true" />
          <div>
            <p className="font-semibold">This device: blocked</p>
            <p className="text-sm">
              Notifications from Sowcast are blocked in this browser’s settings. Allow them for this site there (usually under the
              lock or site icon next to the address), then come back to this page.
            </p>
          </div>
        </div>
      </div>
    );
  }
  if (on) {
    return (
      <div className={`${box} border-clover/40 bg-clover-light`} data-push-state="on">
        <div className="flex items-start gap-3">
          <BellRing className="mt-0.5 size-5 shrink-0 text-clover" aria-hidden="true" />
          <div>
            <p className="font-semibold">This device: on</p>
            <p className="text-sm">Sowcast’s notifications arrive here.</p>
          </div>
        </div>
        <Button variant="secondary" pending={busy} onClick={onTurnOff}>
          <BellOff className="size-4" aria-hidden="true" />
          Turn off on this device
        </Button>
      </div>
    );
  }
  return (
    <div className={`${box} border-ground-line bg-white`} data-push-state="off">
      <div className="flex items-start gap-3">
        <BellOff className="mt-0.5 size-5 shrink-0 text-loam-soft" aria-hidden="true" />
        <div>
          <p className="font-semibold">This device: off</p>
          <p className="text-sm text-loam-soft">The browser will ask once whether Sowcast may send notifications.</p>
        </div>
      </div>
      <Button pending={busy} disabled={!ready} onClick={onTurnOn}>
        <BellRing className="size-4" aria-hidden="true" />
        Turn on for this device
      </Button>
    </div>
  );
}
