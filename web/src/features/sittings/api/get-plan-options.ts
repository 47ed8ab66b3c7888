import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassRow, RequirementListSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { sittingsKey } from './keys';

// What a sitting is planned from: published requirement lists and the caller's classes. Read
// through the API here rather than from the other features' internals.

export function getPublishedLists(signal?: AbortSignal): Promise<RequirementListSummary[]> {
  return apiRequest<RequirementListSummary[]>('/requirement-lists', {
    signal,
    query: { status: 'published' },
  });
}
export const publishedListsQueryOptions = () =>
  queryOptions({
    queryKey: [...sittingsKey, 'options', 'lists'],
    queryFn: ({ signal }) => getPublishedLists(signal),
  });
export function usePublishedLists(enabled = true) {
  return useQuery({ ...publishedListsQueryOptions(), enabled });
}

export function getClassOptions(signal?: AbortSignal): Promise<ClassRow[]> {
  return apiRequest<ClassRow[]>('/classes', { signal });
}
export const classOptionsQueryOptions = () =>
  queryOptions({
    queryKey: [...sittingsKey, 'options', 'classes'],
    queryFn: ({ signal }) => getClassOptions(signal),
  });
export function useClassOptions(enabled = true) {
  return useQuery({ ...classOptionsQueryOptions(), enabled });
}
