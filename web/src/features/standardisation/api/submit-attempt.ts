import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AttemptMarksInput, ExerciseView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { exerciseKey, standardisationKey } from './keys';

/** Submits every mark; the answer reveals the reference and the examiner's deviation. */
export function submitAttempt({ id, input }: { id: string; input: AttemptMarksInput }): Promise<ExerciseView> {
  return apiRequest<ExerciseView>(`/standardisation/exercises/${encodeURIComponent(id)}/attempt/submit`, { method: 'POST', body: input });
}

export function useSubmitAttempt() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitAttempt,
    meta: { inlineErrors: true },
    onSuccess: (view) => {
      queryClient.setQueryData(exerciseKey(view.id), view);
      void queryClient.invalidateQueries({ queryKey: standardisationKey });
    },
  });
}
