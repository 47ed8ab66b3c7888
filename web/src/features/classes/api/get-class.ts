import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassDetail } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey } from './keys';

export function getClass(id: string, signal?: AbortSignal): Promise<ClassDetail> {
  return apiRequest<ClassDetail>(`/classes/${encodeURIComponent(id)}`, { signal });
}

export const classQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...classesKey, 'detail', id],
    queryFn: ({ signal }) => getClass(id, signal),
  });

export function useClass(id: string) {
  return useQuery(classQueryOptions(id));
}
