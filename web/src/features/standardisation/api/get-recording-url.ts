import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import { standardisationKey } from './keys';

export interface SignedMediaUrl {
  url: string;
  expiresAt: string;
}

export function getRecordingUrl(id: string, signal?: AbortSignal): Promise<SignedMediaUrl> {
  return apiRequest<SignedMediaUrl>(`/standardisation/exercises/${encodeURIComponent(id)}/recording-url`, { signal });
}

/** Renewed a little before the signed address expires, so a long listen can seek again. */
export const recordingUrlQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...standardisationKey, 'recording', id],
    queryFn: ({ signal }) => getRecordingUrl(id, signal),
    staleTime: 60_000,
    refetchInterval: 4 * 60_000,
  });

export function useRecordingUrl(id: string, enabled: boolean) {
  return useQuery({ ...recordingUrlQueryOptions(id), enabled });
}
