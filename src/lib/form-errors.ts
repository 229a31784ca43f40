import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * Puts the server's field errors on the form's fields; returns the message for the whole
 * form (or null when every error found its field).
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: readonly Path<T>[]): string | null {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  let unplaced = false;
  const entries = Object.entries(error.fields);
  for (const [key, message] of entries) {
    if ((fields as readonly string[]).includes(key)) setError(key as Path<T>, { type: 'server', message });
    else unplaced = true;
  }
  return entries.length === 0 || unplaced ? error.message : null;
}
