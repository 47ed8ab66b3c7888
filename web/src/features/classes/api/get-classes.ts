import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassRow } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { classesKey } from './keys';

export function getClasses(signal?: AbortSignal): Promise<ClassRow[]> {
  return apiRequest<ClassRow[]>('/classes', { signal });
}

export const classesQueryOptions = () =>
  queryOptions({ queryKey: [...classesKey, 'list'], queryFn: ({ signal }) => getClasses(signal) });

export function useClasses() {
  return useQuery(classesQueryOptions());
}
