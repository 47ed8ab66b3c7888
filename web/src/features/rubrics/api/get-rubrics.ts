import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListRubricsQuery, RubricSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** Every rubric query starts with this key, so one invalidation refreshes lists and details. */
export const rubricsKey = ['rubrics'] as const;

export function getRubrics(
  query: ListRubricsQuery,
  signal?: AbortSignal,
): Promise<RubricSummary[]> {
  return apiRequest<RubricSummary[]>('/rubrics', {
    signal,
    query: { kind: query.kind, status: query.status },
  });
}

export const rubricsQueryOptions = (query: ListRubricsQuery = {}) =>
  queryOptions({
    queryKey: [...rubricsKey, 'list', query],
    queryFn: ({ signal }) => getRubrics(query, signal),
  });

export function useRubrics(query: ListRubricsQuery = {}) {
  return useQuery(rubricsQueryOptions(query));
}
