import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangeSittingStatusInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function changeStatus({
  id,
  input,
}: {
  id: string;
  input: ChangeSittingStatusInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/sittings/${encodeURIComponent(id)}/status`, {
    method: 'POST',
    body: input,
  });
}

export function useChangeStatus() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeStatus,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
