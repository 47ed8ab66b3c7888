import { z } from 'zod';

export const ROLES = ['admin', 'teacher', 'examiner', 'student'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const NOTE_NAME_CONVENTIONS = ['british', 'american'] as const;
export const noteNameConventionSchema = z.enum(NOTE_NAME_CONVENTIONS);
export type NoteNameConvention = z.infer<typeof noteNameConventionSchema>;
