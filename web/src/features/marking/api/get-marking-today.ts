import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MarkingSittingSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export const markingKey = ['marking'] as const;

export function getMarkingToday(signal?: AbortSignal): Promise<MarkingSittingSummary[]> {
  return apiRequest<MarkingSittingSummary[]>('/marking/today', { signal });
}

export const markingTodayQueryOptions = () =>
  queryOptions({
    queryKey: [...markingKey, 'today'],
    queryFn: ({ signal }) => getMarkingToday(signal),
  });

export function useMarkingToday() {
  return useQuery(markingTodayQueryOptions());
}
