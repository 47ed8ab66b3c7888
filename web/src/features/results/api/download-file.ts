import {
  API_BASE,
  ApiError,
  refreshSession,
  SESSION_ENDED_NOTICE,
  SessionEndedError,
  type QueryValue,
} from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

export interface DownloadProgress {
  bytes: number;
  /** Lines received so far, less the header line (CSV only). */
  rows: number;
  /** Data rows the server said it would send (X-Expected-Rows), when it knows. */
  expectedRows: number | null;
}

function url(path: string, query?: Record<string, QueryValue>): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query ?? {})) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const qs = params.toString();
  return `${API_BASE}${path}${qs ? `?${qs}` : ''}`;
}

/** GET with the bearer token and the same one silent refresh on 401 as the JSON client. */
async function get(path: string, query: Record<string, QueryValue> | undefined, signal?: AbortSignal): Promise<Response> {
  const send = (token: string | null) =>
    fetch(url(path, query), { headers: token ? { Authorization: `Bearer ${token}` } : {}, credentials: 'include', ...(signal ? { signal } : {}) });
  const used = sessionStore.getAccessToken();
  let res = await send(used);
  if (res.status === 401 && used) {
    const fresh = (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    res = await send(fresh);
  }
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as { message?: string; error?: string; details?: { path: string; message: string }[] } | null;
    throw new ApiError({
      statusCode: res.status,
      error: body?.error ?? 'Error',
      message: body?.message ?? `The download failed (${res.status}).`,
      ...(body?.details ? { details: body.details } : {}),
    });
  }
  return res;
}

/**
 * Downloads a file from the API, reading the body as a stream so a long export can show how far
 * it has come (bytes, and CSV lines counted as they arrive), then hands it to the browser.
 */
export async function downloadFile(
  path: string,
  options: { query?: Record<string, QueryValue>; fallbackName: string; onProgress?: (p: DownloadProgress) => void; signal?: AbortSignal },
): Promise<DownloadProgress> {
  const res = await get(path, options.query, options.signal);
  const expected = res.headers.get('X-Expected-Rows');
  const progress: DownloadProgress = { bytes: 0, rows: 0, expectedRows: expected === null ? null : Number(expected) };
  const chunks: Uint8Array[] = [];
  let lines = 0;
  if (res.body) {
    const reader = res.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks.push(value);
      progress.bytes += value.length;
      for (let i = value.indexOf(10); i !== -1; i = value.indexOf(10, i + 1)) lines++;
      progress.rows = Math.max(0, lines - 1);
      options.onProgress?.({ ...progress });
    }
  } else {
    chunks.push(new Uint8Array(await res.arrayBuffer()));
  }
  if (progress.expectedRows !== null && progress.rows < progress.expectedRows) {
    throw new Error(`The download stopped early: ${progress.rows} of ${progress.expectedRows} rows arrived. Please try again.`);
  }
  const name = /filename="([^"]+)"/.exec(res.headers.get('Content-Disposition') ?? '')?.[1] ?? options.fallbackName;
  const blob = new Blob(chunks as BlobPart[], { type: res.headers.get('Content-Type') ?? 'application/octet-stream' });
  const href = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = href;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(href), 1000);
  return progress;
}
