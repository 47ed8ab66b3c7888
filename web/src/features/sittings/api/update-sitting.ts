import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SittingView, UpdateSittingInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function updateSitting({
  id,
  changes,
}: {
  id: string;
  changes: UpdateSittingInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/sittings/${encodeURIComponent(id)}`, {
    method: 'PATCH',
    body: changes,
  });
}

export function useUpdateSitting() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateSitting,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
