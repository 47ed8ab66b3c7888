import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RubricVersionView, StarterLibraryView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

/** The same key on the Requirement lists page, so one answer serves both. */
export const starterLibraryKey = ['starter-library'] as const;

export const starterLibraryQueryOptions = () =>
  queryOptions({
    queryKey: starterLibraryKey,
    queryFn: ({ signal }) => apiRequest<StarterLibraryView>('/starter-library', { signal }),
  });

export function useStarterRubrics(enabled: boolean) {
  return useQuery({ ...starterLibraryQueryOptions(), select: (v) => v.rubrics, enabled });
}

export function adoptStarterRubric(key: string): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>('/starter-library/rubrics', {
    method: 'POST',
    body: { key },
  });
}

export function useAdoptStarterRubric() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: adoptStarterRubric,
    meta: { inlineErrors: true },
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: rubricsKey }),
        queryClient.invalidateQueries({ queryKey: starterLibraryKey }),
      ]),
  });
}
