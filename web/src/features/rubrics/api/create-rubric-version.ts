import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RubricBody, RubricVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

/** An edit of a published rubric: saved as a new draft version. */
export function createRubricVersion({
  rubricId,
  body,
}: {
  rubricId: string;
  body: RubricBody;
}): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>(`/rubrics/${encodeURIComponent(rubricId)}/versions`, {
    method: 'POST',
    body,
  });
}

export function useCreateRubricVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRubricVersion,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rubricsKey }),
  });
}
