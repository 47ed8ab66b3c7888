import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangeRequestInput, DeskView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { deskQueryOptions } from './get-desk';

export function changeRequest(slotId: string, body: ChangeRequestInput): Promise<DeskView> {
  return apiRequest<DeskView>(`/slots/${encodeURIComponent(slotId)}/request-changes`, {
    method: 'POST',
    body,
  });
}

export function useChangeRequest(slotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ChangeRequestInput) => changeRequest(slotId, body),
    onSuccess: (desk) => qc.setQueryData(deskQueryOptions(slotId).queryKey, desk),
  });
}
