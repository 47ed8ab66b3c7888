import { stringify } from 'csv-stringify/sync';
import { CLASS_LIST_COLUMNS, neutraliseCsvCell } from '@stavemark/shared';
import type { Student } from '../students/entities/student.entity.js';

/**
 * A class list as CSV in the import's own layout (RFC 4180: CRLF, quotes where needed), with a
 * UTF-8 byte-order mark so spreadsheets read accents right. Every text cell is neutralised
 * (design.md §8). Importing the file again changes nothing: one row per student, their first
 * guardian by e-mail (further guardians are kept by an import, never removed).
 */
export function classListCsv(classCode: string, students: Student[]): string {
  const rows = students.map((s) => {
    const g = [...(s.guardians ?? [])].sort((a, b) => a.email.localeCompare(b.email))[0];
    return [
      s.pupilNumber,
      s.givenName,
      s.familyName,
      s.email ?? '',
      s.dateOfBirth,
      g?.name ?? '',
      g?.email ?? '',
      s.grade === null ? '' : String(s.grade),
      classCode,
    ].map((c) => neutraliseCsvCell(c));
  });
  return stringify(rows, {
    bom: true,
    header: true,
    columns: CLASS_LIST_COLUMNS.map((c) => c.header),
    record_delimiter: 'windows',
  });
}

/** The template: the header line only, so no example row can be imported by mistake. */
export function classListTemplate(): string {
  return stringify([], {
    bom: true,
    header: true,
    columns: CLASS_LIST_COLUMNS.map((c) => c.header),
    record_delimiter: 'windows',
  });
}
