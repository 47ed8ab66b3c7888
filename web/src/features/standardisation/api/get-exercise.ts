import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ExerciseView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { exerciseKey } from './keys';

export function getExercise(id: string, signal?: AbortSignal): Promise<ExerciseView> {
  return apiRequest<ExerciseView>(`/standardisation/exercises/${encodeURIComponent(id)}`, { signal });
}

export const exerciseQueryOptions = (id: string) =>
  queryOptions({ queryKey: exerciseKey(id), queryFn: ({ signal }) => getExercise(id, signal) });

export function useExercise(id: string) {
  return useQuery(exerciseQueryOptions(id));
}
