import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AttentionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** `GET /api/attention`: the caller's students who need a look, with the evidence. */
export function getAttention(signal?: AbortSignal): Promise<AttentionView> {
  return apiRequest<AttentionView>('/attention', { signal });
}

export const attentionQueryOptions = () =>
  queryOptions({ queryKey: ['attention'], queryFn: ({ signal }) => getAttention(signal) });

export function useAttention() {
  return useQuery(attentionQueryOptions());
}
