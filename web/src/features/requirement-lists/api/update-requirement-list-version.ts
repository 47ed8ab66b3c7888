import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RequirementListVersionBody, RequirementListVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

export function updateRequirementListVersion({
  id,
  body,
}: {
  id: string;
  body: RequirementListVersionBody;
}): Promise<RequirementListVersionView> {
  return apiRequest<RequirementListVersionView>(
    `/requirement-list-versions/${encodeURIComponent(id)}`,
    { method: 'PUT', body },
  );
}

export function useUpdateRequirementListVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRequirementListVersion,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: requirementListsKey }),
  });
}
