import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddCandidatesInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export type AddCandidatesAnswer = SittingView & {
  added: number;
  skipped: { studentId: string; name: string; reason: string }[];
};

export function addCandidates({
  id,
  input,
}: {
  id: string;
  input: AddCandidatesInput;
}): Promise<AddCandidatesAnswer> {
  return apiRequest<AddCandidatesAnswer>(`/sittings/${encodeURIComponent(id)}/candidates`, {
    method: 'POST',
    body: input,
  });
}

export function useAddCandidates() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addCandidates,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
