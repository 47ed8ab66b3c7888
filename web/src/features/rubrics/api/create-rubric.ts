import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RubricBody, RubricVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

export function createRubric(body: RubricBody): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>('/rubrics', { method: 'POST', body });
}

export function useCreateRubric() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRubric,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rubricsKey }),
  });
}
