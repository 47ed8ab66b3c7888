import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateExerciseInput, ExerciseView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { standardisationKey } from './keys';

export function createExercise(input: CreateExerciseInput): Promise<ExerciseView> {
  return apiRequest<ExerciseView>('/standardisation/exercises', { method: 'POST', body: input });
}

export function useCreateExercise() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createExercise,
    meta: { inlineErrors: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: standardisationKey }),
  });
}
