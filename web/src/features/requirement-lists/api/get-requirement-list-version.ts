import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RequirementListVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

export function getRequirementListVersion(
  id: string,
  signal?: AbortSignal,
): Promise<RequirementListVersionView> {
  return apiRequest<RequirementListVersionView>(
    `/requirement-list-versions/${encodeURIComponent(id)}`,
    { signal },
  );
}

export const requirementListVersionQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...requirementListsKey, 'version', id],
    queryFn: ({ signal }) => getRequirementListVersion(id, signal),
  });

export function useRequirementListVersion(id: string | undefined) {
  return useQuery({ ...requirementListVersionQueryOptions(id ?? ''), enabled: id !== undefined });
}
