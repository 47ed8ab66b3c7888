import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RubricDetail } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

export function getRubric(id: string, signal?: AbortSignal): Promise<RubricDetail> {
  return apiRequest<RubricDetail>(`/rubrics/${encodeURIComponent(id)}`, { signal });
}

export const rubricQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...rubricsKey, 'detail', id],
    queryFn: ({ signal }) => getRubric(id, signal),
  });

export function useRubric(id: string) {
  return useQuery(rubricQueryOptions(id));
}
