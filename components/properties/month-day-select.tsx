'use client';

import { Select } from '@/components/ui/field';
import { FieldError } from '@/components/ui/field';
import { MONTH_NAMES } from '@/lib/client/format';

// 29 for February: an average frost date is a day of any year, leap years included.
const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

const pad = (n: number) => String(n).padStart(2, '0');

/**
 * A day that recurs every year, as 'MM-DD', or '' when both parts are empty. A half-filled choice is kept
 * as it is (e.g. '04-') so the schema can say what is missing instead of silently dropping it.
 */
export function MonthDaySelect({
  id,
  legend,
  hint,
  value,
  onChange,
  onBlur,
  error,
}: {
  id: string;
  legend: string;
  hint?: string;
  value: string;
  onChange: (value: string) => void;
  onBlur?: () => void;
  error?: string;
}) {
  const [month = '', day = ''] = (value ?? '').split('-');
  const monthNumber = Number(month);
  const dayCount = DAYS_IN_MONTH[monthNumber - 1] ?? 31;
  const emit = (nextMonth: string, nextDay: string) => onChange(nextMonth || nextDay ? `${nextMonth}-${nextDay}` : '');
  // For these two selects "like 04-15" would puzzle; say what is missing in their own terms.
  const shownError = error && (month === '') !== (day === '') ? `Choose both the month and the day, or leave both empty` : error;
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;

  return (
    <fieldset className="flex flex-col gap-1.5">
      <legend className="mb-1.5 text-sm font-semibold text-loam">
        {legend}
        <span className="ml-1.5 font-normal text-loam-soft">(optional)</span>
      </legend>
      <div className="grid grid-cols-[3fr_2fr] gap-2">
        <div>
          <label htmlFor={`${id}-month`} className="sr-only">
            {legend}: month
          </label>
          <Select
            id={`${id}-month`}
            value={month}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            onBlur={onBlur}
            onChange={(e) => {
              const next = e.target.value;
              const max = DAYS_IN_MONTH[Number(next) - 1] ?? 31;
              emit(next, day && Number(day) > max ? '' : day);
            }}
          >
            <option value="">Month</option>
            {MONTH_NAMES.map((name, i) => (
              <option key={name} value={pad(i + 1)}>
                {name}
              </option>
            ))}
          </Select>
        </div>
        <div>
          <label htmlFor={`${id}-day`} className="sr-only">
            {legend}: day
          </label>
          <Select
            id={`${id}-day`}
            className="tabular"
            value={day}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            onBlur={onBlur}
            onChange={(e) => emit(month, e.target.value)}
          >
            <option value="">Day</option>
            {Array.from({ length: dayCount }, (_, i) => (
              <option key={i} value={pad(i + 1)}>
                {i + 1}
              </option>
            ))}
          </Select>
        </div>
      </div>
      <FieldError id={`${id}-error`} message={shownError} />
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-loam-soft">
          {hint}
        </p>
      ) : null}
    </fieldset>
  );
}
