import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ResultSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { myResultsKey } from './keys';

export function getMyResults(signal?: AbortSignal): Promise<ResultSummary[]> {
  return apiRequest<ResultSummary[]>('/me/results', { signal });
}

export const myResultsQueryOptions = () =>
  queryOptions({ queryKey: myResultsKey, queryFn: ({ signal }) => getMyResults(signal) });

export function useMyResults() {
  return useQuery(myResultsQueryOptions());
}
