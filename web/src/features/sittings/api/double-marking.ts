import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DoubleMarkingInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export type DoubleMarkingAnswer = SittingView & {
  notAssigned: { slotId: string; candidate: string; reason: string }[];
};

export function doubleMarking({
  id,
  input,
}: {
  id: string;
  input: DoubleMarkingInput;
}): Promise<DoubleMarkingAnswer> {
  return apiRequest<DoubleMarkingAnswer>(`/sittings/${encodeURIComponent(id)}/double-marking`, {
    method: 'POST',
    body: input,
  });
}

export function useDoubleMarking() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: doubleMarking,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
