import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassResultsView, ResultsPeriodQuery } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { resultsKey } from './keys';

export function getClassResults(classId: string, period: ResultsPeriodQuery, signal?: AbortSignal): Promise<ClassResultsView> {
  return apiRequest<ClassResultsView>(`/classes/${encodeURIComponent(classId)}/results`, { query: { ...period }, signal });
}

export const classResultsQueryOptions = (classId: string, period: ResultsPeriodQuery) =>
  queryOptions({
    queryKey: [...resultsKey, 'class', classId, period.from ?? '', period.to ?? ''],
    queryFn: ({ signal }) => getClassResults(classId, period, signal),
  });

export function useClassResults(classId: string, period: ResultsPeriodQuery) {
  return useQuery(classResultsQueryOptions(classId, period));
}
