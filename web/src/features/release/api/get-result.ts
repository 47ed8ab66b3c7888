import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ResultDetail } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { resultKey } from './keys';

export function getResult(resultId: string, signal?: AbortSignal): Promise<ResultDetail> {
  return apiRequest<ResultDetail>(`/results/${encodeURIComponent(resultId)}`, { signal });
}

export const resultQueryOptions = (resultId: string) =>
  queryOptions({
    queryKey: resultKey(resultId),
    queryFn: ({ signal }) => getResult(resultId, signal),
  });

export function useResult(resultId: string) {
  return useQuery(resultQueryOptions(resultId));
}
