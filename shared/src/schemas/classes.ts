import { z } from 'zod';

/**
 * The class-list CSV columns, in the order the template and the export write them. Headers are
 * matched ignoring case, spaces, hyphens and underscores, in any order.
 */
export const CLASS_LIST_COLUMNS = [
  { key: 'pupilNumber', header: 'Pupil number', required: true },
  { key: 'givenName', header: 'Given name', required: true },
  { key: 'familyName', header: 'Family name', required: true },
  { key: 'studentEmail', header: 'Student e-mail', required: false },
  { key: 'dateOfBirth', header: 'Date of birth', required: true },
  { key: 'guardianName', header: 'Guardian name', required: false },
  { key: 'guardianEmail', header: 'Guardian e-mail', required: false },
  { key: 'grade', header: 'Grade', required: false },
  { key: 'classCode', header: 'Class code', required: true },
] as const;
export type ClassListColumnKey = (typeof CLASS_LIST_COLUMNS)[number]['key'];

/** Limits of one import (issue 4): larger files are refused whole. */
export const CLASS_IMPORT_MAX_ROWS = 5000;
export const CLASS_IMPORT_MAX_BYTES = 2 * 1024 * 1024;
/** A student younger than this on the import date needs a guardian's e-mail. */
export const ADULT_AGE = 18;

export const classCodeSchema = z
  .string()
  .trim()
  .min(1, 'Enter a class code.')
  .max(40, 'Use at most 40 characters.')
  .regex(
    /^[\p{L}\p{N}][\p{L}\p{N} ._/-]*$/u,
    'Use letters, digits, spaces and . _ / - (starting with a letter or digit).',
  );

const classNameSchema = z
  .string()
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'Use at most 120 characters.');
const gradeSchema = z.number().int().min(0).max(12).nullable();

export const createClassSchema = z.strictObject({
  name: classNameSchema,
  code: classCodeSchema,
  grade: gradeSchema.optional(),
  /** Memberships (people.id of teachers) to teach it; a teacher creating a class always teaches it. */
  teacherIds: z.array(z.uuid()).max(20).optional(),
});
export type CreateClassInput = z.infer<typeof createClassSchema>;

export const updateClassSchema = z
  .strictObject({
    name: classNameSchema.optional(),
    grade: gradeSchema.optional(),
    active: z.boolean().optional(),
    /** People ids of the teachers; admins only. At least one teacher. */
    teacherIds: z.array(z.uuid()).min(1, 'A class needs at least one teacher.').max(20).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change.');
export type UpdateClassInput = z.infer<typeof updateClassSchema>;

export const addClassMemberSchema = z.strictObject({
  studentId: z.uuid(),
  /** Moving: the class the student leaves in the same step. */
  fromClassId: z.uuid().optional(),
});
export type AddClassMemberInput = z.infer<typeof addClassMemberSchema>;

export const listClassesQuerySchema = z.strictObject({
  active: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
});
export type ListClassesQuery = z.infer<typeof listClassesQuerySchema>;

export const classImportQuerySchema = z.strictObject({
  dryRun: z
    .enum(['true', 'false'], { message: 'dryRun is true or false.' })
    .transform((v) => v === 'true')
    .default(false),
});
export type ClassImportQuery = z.infer<typeof classImportQuerySchema>;

export const listStudentsQuerySchema = z.strictObject({
  search: z.string().trim().max(100).optional(),
  notInClassId: z.uuid().optional(),
});
export type ListStudentsQuery = z.infer<typeof listStudentsQuerySchema>;

export const updateStudentSchema = z.strictObject({ active: z.boolean() });
export type UpdateStudentInput = z.infer<typeof updateStudentSchema>;

export interface ClassTeacherRef {
  id: string;
  displayName: string;
}

export interface ClassRow {
  id: string;
  name: string;
  code: string;
  grade: number | null;
  active: boolean;
  teachers: ClassTeacherRef[];
  memberCount: number;
}

export interface GuardianView {
  name: string;
  email: string;
  consentResultsEmail: boolean | null;
  consentRecordings: boolean | null;
}

export interface StudentRow {
  id: string;
  pupilNumber: string;
  givenName: string;
  familyName: string;
  email: string | null;
  dateOfBirth: string;
  grade: number | null;
  active: boolean;
  hasSignIn: boolean;
  guardians: GuardianView[];
  /** Codes of the caller's visible classes the student is in. */
  classCodes: string[];
}

export interface ClassDetail extends ClassRow {
  members: StudentRow[];
}

export type ImportRowStatus = 'new' | 'updated' | 'unchanged' | 'error';

export interface ImportRowReport {
  /** Line in the file where the record starts (the header is line 1). */
  line: number;
  status: ImportRowStatus;
  pupilNumber: string;
  name: string;
  classCode: string;
  /** What changes, in words ("Family name: Pendry → Pendrey"); empty for new and unchanged rows. */
  changes: string[];
  /** Every problem with the row; empty unless status is error. */
  errors: string[];
}

export interface ImportReport {
  dryRun: boolean;
  /** True when the changes were written (never on a dry run or when any row has an error). */
  applied: boolean;
  fileName: string;
  delimiter: ',' | ';';
  rowCount: number;
  counts: Record<ImportRowStatus, number>;
  rows: ImportRowReport[];
  /** Class codes not yet in the organisation: created on apply, with the importer as teacher. */
  newClassCodes: string[];
  /** E-mails the import sends (or would send): invitations to new sign-ins, notices to guardians. */
  invitations: number;
  guardianNotices: number;
  /** The organisation's date the ages were checked against (YYYY-MM-DD). */
  importDate: string;
}
