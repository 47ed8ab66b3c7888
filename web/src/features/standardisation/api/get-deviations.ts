import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeviationHistory } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { standardisationKey } from './keys';

export function getDeviations(signal?: AbortSignal): Promise<DeviationHistory> {
  return apiRequest<DeviationHistory>('/standardisation/deviations', { signal });
}

export const deviationsQueryOptions = () =>
  queryOptions({ queryKey: [...standardisationKey, 'deviations'], queryFn: ({ signal }) => getDeviations(signal) });

export function useDeviations() {
  return useQuery(deviationsQueryOptions());
}
