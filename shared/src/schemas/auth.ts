import { z } from 'zod';
import { noteNameConventionSchema, roleSchema } from './roles.js';

/** Minimum password length (design.md §8). */
export const PASSWORD_MIN_LENGTH = 12;

export const passwordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(200, 'Use at most 200 characters.');

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email('Enter a valid e-mail address.').max(254));

export const loginSchema = z.strictObject({
  email: emailSchema,
  // Sign-in checks only that something was typed; length rules apply when a password is set.
  password: z.string().min(1, 'Enter your password.').max(200),
  organisationId: z.uuid().optional(),
});
export type LoginInput = z.infer<typeof loginSchema>;

export const switchOrganisationSchema = z.strictObject({ organisationId: z.uuid() });
export type SwitchOrganisationInput = z.infer<typeof switchOrganisationSchema>;

export interface MembershipView {
  organisationId: string;
  organisationName: string;
  timeZone: string;
  roles: z.infer<typeof roleSchema>[];
}

export interface CurrentUser {
  id: string;
  email: string;
  displayName: string;
  noteNames: z.infer<typeof noteNameConventionSchema>;
  memberships: MembershipView[];
  /** The organisation the access token is scoped to. */
  activeOrganisationId: string;
}

export interface AuthSession {
  accessToken: string;
  /** Seconds until the access token expires. */
  expiresIn: number;
  user: CurrentUser;
}
