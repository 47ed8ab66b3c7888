import {
  ADULT_AGE,
  CLASS_LIST_COLUMNS,
  classCodeSchema,
  emailSchema,
  type ClassListColumnKey,
} from '@stavemark/shared';
import type { CsvRecord } from './class-list-csv.js';

/** One record's values after checking, ready to match against the database. */
export interface CheckedRow {
  line: number;
  pupilNumber: string | null;
  givenName: string;
  familyName: string;
  studentEmail: string | null;
  dateOfBirth: string;
  guardianName: string | null;
  guardianEmail: string | null;
  grade: number | null;
  classCode: string;
  minor: boolean;
}

export interface RowCheck {
  row: CheckedRow | null;
  errors: string[];
  /** What the report shows even for a bad row. */
  display: { pupilNumber: string; name: string; classCode: string };
}

const HEADER: Record<ClassListColumnKey, string> = Object.fromEntries(
  CLASS_LIST_COLUMNS.map((c) => [c.key, c.header]),
) as Record<ClassListColumnKey, string>;
/** What makes a spreadsheet treat a cell as a formula (OWASP CSV injection); never valid in these columns. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** Age in whole years on `onDate`; both YYYY-MM-DD. */
export function ageOn(dateOfBirth: string, onDate: string): number {
  const years = Number(onDate.slice(0, 4)) - Number(dateOfBirth.slice(0, 4));
  return onDate.slice(5) >= dateOfBirth.slice(5) ? years : years - 1;
}

/** A real calendar date written YYYY-MM-DD (ISO 8601), or null. */
export function isoDate(s: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = new Date(Date.UTC(y, mo - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === mo - 1 && t.getUTCDate() === d ? s : null;
}

/** Checks one record on its own (the file-wide and database checks come after). */
export function checkRecord(rec: CsvRecord, importDate: string): RowCheck {
  const errors: string[] = [];
  if (rec.shapeError) errors.push(rec.shapeError);
  const raw = (k: ClassListColumnKey): string => rec.cells[k] ?? '';
  for (const c of CLASS_LIST_COLUMNS) {
    const v = raw(c.key);
    if (FORMULA_START.test(v) || FORMULA_START.test(v.trim())) {
      const first = v.trimStart()[0] ?? v[0];
      const shown = first === '\t' ? 'a tab' : first === '\r' ? 'a carriage return' : `“${first}”`;
      errors.push(
        `${c.header} starts with ${shown}, which spreadsheets run as a formula. Remove it.`,
      );
    }
  }
  const text = (k: ClassListColumnKey): string => raw(k).trim();
  const display = {
    pupilNumber: text('pupilNumber'),
    name: `${text('givenName')} ${text('familyName')}`.trim(),
    classCode: text('classCode'),
  };

  const required = (k: ClassListColumnKey, max: number): string => {
    const v = text(k);
    if (!v) errors.push(`${HEADER[k]} is empty.`);
    else if (v.length > max) errors.push(`${HEADER[k]} is longer than ${max} characters.`);
    return v;
  };
  const optionalEmail = (k: 'studentEmail' | 'guardianEmail'): string | null => {
    const v = text(k);
    if (!v) return null;
    const r = emailSchema.safeParse(v);
    if (!r.success) {
      errors.push(`${HEADER[k]} “${v}” is not an e-mail address.`);
      return null;
    }
    return r.data;
  };

  const pupilNumber = text('pupilNumber') || null;
  if (
    pupilNumber &&
    (pupilNumber.length > 40 || !/^[\p{L}\p{N}][\p{L}\p{N}/._-]*$/u.test(pupilNumber))
  ) {
    errors.push(
      `Pupil number “${pupilNumber}” should be letters and digits (up to 40; . / _ - allowed inside).`,
    );
  }
  const givenName = required('givenName', 100);
  const familyName = required('familyName', 100);
  const studentEmail = optionalEmail('studentEmail');
  const guardianEmail = optionalEmail('guardianEmail');
  const guardianName = text('guardianName') || null;
  if (guardianName && guardianName.length > 120)
    errors.push('Guardian name is longer than 120 characters.');
  if (text('guardianEmail') && !guardianName)
    errors.push('Guardian name is empty, but a guardian e-mail is given: add the name.');
  if (guardianName && !text('guardianEmail'))
    errors.push('Guardian e-mail is empty, but a guardian name is given: add the e-mail.');

  const dobText = text('dateOfBirth');
  let dateOfBirth = '';
  let minor = false;
  if (!dobText) errors.push('Date of birth is empty.');
  else if (!/^\d{4}-\d{2}-\d{2}$/.test(dobText)) {
    errors.push(`Date of birth “${dobText}” is not written YYYY-MM-DD (for example 2016-03-08).`);
  } else if (!isoDate(dobText)) {
    errors.push(`Date of birth “${dobText}” is not a real date: check the day and the month.`);
  } else if (dobText > importDate) {
    errors.push(`Date of birth ${dobText} is after today (${importDate}).`);
  } else if (dobText < '1900-01-01') {
    errors.push(`Date of birth ${dobText} is before 1900: please check it.`);
  } else {
    dateOfBirth = dobText;
    const age = ageOn(dobText, importDate);
    minor = age < ADULT_AGE;
    if (minor && !text('guardianEmail')) {
      errors.push(
        `${display.name || 'This student'} is ${age} on ${importDate}: a student under ${ADULT_AGE} needs a guardian e-mail.`,
      );
    }
  }

  const gradeText = text('grade');
  let grade: number | null = null;
  if (gradeText) {
    if (!/^\d{1,2}$/.test(gradeText) || Number(gradeText) > 12)
      errors.push(`Grade “${gradeText}” should be a whole number from 0 to 12.`);
    else grade = Number(gradeText);
  }

  const codeText = text('classCode');
  let classCode = '';
  if (!codeText) errors.push('Class code is empty.');
  else {
    const r = classCodeSchema.safeParse(codeText);
    if (!r.success)
      errors.push(`Class code “${codeText}”: ${r.error.issues[0]?.message ?? 'not valid'}`);
    else classCode = r.data;
  }
  if (!pupilNumber && !studentEmail && !text('studentEmail')) {
    errors.push(
      'Pupil number is empty: give it, or (for a student already here) their e-mail, so the row can be matched.',
    );
  }

  if (errors.length > 0) return { row: null, errors: [...new Set(errors)], display };
  return {
    row: {
      line: rec.line,
      pupilNumber,
      givenName,
      familyName,
      studentEmail,
      dateOfBirth,
      guardianName,
      guardianEmail,
      grade,
      classCode,
      minor,
    },
    errors: [],
    display,
  };
}
