import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RubricSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { standardisationKey } from './keys';

/** Rubrics with a published version: an exercise is marked on one of those. */
export function getPublishedRubrics(signal?: AbortSignal): Promise<RubricSummary[]> {
  return apiRequest<RubricSummary[]>('/rubrics', { signal }).then((all) => all.filter((r) => r.published !== null));
}

export const publishedRubricsQueryOptions = () =>
  queryOptions({ queryKey: [...standardisationKey, 'rubrics'], queryFn: ({ signal }) => getPublishedRubrics(signal) });

export function usePublishedRubrics() {
  return useQuery(publishedRubricsQueryOptions());
}
