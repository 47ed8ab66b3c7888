import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { StarterLibraryView, StarterListAdoption } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

/** The same key on the Rubrics page, so one answer serves both. */
const starterLibraryKey = ['starter-library'] as const;

export const starterLibraryQueryOptions = () =>
  queryOptions({
    queryKey: starterLibraryKey,
    queryFn: ({ signal }) => apiRequest<StarterLibraryView>('/starter-library', { signal }),
  });

export function useStarterLists(enabled: boolean) {
  return useQuery({ ...starterLibraryQueryOptions(), select: (v) => v.requirementLists, enabled });
}

export function adoptStarterList(key: string): Promise<StarterListAdoption> {
  return apiRequest<StarterListAdoption>('/starter-library/requirement-lists', {
    method: 'POST',
    body: { key },
  });
}

/** A list may bring starter rubrics with it: rubric choices refresh too. */
export function useAdoptStarterList() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: adoptStarterList,
    meta: { inlineErrors: true },
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: requirementListsKey }),
        queryClient.invalidateQueries({ queryKey: ['rubrics'] }),
        queryClient.invalidateQueries({ queryKey: starterLibraryKey }),
      ]),
  });
}
