import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReleaseResultsInput, ReleaseSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { releaseKey } from './keys';

export function releaseResults({
  sittingId,
  input,
}: {
  sittingId: string;
  input: ReleaseResultsInput;
}): Promise<ReleaseSummary> {
  return apiRequest<ReleaseSummary>(`/sittings/${encodeURIComponent(sittingId)}/release`, {
    method: 'POST',
    body: input,
  });
}

export function useReleaseResults(sittingId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: releaseResults,
    meta: { inlineErrors: true },
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: releaseKey(sittingId) }),
        // The sitting may now be published; moderation shows the released state.
        queryClient.invalidateQueries({ queryKey: ['sittings'] }),
        queryClient.invalidateQueries({ queryKey: ['moderation', sittingId] }),
      ]),
  });
}
