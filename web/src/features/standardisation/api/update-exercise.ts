import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ExerciseView, UpdateExerciseInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { exerciseKey, standardisationKey } from './keys';

export function updateExercise({ id, changes }: { id: string; changes: UpdateExerciseInput }): Promise<ExerciseView> {
  return apiRequest<ExerciseView>(`/standardisation/exercises/${encodeURIComponent(id)}`, { method: 'PATCH', body: changes });
}

export function publishExercise(id: string): Promise<ExerciseView> {
  return apiRequest<ExerciseView>(`/standardisation/exercises/${encodeURIComponent(id)}/publish`, { method: 'POST' });
}

function useExerciseMutation<V>(fn: (v: V) => Promise<ExerciseView>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    meta: { inlineErrors: true },
    onSuccess: (view) => {
      queryClient.setQueryData(exerciseKey(view.id), view);
      void queryClient.invalidateQueries({ queryKey: [...standardisationKey, 'list'] });
    },
  });
}

export const useUpdateExercise = () => useExerciseMutation(updateExercise);
export const usePublishExercise = () => useExerciseMutation(publishExercise);
