import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModerationView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { moderationKey } from './keys';

export function getModeration(sittingId: string, signal?: AbortSignal): Promise<ModerationView> {
  return apiRequest<ModerationView>(`/sittings/${encodeURIComponent(sittingId)}/moderation`, {
    signal,
  });
}

export const moderationQueryOptions = (sittingId: string) =>
  queryOptions({
    queryKey: moderationKey(sittingId),
    queryFn: ({ signal }) => getModeration(sittingId, signal),
  });

export function useModeration(sittingId: string) {
  return useQuery(moderationQueryOptions(sittingId));
}
