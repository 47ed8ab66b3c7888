import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RubricVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

export function getRubricVersion(id: string, signal?: AbortSignal): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>(`/rubric-versions/${encodeURIComponent(id)}`, { signal });
}

export const rubricVersionQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...rubricsKey, 'version', id],
    queryFn: ({ signal }) => getRubricVersion(id, signal),
  });

export function useRubricVersion(id: string | undefined) {
  return useQuery({ ...rubricVersionQueryOptions(id ?? ''), enabled: id !== undefined });
}
