import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SittingView, UpdateSlotInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function updateSlot({
  id,
  changes,
}: {
  id: string;
  changes: UpdateSlotInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}`, {
    method: 'PATCH',
    body: changes,
  });
}

export function useUpdateSlot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateSlot,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
