import type { ApiErrorBody, ImportReport } from '@stavemark/shared';
import {
  API_BASE,
  ApiError,
  apiRequest,
  refreshSession,
  SESSION_ENDED_NOTICE,
  SessionEndedError,
} from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

// Uploads and downloads of files. The shared API client speaks JSON through fetch; a file upload
// needs XMLHttpRequest for upload progress, and a download needs the bytes. Both use the same
// in-memory token and the same one silent refresh on 401.

export interface TransferProgress {
  /** Sending the file, then waiting while the server checks or applies it. */
  phase: 'uploading' | 'processing';
  /** 0–1 while uploading, and while the server works as it reports; null when not known yet. */
  fraction: number | null;
  /** What the server is doing, in its words (while processing). */
  step?: string;
}

/** GET /api/classes/import/progress/{id}: how far the server has come. */
interface ServerProgress {
  phase: 'reading' | 'checking' | 'writing' | 'done';
  done: number;
  total: number;
  step: string;
}

/** Checking rows is the first half of the bar, writing the second (a dry run only checks). */
export function processingFraction(p: ServerProgress, dryRun: boolean): number | null {
  if (p.phase === 'done') return 1;
  if (p.phase === 'reading') return 0;
  if (p.total <= 0) return null;
  const part = Math.min(1, p.done / p.total);
  if (dryRun) return p.phase === 'checking' ? part : 1;
  return p.phase === 'checking' ? part / 2 : 0.5 + part / 2;
}

function toApiError(status: number, text: string): ApiError {
  let body: Partial<ApiErrorBody> | undefined;
  try {
    body = JSON.parse(text) as Partial<ApiErrorBody>;
  } catch {
    body = undefined;
  }
  return new ApiError({
    statusCode: body?.statusCode ?? status,
    error: body?.error ?? 'Error',
    message:
      body?.message ??
      (status >= 500
        ? 'The server could not answer. Please try again in a moment.'
        : `The request failed (${status}).`),
    ...(body?.details !== undefined ? { details: body.details } : {}),
  });
}

/** Runs `attempt` with the current token, once more after a silent refresh if it answers 401. */
async function withRenewal<T>(
  attempt: (token: string | null) => Promise<{ status: number; value: T }>,
): Promise<T> {
  const used = sessionStore.getAccessToken();
  let result = await attempt(used);
  if (result.status === 401 && used) {
    const fresh = (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    result = await attempt(fresh);
  }
  return result.value;
}

function xhrUpload(
  path: string,
  form: FormData,
  token: string | null,
  onProgress: (p: TransferProgress) => void,
) {
  return new Promise<{ status: number; text: string }>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${API_BASE}${path}`);
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (e) =>
      onProgress({ phase: 'uploading', fraction: e.lengthComputable ? e.loaded / e.total : null });
    xhr.upload.onload = () => onProgress({ phase: 'processing', fraction: null });
    xhr.onload = () => resolve({ status: xhr.status, text: xhr.responseText });
    xhr.onerror = () => reject(new Error('network'));
    xhr.send(form);
  });
}

/**
 * POST /api/classes/import with the file; resolves with the report or rejects with the API's
 * error. Upload progress comes from XMLHttpRequest; once the file is sent, the server's own
 * progress is polled (through the API client, so its token renewal applies) until the answer.
 */
export function importClassList(
  file: File,
  dryRun: boolean,
  onProgress: (p: TransferProgress) => void = () => {},
  pollMs = 400,
): Promise<ImportReport> {
  const progressId = crypto.randomUUID();
  const form = new FormData();
  form.append('progressId', progressId); // before the file, so the server has it when the file arrives
  form.append('file', file, file.name);
  return withRenewal(async (token) => {
    onProgress({ phase: 'uploading', fraction: 0 });
    let finished = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const poll = async () => {
      try {
        const p = await apiRequest<ServerProgress>(`/classes/import/progress/${progressId}`);
        if (!finished)
          onProgress({ phase: 'processing', fraction: processingFraction(p, dryRun), step: p.step });
      } catch {
        // Not known (yet, or on another server): the bar stays as it is.
      }
      if (!finished) timer = setTimeout(() => void poll(), pollMs);
    };
    const res = await xhrUpload(
      `/classes/import${dryRun ? '?dryRun=true' : ''}`,
      form,
      token,
      (p) => {
        onProgress(p);
        if (p.phase === 'processing' && timer === undefined && !finished)
          timer = setTimeout(() => void poll(), pollMs);
      },
    ).finally(() => {
      finished = true;
      clearTimeout(timer);
    });
    if (res.status === 401) return { status: 401, value: undefined as unknown as ImportReport };
    if (res.status < 200 || res.status >= 300) throw toApiError(res.status, res.text);
    return { status: res.status, value: JSON.parse(res.text) as ImportReport };
  });
}

/** Fetches a file the API serves behind the bearer token and hands it to the browser as a download. */
export async function downloadFile(path: string, fallbackName: string): Promise<void> {
  const blob = await withRenewal(async (token) => {
    const res = await fetch(`${API_BASE}${path}`, {
      headers: token ? { Authorization: `Bearer ${token}` } : {},
      credentials: 'include',
    });
    if (res.status === 401) return { status: 401, value: null };
    if (!res.ok) throw toApiError(res.status, await res.text());
    const name =
      /filename="([^"]+)"/.exec(res.headers.get('Content-Disposition') ?? '')?.[1] ?? fallbackName;
    return { status: res.status, value: { blob: await res.blob(), name } };
  });
  if (!blob) return;
  const url = URL.createObjectURL(blob.blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = blob.name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
