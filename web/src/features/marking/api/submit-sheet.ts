import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeskView, SubmitSheetInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { deskQueryOptions } from './get-desk';
import { markingKey } from './get-marking-today';

export function submitSheet(sheetId: string, body: SubmitSheetInput): Promise<DeskView> {
  return apiRequest<DeskView>(`/mark-sheets/${encodeURIComponent(sheetId)}/submit`, {
    method: 'POST',
    body,
  });
}

export function useSubmitSheet(slotId: string, sheetId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SubmitSheetInput) => submitSheet(sheetId, body),
    onSuccess: (desk) => {
      qc.setQueryData(deskQueryOptions(slotId).queryKey, desk);
      void qc.invalidateQueries({ queryKey: [...markingKey, 'today'] });
    },
  });
}
