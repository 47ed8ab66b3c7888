import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SittingView, SwapSlotsInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function swapSlots({
  id,
  input,
}: {
  id: string;
  input: SwapSlotsInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}/swap`, {
    method: 'POST',
    body: input,
  });
}

export function useSwapSlots() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: swapSlots,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
