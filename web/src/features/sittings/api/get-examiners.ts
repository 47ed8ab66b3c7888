import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ExaminerOption } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function getExaminers(signal?: AbortSignal): Promise<ExaminerOption[]> {
  return apiRequest<ExaminerOption[]>('/examiners', { signal });
}

export const examinersQueryOptions = () =>
  queryOptions({
    queryKey: [...sittingsKey, 'examiners'],
    queryFn: ({ signal }) => getExaminers(signal),
    staleTime: 5 * 60_000,
  });

export function useExaminers(enabled = true) {
  return useQuery({ ...examinersQueryOptions(), enabled });
}
