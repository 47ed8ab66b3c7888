import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSittingBody, SittingView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

export function createSitting(body: CreateSittingBody): Promise<SittingView> {
  return apiRequest<SittingView>('/sittings', { method: 'POST', body });
}

export function useCreateSitting() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSitting,
    // The form shows conflicts and field errors itself.
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sittingsKey }),
  });
}
