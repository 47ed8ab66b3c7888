import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SittingSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { resultsKey } from './keys';

/** Sittings whose marking has closed: the ones with results to show. */
export async function getClosedSittings(signal?: AbortSignal): Promise<SittingSummary[]> {
  const all = await apiRequest<SittingSummary[]>('/sittings', { signal });
  return all.filter((s) => s.status === 'marking_closed' || s.status === 'published').sort((a, b) => b.date.localeCompare(a.date));
}

export const closedSittingsQueryOptions = () =>
  queryOptions({ queryKey: [...resultsKey, 'closed-sittings'], queryFn: ({ signal }) => getClosedSittings(signal) });

export function useClosedSittings() {
  return useQuery(closedSittingsQueryOptions());
}
