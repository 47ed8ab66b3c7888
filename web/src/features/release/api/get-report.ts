import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TakeHomeReport } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { reportKey } from './keys';

export function getReport(resultId: string, signal?: AbortSignal): Promise<TakeHomeReport> {
  return apiRequest<TakeHomeReport>(`/results/${encodeURIComponent(resultId)}/report`, { signal });
}

export const reportQueryOptions = (resultId: string) =>
  queryOptions({
    queryKey: reportKey(resultId),
    queryFn: ({ signal }) => getReport(resultId, signal),
  });

export function useReport(resultId: string) {
  return useQuery(reportQueryOptions(resultId));
}
