import { ApiError } from '@/lib/api-client';
import { Alert } from './Alert';

/** A page's load error, in words: the API's own message when it gave one. */
export function ErrorMessage({ error, what }: { error: unknown; what: string }) {
  const detail =
    error instanceof ApiError
      ? error.message
      : 'The server could not be reached. Check the connection and try again.';
  return (
    <Alert severity="error">
      Could not load {what}. {detail}
    </Alert>
  );
}
