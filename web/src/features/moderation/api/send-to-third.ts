import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ModerationView, ThirdMarkerInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { moderationKey } from './keys';

export function sendToThird({
  slotId,
  input,
}: {
  slotId: string;
  input: ThirdMarkerInput;
}): Promise<ModerationView> {
  return apiRequest<ModerationView>(
    `/moderation/slots/${encodeURIComponent(slotId)}/third-marker`,
    { method: 'POST', body: input },
  );
}

export function useSendToThird(sittingId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendToThird,
    meta: { inlineErrors: true },
    onSuccess: (view) => queryClient.setQueryData(moderationKey(sittingId), view),
  });
}
