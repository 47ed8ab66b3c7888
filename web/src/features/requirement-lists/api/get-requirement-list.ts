import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RequirementListDetail } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

export function getRequirementList(
  id: string,
  signal?: AbortSignal,
): Promise<RequirementListDetail> {
  return apiRequest<RequirementListDetail>(`/requirement-lists/${encodeURIComponent(id)}`, {
    signal,
  });
}

export const requirementListQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...requirementListsKey, 'detail', id],
    queryFn: ({ signal }) => getRequirementList(id, signal),
  });

export function useRequirementList(id: string) {
  return useQuery(requirementListQueryOptions(id));
}
