import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, errorMessage } from './api';

/**
 * Puts the server's per-field messages under the fields they belong to and returns the message for the
 * top of the form. Messages for fields the form does not show stay in that top message.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  fieldNames: readonly string[],
  setError: UseFormSetError<T>,
): string {
  if (!(error instanceof ApiError)) return errorMessage(error);
  let first = true;
  const unplaced: string[] = [];
  for (const [field, message] of Object.entries(error.fields)) {
    if (fieldNames.includes(field)) {
      setError(field as Path<T>, { type: 'server', message }, { shouldFocus: first });
      first = false;
    } else {
      unplaced.push(message);
    }
  }
  if (Object.keys(error.fields).length > 0 && unplaced.length === 0) return 'Nothing was saved. Check the fields marked below.';
  return unplaced.length ? `Nothing was saved: ${unplaced.join('; ')}` : error.message;
}

/** JSON has no NaN: an emptied number input is sent as null, which the shared schema reads as "not given". */
export function withoutNaN<T extends Record<string, unknown>>(values: T): Record<string, unknown> {
  return Object.fromEntries(
    Object.entries(values).map(([key, value]) => [key, typeof value === 'number' && Number.isNaN(value) ? null : value]),
  );
}
