import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * Puts an API answer's field errors beside the matching form fields. Returns the message for
 * the form as a whole (errors on no known field, or a non-validation answer), or null.
 */
export function applyApiErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): string | null {
  if (!(error instanceof ApiError))
    return 'The server could not be reached. Nothing was saved; try again.';
  const unplaced: string[] = [];
  for (const detail of error.fieldErrors) {
    const field = fields.find((f) => f === detail.path || detail.path.startsWith(`${f}.`));
    if (field) setError(field, { type: 'server', message: detail.message });
    else unplaced.push(detail.message);
  }
  if (error.fieldErrors.length > 0 && unplaced.length === 0) return null;
  return unplaced.length > 0 ? `${error.message} ${unplaced.join(' ')}` : error.message;
}
