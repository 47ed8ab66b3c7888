import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RequirementListVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { requirementListsKey } from './get-requirement-lists';

export function publishRequirementListVersion(id: string): Promise<RequirementListVersionView> {
  return apiRequest<RequirementListVersionView>(
    `/requirement-list-versions/${encodeURIComponent(id)}/publish`,
    { method: 'POST' },
  );
}

export function usePublishRequirementListVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: publishRequirementListVersion,
    meta: { successMessage: 'Published. Sittings can now use this version.' },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: requirementListsKey }),
  });
}
