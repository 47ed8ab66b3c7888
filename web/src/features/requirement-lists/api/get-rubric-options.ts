import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RubricSummary } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import type { RubricOption } from '../components/RequirementListForm';

/**
 * The rubric versions a line can be marked with: each rubric's published version and its draft.
 * Keyed under "rubrics" so that saving a rubric refreshes these choices too.
 */
export function getRubricOptions(signal?: AbortSignal): Promise<RubricOption[]> {
  return apiRequest<RubricSummary[]>('/rubrics', { signal }).then((rubrics) =>
    rubrics.flatMap((r) => {
      const out: RubricOption[] = [];
      if (r.published)
        out.push({
          value: r.published.id,
          label: `${r.published.name} · version ${r.published.version}`,
          kinds: r.published.kinds,
        });
      if (r.latest.status === 'draft')
        out.push({
          value: r.latest.id,
          label: `${r.latest.name} · version ${r.latest.version} (draft)`,
          kinds: r.latest.kinds,
        });
      return out;
    }),
  );
}

export const rubricOptionsQueryOptions = () =>
  queryOptions({
    queryKey: ['rubrics', 'options'],
    queryFn: ({ signal }) => getRubricOptions(signal),
  });

export function useRubricOptions() {
  return useQuery(rubricOptionsQueryOptions());
}
