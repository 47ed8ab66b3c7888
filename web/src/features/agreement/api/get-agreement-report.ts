import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AgreementReport } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { agreementKey } from './keys';

export type ReportScope = { kind: 'sitting' | 'term'; id: string };

export function getAgreementReport(scope: ReportScope, signal?: AbortSignal): Promise<AgreementReport> {
  const base = scope.kind === 'sitting' ? '/sittings' : '/terms';
  return apiRequest<AgreementReport>(`${base}/${encodeURIComponent(scope.id)}/agreement`, { signal });
}

export const agreementReportQueryOptions = (scope: ReportScope) =>
  queryOptions({
    queryKey: [...agreementKey, scope.kind, scope.id],
    queryFn: ({ signal }) => getAgreementReport(scope, signal),
  });

export function useAgreementReport(scope: ReportScope | null) {
  return useQuery({
    ...agreementReportQueryOptions(scope ?? { kind: 'sitting', id: '' }),
    enabled: scope !== null,
  });
}
