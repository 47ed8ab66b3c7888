import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiErrorBody, ExerciseView } from '@stavemark/shared';
import { API_BASE, ApiError, refreshSession, SessionEndedError, SESSION_ENDED_NOTICE } from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';
import { exerciseKey, standardisationKey } from './keys';

/** The server's limit (standardisation.service.ts), checked here first so a large file is not sent for nothing. */
export const RECORDING_MAX_BYTES = 50 * 1024 * 1024;

async function post(id: string, form: FormData, token: string | null): Promise<Response> {
  return fetch(`${API_BASE}/standardisation/exercises/${encodeURIComponent(id)}/recording`, {
    method: 'POST',
    headers: { Accept: 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) },
    body: form,
    credentials: 'include',
  });
}

/** Multipart upload: the shared client sends JSON only, so this call renews its token itself. */
export async function uploadRecording({ id, file }: { id: string; file: File }): Promise<ExerciseView> {
  if (file.size > RECORDING_MAX_BYTES)
    throw new ApiError({ statusCode: 413, error: 'Payload Too Large', message: `The file is ${Math.ceil(file.size / 1048576)} MB; a recording may be at most 50 MB.` });
  const form = new FormData();
  form.append('file', file, file.name);
  const used = sessionStore.getAccessToken();
  let response = await post(id, form, used);
  if (response.status === 401 && used) {
    const current = sessionStore.getAccessToken();
    const fresh = current && current !== used ? current : (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    response = await post(id, form, fresh);
  }
  const body = (await response.json().catch(() => undefined)) as unknown;
  if (!response.ok) {
    const b = (body ?? {}) as Partial<ApiErrorBody>;
    throw new ApiError({ statusCode: response.status, error: b.error ?? response.statusText, message: b.message ?? `The upload failed (${response.status}).` });
  }
  return body as ExerciseView;
}

export function useUploadRecording() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadRecording,
    meta: { inlineErrors: true },
    onSuccess: (view) => {
      queryClient.setQueryData(exerciseKey(view.id), view);
      void queryClient.invalidateQueries({ queryKey: [...standardisationKey, 'recording', view.id] });
      void queryClient.invalidateQueries({ queryKey: [...standardisationKey, 'list'] });
    },
  });
}
