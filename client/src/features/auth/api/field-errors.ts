/** Puts the server's field errors (400 details) onto the form's fields, and returns the rest as one message. */
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, OfflineError } from '@client/lib/api-client';

export function applyServerErrors<T extends FieldValues>(error: unknown, fields: readonly Path<T>[], setError: UseFormSetError<T>): string | null {
  if (error instanceof OfflineError) return 'No connection. Try again when the device has a network.';
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  let placed = false;
  if (Array.isArray(error.details)) {
    for (const d of error.details as Array<{ path?: string; message?: string }>) {
      const field = fields.find((f) => f === d.path);
      if (field && d.message) {
        setError(field, { type: 'server', message: d.message });
        placed = true;
      }
    }
  }
  return placed ? null : error.message;
}
