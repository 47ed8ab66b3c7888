// The versioning rules live in common/versioned-documents.ts; re-exported here for the modules
// that import them from their first home.
export {
  callerSeesDrafts,
  isTeachingStaff,
  isUniqueViolation,
} from '../common/versioned-documents.js';

/** A file name part from a title: "Scales — Grade 3" → "scales-grade-3". */
export function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'rubric'
  );
}
