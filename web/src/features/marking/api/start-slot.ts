import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeskView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { deskQueryOptions } from './get-desk';
import { markingKey } from './get-marking-today';

export function startSlot(slotId: string): Promise<DeskView> {
  return apiRequest<DeskView>(`/slots/${encodeURIComponent(slotId)}/start`, { method: 'POST' });
}

/** Opens a scheduled sitting on its day (the sittings API allows the examiner on the panel). */
export function openSitting(sittingId: string): Promise<unknown> {
  return apiRequest(`/sittings/${encodeURIComponent(sittingId)}/status`, {
    method: 'POST',
    body: { status: 'in_progress' },
  });
}

export function useStartSlot(slotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => startSlot(slotId),
    onSuccess: (desk) => {
      qc.setQueryData(deskQueryOptions(slotId).queryKey, desk);
      void qc.invalidateQueries({ queryKey: [...markingKey, 'today'] });
    },
  });
}

export function useOpenSitting() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: openSitting,
    onSuccess: () => qc.invalidateQueries({ queryKey: markingKey }),
  });
}
