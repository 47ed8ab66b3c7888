import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RequirementListVersionBody, RequirementListVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

export function createRequirementList(
  body: RequirementListVersionBody,
): Promise<RequirementListVersionView> {
  return apiRequest<RequirementListVersionView>('/requirement-lists', { method: 'POST', body });
}

export function useCreateRequirementList() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRequirementList,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: requirementListsKey }),
  });
}
