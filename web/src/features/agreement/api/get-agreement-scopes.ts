import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AgreementScopes } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { agreementKey } from './keys';

export function getAgreementScopes(signal?: AbortSignal): Promise<AgreementScopes> {
  return apiRequest<AgreementScopes>('/agreement/scopes', { signal });
}

export const agreementScopesQueryOptions = () =>
  queryOptions({ queryKey: [...agreementKey, 'scopes'], queryFn: ({ signal }) => getAgreementScopes(signal) });

export function useAgreementScopes() {
  return useQuery(agreementScopesQueryOptions());
}
