import { useMutation } from '@tanstack/react-query';
import type {
  AccountMessage,
  ConsentRequest,
  ForgotPasswordInput,
  LinkInfo,
  SetPasswordInput,
  SubmitConsentInput,
} from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

// The pages behind e-mailed links: public, so no token and no refresh on 401.
const post = <T>(path: string, body: unknown) =>
  apiRequest<T>(path, { method: 'POST', body, renewOn401: false });

export const getLinkInfo = (token: string) => post<LinkInfo>('/account/link', { token });
export const acceptInvitation = (input: SetPasswordInput) =>
  post<AccountMessage>('/account/accept-invitation', input);
export const resetPassword = (input: SetPasswordInput) =>
  post<AccountMessage>('/account/reset-password', input);
export const forgotPassword = (input: ForgotPasswordInput) =>
  post<AccountMessage>('/account/forgot-password', input);
export const getConsentRequest = (token: string) =>
  post<ConsentRequest>('/account/consent/request', { token });
export const submitConsent = (input: SubmitConsentInput) =>
  post<AccountMessage>('/account/consent', input);

export function useSetPassword(purpose: 'invitation' | 'password_reset') {
  return useMutation({
    mutationFn: purpose === 'invitation' ? acceptInvitation : resetPassword,
    meta: { inlineErrors: true },
  });
}
export function useForgotPassword() {
  return useMutation({ mutationFn: forgotPassword, meta: { inlineErrors: true } });
}
export function useSubmitConsent() {
  return useMutation({ mutationFn: submitConsent, meta: { inlineErrors: true } });
}

/** The token from the link's fragment (#token=…); it never travels in a URL to the server. */
export function tokenFromHash(hash: string): string {
  return new URLSearchParams(hash.replace(/^#/, '')).get('token') ?? '';
}
