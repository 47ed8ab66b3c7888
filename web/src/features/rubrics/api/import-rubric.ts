import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  RUBRIC_FILE_MAX_BYTES,
  type ApiErrorBody,
  type RubricVersionView,
} from '@stavemark/shared';
import {
  API_BASE,
  ApiError,
  refreshSession,
  SessionEndedError,
  SESSION_ENDED_NOTICE,
} from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';
import { rubricsKey } from './get-rubrics';

async function post(form: FormData, token: string | null): Promise<Response> {
  return fetch(`${API_BASE}/rubrics/import`, {
    method: 'POST',
    headers: { Accept: 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) },
    body: form,
    credentials: 'include',
  });
}

/**
 * Uploads a rubric file as multipart form data. The shared API client sends JSON only, so this one
 * call does its own fetch, with the same token renewal on a 401 and the same error shape.
 */
export async function importRubric(file: File): Promise<RubricVersionView> {
  if (file.size > RUBRIC_FILE_MAX_BYTES) {
    throw new ApiError({
      statusCode: 413,
      error: 'Payload Too Large',
      message: `The file is ${Math.ceil(file.size / 1024)} kB; a rubric file may be at most ${RUBRIC_FILE_MAX_BYTES / 1024} kB.`,
    });
  }
  const form = new FormData();
  form.append('file', file, file.name);
  const used = sessionStore.getAccessToken();
  let response = await post(form, used);
  if (response.status === 401 && used) {
    const current = sessionStore.getAccessToken();
    const fresh = current && current !== used ? current : (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    response = await post(form, fresh);
  }
  const body = (await response.json().catch(() => undefined)) as unknown;
  if (!response.ok) {
    const b = (body ?? {}) as Partial<ApiErrorBody>;
    throw new ApiError({
      statusCode: response.status,
      error: b.error ?? response.statusText,
      message: b.message ?? `The upload failed (${response.status}).`,
      ...(b.details !== undefined ? { details: b.details } : {}),
    });
  }
  return body as RubricVersionView;
}

export function useImportRubric() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importRubric,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rubricsKey }),
  });
}
