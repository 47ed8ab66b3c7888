import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AttemptMarksInput, ExerciseView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { exerciseKey, standardisationKey } from './keys';

/** Saves the examiner's marks so far as a draft (some may be missing). */
export function saveAttempt({ id, input }: { id: string; input: AttemptMarksInput }): Promise<ExerciseView> {
  return apiRequest<ExerciseView>(`/standardisation/exercises/${encodeURIComponent(id)}/attempt`, { method: 'PUT', body: input });
}

export function useSaveAttempt() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveAttempt,
    meta: { inlineErrors: true },
    // The draft's own answer; the list's status may change too.
    onSuccess: (view) => {
      queryClient.setQueryData(exerciseKey(view.id), view);
      void queryClient.invalidateQueries({ queryKey: [...standardisationKey, 'list'] });
    },
  });
}
