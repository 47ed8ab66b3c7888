import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListSittingsQuery, SittingSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function getSittings(
  query: Partial<ListSittingsQuery>,
  signal?: AbortSignal,
): Promise<SittingSummary[]> {
  return apiRequest<SittingSummary[]>('/sittings', { signal, query: { ...query } });
}

export const sittingsQueryOptions = (query: Partial<ListSittingsQuery> = {}) =>
  queryOptions({
    queryKey: [...sittingsKey, 'list', query],
    queryFn: ({ signal }) => getSittings(query, signal),
  });

export function useSittings(query: Partial<ListSittingsQuery> = {}) {
  return useQuery(sittingsQueryOptions(query));
}
