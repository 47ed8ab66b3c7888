import { z } from 'zod';
import { emailSchema, passwordSchema } from './auth.js';
import { noteNameConventionSchema, roleSchema } from './roles.js';

const displayNameSchema = z.string().trim().min(1, 'Enter a name.').max(120);
const rolesSchema = z
  .array(roleSchema)
  .min(1, 'Choose at least one role.')
  .refine((r) => new Set(r).size === r.length, 'Each role once.');

export const createUserSchema = z.strictObject({
  email: emailSchema,
  displayName: displayNameSchema,
  roles: rolesSchema,
  /** Optional: without it the person is invited by e-mail to set one. */
  password: passwordSchema.optional(),
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .strictObject({
    displayName: displayNameSchema.optional(),
    roles: rolesSchema.optional(),
    active: z.boolean().optional(),
    noteNames: noteNameConventionSchema.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change.');
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const USER_SORT_FIELDS = ['displayName', 'email', 'createdAt'] as const;

export const listUsersQuerySchema = z.strictObject({
  search: z.string().trim().max(100).optional(),
  role: roleSchema.optional(),
  active: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  sort: z.enum(USER_SORT_FIELDS).default('displayName'),
  order: z.enum(['asc', 'desc']).default('asc'),
});
export type ListUsersQuery = z.infer<typeof listUsersQuerySchema>;

export interface UserRow {
  id: string;
  email: string;
  displayName: string;
  roles: z.infer<typeof roleSchema>[];
  active: boolean;
  createdAt: string;
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}
