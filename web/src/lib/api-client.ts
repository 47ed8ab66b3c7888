import type { ApiErrorBody, AuthSession } from '@stavemark/shared';
import { sessionStore } from './session-store';

export const API_BASE = '/api';
export const SESSION_ENDED_NOTICE = 'Your session has ended; please sign in again.';

/** An error answered by the API, carrying its JSON body `{ statusCode, error, message, details? }`. */
export class ApiError extends Error {
  readonly status: number;
  readonly body: ApiErrorBody;
  /** Seconds from a `Retry-After` header (429), when present. */
  readonly retryAfterSeconds: number | undefined;

  constructor(body: ApiErrorBody, retryAfterSeconds?: number) {
    super(body.message);
    this.name = 'ApiError';
    this.status = body.statusCode;
    this.body = body;
    this.retryAfterSeconds = retryAfterSeconds;
  }

  /** Field errors from a validation answer, keyed by field path. */
  get fieldErrors(): { path: string; message: string }[] {
    return Array.isArray(this.body.details) ? this.body.details : [];
  }
}

/** The session could not be renewed; the user is being sent to sign in. */
export class SessionEndedError extends Error {
  constructor() {
    super(SESSION_ENDED_NOTICE);
    this.name = 'SessionEndedError';
  }
}

export type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
  /**
   * false for the sign-in and refresh calls themselves: their 401 means "wrong password" or
   * "no session", not "token expired", so they must not trigger a refresh.
   */
  renewOn401?: boolean;
}

function buildUrl(path: string, query?: Record<string, QueryValue>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const qs = params.toString();
  return `${API_BASE}${path}${qs ? `?${qs}` : ''}`;
}

function parseRetryAfter(header: string | null): number | undefined {
  if (!header) return undefined;
  const seconds = Number(header);
  if (Number.isFinite(seconds)) return Math.max(0, Math.ceil(seconds));
  const date = Date.parse(header); // Retry-After may also be an HTTP date (RFC 9110 §10.2.3)
  return Number.isNaN(date) ? undefined : Math.max(0, Math.ceil((date - Date.now()) / 1000));
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: Partial<ApiErrorBody> | undefined;
  try {
    body = (await response.json()) as Partial<ApiErrorBody>;
  } catch {
    body = undefined; // not JSON (a proxy error page, say): fall back to the status line
  }
  const message =
    typeof body?.message === 'string' && body.message
      ? body.message
      : response.status >= 500
        ? 'The server could not answer. Please try again in a moment.'
        : `The request failed (${response.status}).`;
  return new ApiError(
    {
      statusCode: typeof body?.statusCode === 'number' ? body.statusCode : response.status,
      error: typeof body?.error === 'string' ? body.error : response.statusText,
      message,
      ...(body?.details !== undefined ? { details: body.details } : {}),
    },
    parseRetryAfter(response.headers.get('Retry-After')),
  );
}

async function send(
  path: string,
  options: RequestOptions,
  token: string | null,
): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (token) headers['Authorization'] = `Bearer ${token}`;
  const init: RequestInit = {
    method: options.method ?? 'GET',
    headers,
    credentials: 'include', // the refresh cookie rides along on /api/auth/*
  };
  if (options.body !== undefined) init.body = JSON.stringify(options.body);
  if (options.signal) init.signal = options.signal;
  return fetch(buildUrl(path, options.query), init);
}

async function read<T>(response: Response): Promise<T> {
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

let refreshInFlight: Promise<AuthSession | null> | null = null;

/**
 * Renews the access token from the refresh cookie. Concurrent callers share one request: the
 * refresh token rotates, so a second parallel refresh would present a spent token and the API
 * would treat it as reuse and revoke the whole family.
 */
export function refreshSession(): Promise<AuthSession | null> {
  refreshInFlight ??= (async () => {
    try {
      const response = await send('/auth/refresh', { method: 'POST' }, null);
      if (!response.ok) return null;
      const session = await read<AuthSession>(response);
      sessionStore.start(session);
      return session;
    } catch {
      return null; // network down: treat as "could not renew"
    } finally {
      refreshInFlight = null;
    }
  })();
  return refreshInFlight;
}

/** The one way the web client talks to the API. */
export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const renew = options.renewOn401 ?? true;
  const tokenUsed = sessionStore.getAccessToken();
  let response = await send(path, options, tokenUsed);

  if (response.status === 401 && renew && tokenUsed) {
    // Another request may already have renewed the token while this one was in flight.
    const current = sessionStore.getAccessToken();
    const fresh =
      current && current !== tokenUsed ? current : (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    response = await send(path, options, fresh);
    if (response.status === 401) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
  }

  if (!response.ok) throw await toApiError(response);
  return read<T>(response);
}

/** Tests only. */
export function resetApiClientForTests(): void {
  refreshInFlight = null;
}
