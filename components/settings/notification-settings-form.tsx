'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { ListChecks, Mail, Moon, Smartphone, Sunrise } from 'lucide-react';
import { useId, useState, type ReactNode } from 'react';
import { useForm, type Resolver, type UseFormRegisterReturn } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, FieldError, Select, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch } from '@/lib/client/api';
import { applyServerErrors } from '@/lib/client/forms';
import type { NotificationSettings } from '@/lib/data/notification-settings';
import { notificationSettingsSchema } from '@/lib/validations/notification-settings';
import { useHydrated } from '@/lib/client/use-hydrated';

type Fields = NotificationSettings;
const FIELD_NAMES = ['emailEnabled', 'pushEnabled', 'reminderHour', 'quietStartHour', 'quietEndHour', 'dueReminders', 'digest'] as const;
const HOURS = Array.from({ length: 24 }, (_, hour) => hour);
// A quiet spell people often keep: from the evening to the morning.
const DEFAULT_QUIET = { start: 21, end: 6 };

/** "07:00 (7 AM)": the 24-hour clock the reminders use, with the 12-hour one most people here read. */
export function hourLabel(hour: number): string {
  const twelve = hour % 12 === 0 ? 12 : hour % 12;
  const suffix = hour === 0 ? 'midnight' : hour === 12 ? 'noon' : `${twelve} ${hour < 12 ? 'AM' : 'PM'}`;
  return `${String(hour).padStart(2, '0')}:00 (${suffix})`;
}

const clock = (hour: number) => `${String(hour).padStart(2, '0')}:00`;

/** In words, what the chosen quiet hours do, so a spell across midnight is plain. */
function quietSummary(start: number | null | undefined, end: number | null | undefined): string | null {
  if (start == null || end == null || start === end) return null;
  const overnight = start > end ? ', overnight' : '';
  return `Quiet from ${clock(start)} to ${clock(end)}${overnight}. Anything that falls due then waits until ${clock(end)} — held, never dropped.`;
}

const numberOrNull = (value: unknown) => (value === '' || value === null || value === undefined ? null : Number(value));

export interface PropertyZone {
  name: string;
  timeZone: string;
}

