import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListRequirementListsQuery, RequirementListSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export const requirementListsKey = ['requirement-lists'] as const;

export function getRequirementLists(
  query: ListRequirementListsQuery,
  signal?: AbortSignal,
): Promise<RequirementListSummary[]> {
  return apiRequest<RequirementListSummary[]>('/requirement-lists', {
    signal,
    query: { grade: query.grade, status: query.status },
  });
}

export const requirementListsQueryOptions = (query: ListRequirementListsQuery = {}) =>
  queryOptions({
    queryKey: [...requirementListsKey, 'list', query],
    queryFn: ({ signal }) => getRequirementLists(query, signal),
  });

export function useRequirementLists(query: ListRequirementListsQuery = {}) {
  return useQuery(requirementListsQueryOptions(query));
}
