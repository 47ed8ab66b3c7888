import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CorrectCellInput, SaveResult } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { deskQueryOptions } from './get-desk';

export function correctCell(sheetId: string, body: CorrectCellInput): Promise<SaveResult> {
  return apiRequest<SaveResult>(`/mark-sheets/${encodeURIComponent(sheetId)}/corrections`, {
    method: 'POST',
    body,
  });
}

/** A correction to a submitted sheet; the desk is reloaded to show the corrected value. */
export function useCorrectCell(slotId: string, sheetId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CorrectCellInput) => correctCell(sheetId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: deskQueryOptions(slotId).queryKey }),
  });
}
