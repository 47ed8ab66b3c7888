import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BandPolicyBody, BandPolicyView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

const bandPolicyKey = ['band-policy'] as const;

export const bandPolicyQueryOptions = () =>
  queryOptions({
    queryKey: bandPolicyKey,
    queryFn: ({ signal }) => apiRequest<BandPolicyView>('/band-policy', { signal }),
  });

export function useBandPolicy() {
  return useQuery(bandPolicyQueryOptions());
}

/** A new version of the policy; sittings already scheduled keep the version they pinned. */
export function useCreateBandPolicyVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BandPolicyBody) =>
      apiRequest<BandPolicyView>('/band-policy', { method: 'POST', body }),
    meta: { inlineErrors: true },
    onSuccess: (view) => queryClient.setQueryData(bandPolicyKey, view),
  });
}
