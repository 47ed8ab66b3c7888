import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MoveSlotInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function moveSlot({
  id,
  input,
}: {
  id: string;
  input: MoveSlotInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}/move`, {
    method: 'POST',
    body: input,
  });
}

export function useMoveSlot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveSlot,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
