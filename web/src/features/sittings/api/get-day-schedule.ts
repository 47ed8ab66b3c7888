import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DaySchedule } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function getDaySchedule(date: string, signal?: AbortSignal): Promise<DaySchedule> {
  return apiRequest<DaySchedule>('/day-schedule', { signal, query: { date } });
}

export const dayScheduleQueryOptions = (date: string) =>
  queryOptions({
    queryKey: [...sittingsKey, 'day', date],
    queryFn: ({ signal }) => getDaySchedule(date, signal),
  });

export function useDaySchedule(date: string) {
  return useQuery(dayScheduleQueryOptions(date));
}
