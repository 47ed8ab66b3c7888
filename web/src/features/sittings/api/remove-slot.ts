import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function removeSlot(id: string): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}`, { method: 'DELETE' });
}

export function useRemoveSlot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeSlot,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
