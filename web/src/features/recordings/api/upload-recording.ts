import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiErrorBody, RecordingView } from '@stavemark/shared';
import {
  API_BASE,
  ApiError,
  refreshSession,
  SessionEndedError,
  SESSION_ENDED_NOTICE,
} from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';
import { recordingsKey } from './get-slot-recordings';

export interface UploadInput {
  /** `/slots/<id>/recordings` or `/students/<id>/recordings`. */
  path: string;
  file: File;
  durationSeconds?: number | null;
  maxBytes: number;
  onProgress?: (fraction: number) => void;
}

function post(input: UploadInput, token: string | null): Promise<{ status: number; body: unknown }> {
  // XMLHttpRequest, not fetch: only it reports upload progress, which a large video needs.
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${API_BASE}${input.path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) input.onProgress?.(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        body = undefined;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () =>
      reject(
        new ApiError({
          statusCode: 0,
          error: 'Network error',
          message: 'The upload stopped: the connection dropped. Nothing was kept; please try again.',
        }),
      );
    const form = new FormData();
    if (input.durationSeconds != null && Number.isFinite(input.durationSeconds))
      form.append('durationSeconds', String(Math.round(input.durationSeconds * 1000) / 1000));
    form.append('file', input.file, input.file.name);
    xhr.send(form);
  });
}

/** Uploads one recording as multipart form data, renewing the token once on a 401 like the API client. */
export async function uploadRecording(input: UploadInput): Promise<RecordingView> {
  if (input.file.size > input.maxBytes) {
    throw new ApiError({
      statusCode: 413,
      error: 'Payload Too Large',
      message: `The file is ${(input.file.size / 1024 / 1024).toFixed(1)} MB; a recording may be at most ${Math.round(input.maxBytes / 1024 / 1024)} MB.`,
    });
  }
  if (input.file.size === 0) {
    throw new ApiError({ statusCode: 400, error: 'Bad Request', message: 'The file is empty.' });
  }
  const used = sessionStore.getAccessToken();
  let res = await post(input, used);
  if (res.status === 401 && used) {
    const current = sessionStore.getAccessToken();
    const fresh = current && current !== used ? current : (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    res = await post(input, fresh);
  }
  if (res.status < 200 || res.status >= 300) {
    const b = (res.body ?? {}) as Partial<ApiErrorBody>;
    throw new ApiError({
      statusCode: res.status,
      error: b.error ?? 'Error',
      message: b.message ?? `The upload failed (${res.status}).`,
      ...(b.details !== undefined ? { details: b.details } : {}),
    });
  }
  return res.body as RecordingView;
}

export function useUploadRecording() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadRecording,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: recordingsKey }),
  });
}
