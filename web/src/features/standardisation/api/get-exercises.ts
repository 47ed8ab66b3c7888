import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ExerciseSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { standardisationKey } from './keys';

export function getExercises(signal?: AbortSignal): Promise<ExerciseSummary[]> {
  return apiRequest<ExerciseSummary[]>('/standardisation/exercises', { signal });
}

export const exercisesQueryOptions = () =>
  queryOptions({ queryKey: [...standardisationKey, 'list'], queryFn: ({ signal }) => getExercises(signal) });

export function useExercises() {
  return useQuery(exercisesQueryOptions());
}
