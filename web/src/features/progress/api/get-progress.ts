import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProgressView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** `GET /api/students/{studentId}/progress`: the student's last twelve months. */
export function getProgress(studentId: string, signal?: AbortSignal): Promise<ProgressView> {
  return apiRequest<ProgressView>(`/students/${encodeURIComponent(studentId)}/progress`, { signal });
}

export const progressQueryOptions = (studentId: string) =>
  queryOptions({
    queryKey: ['progress', studentId],
    queryFn: ({ signal }) => getProgress(studentId, signal),
  });

export function useProgress(studentId: string | undefined) {
  return useQuery({ ...progressQueryOptions(studentId ?? ''), enabled: Boolean(studentId) });
}
