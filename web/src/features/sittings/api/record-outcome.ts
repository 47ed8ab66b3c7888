import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecordOutcomeInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function recordOutcome({
  id,
  input,
}: {
  id: string;
  input: RecordOutcomeInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}/outcome`, {
    method: 'POST',
    body: input,
  });
}

export function useRecordOutcome() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordOutcome,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
