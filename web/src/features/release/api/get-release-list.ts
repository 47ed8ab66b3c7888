import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReleaseListView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { releaseKey } from './keys';

export function getReleaseList(sittingId: string, signal?: AbortSignal): Promise<ReleaseListView> {
  return apiRequest<ReleaseListView>(`/sittings/${encodeURIComponent(sittingId)}/release`, {
    signal,
  });
}

export const releaseListQueryOptions = (sittingId: string) =>
  queryOptions({
    queryKey: releaseKey(sittingId),
    queryFn: ({ signal }) => getReleaseList(sittingId, signal),
  });

export function useReleaseList(sittingId: string) {
  return useQuery(releaseListQueryOptions(sittingId));
}
