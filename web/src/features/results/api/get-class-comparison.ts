import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassComparisonView, ResultsPeriodQuery } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { resultsKey } from './keys';

export function getClassComparison(period: ResultsPeriodQuery, signal?: AbortSignal): Promise<ClassComparisonView> {
  return apiRequest<ClassComparisonView>('/results/classes', { query: { ...period }, signal });
}

export const classComparisonQueryOptions = (period: ResultsPeriodQuery) =>
  queryOptions({
    queryKey: [...resultsKey, 'comparison', period.from ?? '', period.to ?? ''],
    queryFn: ({ signal }) => getClassComparison(period, signal),
  });

export function useClassComparison(period: ResultsPeriodQuery) {
  return useQuery(classComparisonQueryOptions(period));
}
