import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SittingResultsView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { resultsKey } from './keys';

export function getSittingResults(sittingId: string, signal?: AbortSignal): Promise<SittingResultsView> {
  return apiRequest<SittingResultsView>(`/sittings/${encodeURIComponent(sittingId)}/results`, { signal });
}

export const sittingResultsQueryOptions = (sittingId: string) =>
  queryOptions({
    queryKey: [...resultsKey, 'sitting', sittingId],
    queryFn: ({ signal }) => getSittingResults(sittingId, signal),
  });

export function useSittingResults(sittingId: string) {
  return useQuery(sittingResultsQueryOptions(sittingId));
}
