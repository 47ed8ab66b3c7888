import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingKey } from './keys';

export function getSitting(id: string, signal?: AbortSignal): Promise<SittingView> {
  return apiRequest<SittingView>(`/sittings/${encodeURIComponent(id)}`, { signal });
}

export const sittingQueryOptions = (id: string) =>
  queryOptions({ queryKey: sittingKey(id), queryFn: ({ signal }) => getSitting(id, signal) });

export function useSitting(id: string) {
  return useQuery(sittingQueryOptions(id));
}
