import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RubricVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

export function publishRubricVersion(id: string): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>(`/rubric-versions/${encodeURIComponent(id)}/publish`, {
    method: 'POST',
  });
}

export function usePublishRubricVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: publishRubricVersion,
    meta: { successMessage: 'Published. This version will not change from now on.' },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rubricsKey }),
  });
}
