import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateResitInput, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function createResit({
  id,
  input,
}: {
  id: string;
  input: CreateResitInput;
}): Promise<SittingView> {
  return apiRequest<SittingView>(`/slots/${encodeURIComponent(id)}/resit`, {
    method: 'POST',
    body: input,
  });
}

export function useCreateResit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createResit,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
