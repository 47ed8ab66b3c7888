import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page, Role, UserRow, USER_SORT_FIELDS } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export interface UsersQuery {
  search?: string;
  role?: Role;
  active?: boolean;
  page: number;
  pageSize: number;
  sort: (typeof USER_SORT_FIELDS)[number];
  order: 'asc' | 'desc';
}

/** Every people query starts with this key, so one invalidation refreshes all pages of the list. */
export const usersKey = ['users'] as const;

export function getUsers(query: UsersQuery, signal?: AbortSignal): Promise<Page<UserRow>> {
  return apiRequest<Page<UserRow>>('/users', {
    signal,
    query: {
      search: query.search?.trim() || undefined,
      role: query.role,
      active: query.active === undefined ? undefined : String(query.active),
      page: query.page,
      pageSize: query.pageSize,
      sort: query.sort,
      order: query.order,
    },
  });
}

export const usersQueryOptions = (query: UsersQuery) =>
  queryOptions({
    queryKey: [...usersKey, 'list', query],
    queryFn: ({ signal }) => getUsers(query, signal),
    // Keep the current page on screen while the next one loads (no flashing empty table).
    placeholderData: keepPreviousData,
  });

export function useUsers(query: UsersQuery) {
  return useQuery(usersQueryOptions(query));
}
