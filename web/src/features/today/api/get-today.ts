import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** `GET /api/today`: only the sections for the caller's roles are present. */
export interface TodayView {
  /** The organisation's local date, YYYY-MM-DD. */
  date: string;
  timeZone: string;
  organisationName: string;
  roles: Role[];
  admin?: {
    people: number;
    students: number;
    classes: number;
    term: { name: string; startsOn: string; endsOn: string } | null;
  };
  teacher?: {
    classes: {
      id: string;
      name: string;
      code: string;
      grade: number | null;
      studentCount: number;
    }[];
  };
  examiner?: {
    /** Today's sittings with at least one slot the caller marks. */
    sittings: {
      id: string;
      title: string;
      room: string;
      status: string;
      startsAt: string;
      endsAt: string;
      mySlots: number;
    }[];
  };
  student?: {
    /** The student record's id (for their progress page). */
    id: string;
    name: string;
    grade: number | null;
    classes: { id: string; name: string; code: string; teachers: string[] }[];
  };
}

export function getToday(signal?: AbortSignal): Promise<TodayView> {
  return apiRequest<TodayView>('/today', { signal });
}

export const todayQueryOptions = () =>
  queryOptions({
    queryKey: ['today'],
    queryFn: ({ signal }) => getToday(signal),
  });

export function useToday() {
  return useQuery(todayQueryOptions());
}
