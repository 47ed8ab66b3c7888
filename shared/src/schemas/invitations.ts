import { z } from 'zod';
import { emailSchema, passwordSchema } from './auth.js';

/** A link token as it appears in an e-mailed link: 32 random bytes, base64url (43 characters). */
export const linkTokenSchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9_-]{43}$/, 'This link is not complete. Please open it again from the e-mail.');

export const linkTokenInputSchema = z.strictObject({ token: linkTokenSchema });
export type LinkTokenInput = z.infer<typeof linkTokenInputSchema>;

export const setPasswordSchema = z.strictObject({
  token: linkTokenSchema,
  password: passwordSchema,
});
export type SetPasswordInput = z.infer<typeof setPasswordSchema>;

export const forgotPasswordSchema = z.strictObject({ email: emailSchema });
export type ForgotPasswordInput = z.infer<typeof forgotPasswordSchema>;

export const consentAnswerSchema = z.strictObject({
  studentId: z.uuid(),
  consentResultsEmail: z.boolean({ message: 'Choose yes or no.' }),
  consentRecordings: z.boolean({ message: 'Choose yes or no.' }),
});

export const submitConsentSchema = z.strictObject({
  token: linkTokenSchema,
  answers: z.array(consentAnswerSchema).min(1).max(20),
});
export type SubmitConsentInput = z.infer<typeof submitConsentSchema>;

export type LinkPurpose = 'invitation' | 'password_reset' | 'guardian_consent';

/** What a valid link is for, so the page can greet the person; nothing more. */
export interface LinkInfo {
  purpose: LinkPurpose;
  displayName: string;
  organisationName: string | null;
  expiresAt: string;
}

export interface ConsentRequest {
  guardianName: string;
  organisationName: string;
  expiresAt: string;
  children: {
    studentId: string;
    givenName: string;
    consentResultsEmail: boolean | null;
    consentRecordings: boolean | null;
  }[];
}

export interface AccountMessage {
  message: string;
}

export interface OutboxItem {
  /** The catcher's id of the message. */
  id: string;
  receivedAt: string;
  to: string[];
  subject: string;
  text: string;
  /** The HTML part as sent; shown sandboxed. */
  html: string | null;
  kind: 'invitation' | 'guardian_notice' | 'password_reset' | 'sitting_invitation' | 'sitting_change' | 'sitting_cancellation';
  status: string;
  attempts: number;
}

export interface OutboxList {
  /** False when this server has no local mail catcher folder configured. */
  catcher: boolean;
  items: OutboxItem[];
}