export function NotificationSettingsForm({ initial, email, zones }: { initial: NotificationSettings; email: string; zones: PropertyZone[] }) {
  const id = useId();
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const [quietOn, setQuietOn] = useState(initial.quietStartHour != null);
  // Until hydration a click would submit the form natively; the button waits for React.
  const hydrated = useHydrated();
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<Fields>({
    resolver: zodResolver(notificationSettingsSchema) as Resolver<Fields>,
    defaultValues: initial,
  });

  const reminderHour = watch('reminderHour');
  const quietStart = watch('quietStartHour');
  const quietEnd = watch('quietEndHour');

  function toggleQuiet(on: boolean) {
    setQuietOn(on);
    setSaved(false);
    setValue('quietStartHour', on ? (quietStart ?? DEFAULT_QUIET.start) : null, { shouldDirty: true });
    setValue('quietEndHour', on ? (quietEnd ?? DEFAULT_QUIET.end) : null, { shouldDirty: true });
  }

  const onSubmit = handleSubmit(async (values) => {
    setFormMessage(null);
    setSaved(false);
    try {
      const { settings } = await apiFetch<{ settings: NotificationSettings }>('/api/settings/notifications', { method: 'PUT', body: values });
      reset(settings);
      setQuietOn(settings.quietStartHour != null);
      setSaved(true);
    } catch (error) {
      // The form keeps every value as it was typed; only the messages change.
      setFormMessage(applyServerErrors(error, FIELD_NAMES, setError));
    }
  });

  const ids = {
    reminderHour: `${id}-reminder-hour`,
    quietStart: `${id}-quiet-start`,
    quietEnd: `${id}-quiet-end`,
  };
  const summary = quietOn ? quietSummary(quietStart, quietEnd) : null;
  const zoneList = zones.length ? (
    <span>
      {zones.map((z, i) => (
        <span key={`${z.name}-${z.timeZone}`}>
          {i > 0 ? '; ' : ''}
          {z.name}: <span className="tabular">{clock(Number(reminderHour))}</span> {z.timeZone}
        </span>
      ))}
      .
    </span>
  ) : null;

  return (
    <form method="post" onSubmit={onSubmit} noValidate className="space-y-6" aria-describedby={formMessage ? `${id}-message` : undefined}>
      {formMessage ? (
        <div id={`${id}-message`}>
          <Notice tone="error">{formMessage}</Notice>
        </div>
      ) : null}

      <Card aria-labelledby={`${id}-channels`}>
        <CardHeader id={`${id}-channels`} title="How Sowcast reaches you" description="Reminders, moved steps and checks go to every channel that is on." />
        <div className="space-y-3">
          <Toggle
            icon={<Mail className="size-5 text-rain" aria-hidden="true" />}
            label="E-mail"
            hint={<>To <span className="break-all">{email}</span>. Every e-mail carries a link back to this page.</>}
            registration={register('emailEnabled', { onChange: () => setSaved(false) })}
            error={errors.emailEnabled?.message}
          />
          <Toggle
            icon={<Smartphone className="size-5 text-clover" aria-hidden="true" />}
            label="Phone notifications"
            hint="To the devices listed below. Turn a device on there; this switch pauses them all."
            registration={register('pushEnabled', { onChange: () => setSaved(false) })}
            error={errors.pushEnabled?.message}
          />
        </div>
      </Card>

      <Card aria-labelledby={`${id}-when`}>
        <CardHeader id={`${id}-when`} title="When" description="Times are local to each property: the hour you pick is that hour on the property’s own clock." />
        <div className="space-y-6">
          <Field
            label={
              <span className="inline-flex items-center gap-2">
                <Sunrise className="size-4 text-straw" aria-hidden="true" />
                Reminder hour
              </span>
            }
            htmlFor={ids.reminderHour}
            error={errors.reminderHour?.message}
            hint={
              <>
                Reminders go out at this hour in each property’s time zone, across daylight saving changes.
                {zoneList ? <> Yours: {zoneList}</> : null}
              </>
            }
          >
            <Select
              {...controlAria(ids.reminderHour, errors.reminderHour?.message, true)}
              className="sm:max-w-xs"
              // Also in the server's HTML, so the saved hour shows before the page hydrates.
              defaultValue={initial.reminderHour}
              {...register('reminderHour', { setValueAs: numberOrNull, onChange: () => setSaved(false) })}
            >
              {HOURS.map((hour) => (
                <option key={hour} value={hour}>
                  {hourLabel(hour)}
                </option>
              ))}
            </Select>
          </Field>

          <fieldset className="space-y-3">
            <legend className="sr-only">Quiet hours</legend>
            <label className="flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-ground-line bg-white px-4 py-3">
              <input
                type="checkbox"
                className="mt-1 size-5 shrink-0 accent-clover"
                checked={quietOn}
                aria-labelledby={`${id}-quiet-title`}
                aria-describedby={`${id}-quiet-hint`}
                onChange={(event) => toggleQuiet(event.target.checked)}
              />
              <span className="min-w-0">
                <span id={`${id}-quiet-title`} className="flex items-center gap-2 font-semibold">
                  <Moon className="size-5 text-frost" aria-hidden="true" />
                  Quiet hours
                </span>
                <span id={`${id}-quiet-hint`} className="block text-sm text-loam-soft">
                  Hold messages during these hours (in each property’s time zone) and send them when the quiet ends.
                </span>
              </span>
            </label>
            {quietOn ? (
              <div className="grid gap-4 pl-1 sm:grid-cols-2 sm:pl-8">
                <Field label="Quiet from" htmlFor={ids.quietStart} error={errors.quietStartHour?.message}>
                  <Select
                    {...controlAria(ids.quietStart, errors.quietStartHour?.message)}
                    defaultValue={initial.quietStartHour ?? undefined}
                    {...register('quietStartHour', { setValueAs: numberOrNull, onChange: () => setSaved(false) })}
                  >
                    {HOURS.map((hour) => (
                      <option key={hour} value={hour}>
                        {hourLabel(hour)}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Quiet until" htmlFor={ids.quietEnd} error={errors.quietEndHour?.message}>
                  <Select
                    {...controlAria(ids.quietEnd, errors.quietEndHour?.message)}
                    defaultValue={initial.quietEndHour ?? undefined}
                    {...register('quietEndHour', { setValueAs: numberOrNull, onChange: () => setSaved(false) })}
                  >
                    {HOURS.map((hour) => (
                      <option key={hour} value={hour}>
                        {hourLabel(hour)}
                      </option>
                    ))}
                  </Select>
                </Field>
                {summary ? <p className="text-sm text-loam-soft sm:col-span-2">{summary}</p> : null}
              </div>
            ) : null}
          </fieldset>
        </div>
      </Card>

      <Card aria-labelledby={`${id}-what`}>
        <CardHeader
          id={`${id}-what`}
          title="What, besides the essentials"
          description="The end of a kill wait, a step moved by the forecast and a germination check always come. These are extra."
        />
        <div className="space-y-3">
          <Toggle
            icon={<ListChecks className="size-5 text-clover" aria-hidden="true" />}
            label="Steps due today and tomorrow"
            hint="A reminder the day before a step of yours and on the day itself, with what to carry."
            registration={register('dueReminders', { onChange: () => setSaved(false) })}
            error={errors.dueReminders?.message}
          />
          <Toggle
            icon={<Sunrise className="size-5 text-straw" aria-hidden="true" />}
            label="Morning digest"
            hint="One message at your reminder hour, on the clock of the first property you joined, with everything due that day on your plots."
            registration={register('digest', { onChange: () => setSaved(false) })}
            error={errors.digest?.message}
          />
        </div>
      </Card>

      <div className="flex flex-col gap-3 sm:flex-row sm:items-center sm:justify-end">
        {saved && !isDirty ? (
          <p role="status" className="text-sm font-medium text-clover-dark">
            Saved.
          </p>
        ) : null}
        <Button type="submit" pending={isSubmitting} disabled={!hydrated}>
          Save settings
        </Button>
      </div>
    </form>
  );
}

function Toggle({
  icon,
  label,
  hint,
  registration,
  error,
}: {
  icon: ReactNode;
  label: string;
  hint: ReactNode;
  registration: UseFormRegisterReturn;
  error?: string;
}) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-ground-line bg-white px-4 py-3">
        <input
          id={id}
          type="checkbox"
          className="mt-1 size-5 shrink-0 accent-clover"
          aria-invalid={error ? true : undefined}
          // The name is the title alone; the longer hint is read as its description.
          aria-labelledby={`${id}-title`}
          aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}
          {...registration}
        />
        <span className="min-w-0">
          <span id={`${id}-title`} className="flex items-center gap-2 font-semibold">
            {icon}
            {label}
          </span>
          <span id={`${id}-hint`} className="block text-sm text-loam-soft">
            {hint}
          </span>
        </span>
      </label>
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}
