import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RubricBody, RubricVersionView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { rubricsKey } from './get-rubrics';

/** Replaces a draft version's content; a published version answers 409. */
export function updateRubricVersion({
  id,
  body,
}: {
  id: string;
  body: RubricBody;
}): Promise<RubricVersionView> {
  return apiRequest<RubricVersionView>(`/rubric-versions/${encodeURIComponent(id)}`, {
    method: 'PUT',
    body,
  });
}

export function useUpdateRubricVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRubricVersion,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rubricsKey }),
  });
}
