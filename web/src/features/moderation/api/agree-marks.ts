import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AgreeMarksInput, ModerationView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { moderationKey } from './keys';

export function agreeMarks({
  slotId,
  input,
}: {
  slotId: string;
  input: AgreeMarksInput;
}): Promise<ModerationView> {
  return apiRequest<ModerationView>(`/moderation/slots/${encodeURIComponent(slotId)}/agree`, {
    method: 'POST',
    body: input,
  });
}

export function useAgreeMarks(sittingId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: agreeMarks,
    meta: { inlineErrors: true },
    onSuccess: (view) => queryClient.setQueryData(moderationKey(sittingId), view),
  });
}
