import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RequirementListVersionBody, RequirementListVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

/** An edit of a published list: saved as a new draft version. */
export function createRequirementListVersion({
  listId,
  body,
}: {
  listId: string;
  body: RequirementListVersionBody;
}): Promise<RequirementListVersionView> {
  return apiRequest<RequirementListVersionView>(
    `/requirement-lists/${encodeURIComponent(listId)}/versions`,
    { method: 'POST', body },
  );
}

export function useCreateRequirementListVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRequirementListVersion,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: requirementListsKey }),
  });
}
