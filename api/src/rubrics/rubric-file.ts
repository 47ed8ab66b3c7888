// Reading and writing rubric files (rubrics/README.md documents the format).
import {
  RUBRIC_FILE_FORMAT,
  RUBRIC_FILE_FORMAT_VERSION,
  rubricFileSchema,
  type RubricFile,
  type RubricVersionView,
} from '@stavemark/shared';
import { z } from 'zod';
import { invalid } from '../common/errors.js';
import { issuesToDetails } from '../common/validation.js';

/** Where in the text a JSON.parse error points, as "line L, column C". */
function locate(text: string, message: string): string | null {
  const m = /position (\d+)/.exec(message);
  if (!m) return null;
  const pos = Number(m[1]);
  const before = text.slice(0, pos);
  const line = before.split('\n').length;
  const column = pos - before.lastIndexOf('\n');
  return `line ${line}, column ${column}`;
}

/**
 * Checks an uploaded file in three steps, each with its own message: UTF-8 text, JSON, then the
 * rubric file schema (every problem with its path, e.g. `rubric.criteria.2.weight`).
 */
export function parseRubricFile(content: Buffer): RubricFile {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(content);
  } catch {
    throw invalid('The file is not text (UTF-8): choose a rubric file exported as JSON.', [
      { path: 'file', message: 'not UTF-8 text' },
    ]);
  }
  text = text.replace(/^\uFEFF/, '');
  if (text.trim() === '') throw invalid('The file is empty.', [{ path: 'file', message: 'empty' }]);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    const where = locate(text, reason);
    throw invalid(`The file is not valid JSON${where ? ` (${where})` : ''}: ${reason}`, [
      { path: 'file', message: where ?? reason },
    ]);
  }
  const result = rubricFileSchema.safeParse(data);
  if (!result.success) {
    const details = issuesToDetails(result.error).map((d) =>
      d.path === '(body)' ? { ...d, path: '(file)' } : d,
    );
    const first = details[0]!;
    const more =
      details.length > 1
        ? ` (and ${details.length - 1} more problem${details.length > 2 ? 's' : ''})`
        : '';
    throw invalid(
      `The file is not a valid rubric: ${first.path}: ${first.message}${more}`,
      details,
    );
  }
  return result.data;
}

/** The file a version is exported as; importing it gives back the same name, kinds and criteria. */
export function toRubricFile(
  v: RubricVersionView,
  starterKey: string | null,
  exportedAt: Date,
): RubricFile {
  return {
    format: RUBRIC_FILE_FORMAT,
    formatVersion: RUBRIC_FILE_FORMAT_VERSION,
    exportedAt: exportedAt.toISOString(),
    source: { version: v.version, status: v.status, ...(starterKey ? { starterKey } : {}) },
    rubric: { name: v.name, kinds: v.kinds, criteria: v.criteria },
  };
}

/**
 * The JSON Schema (draft 2020-12) of a rubric file, derived from the same zod shape the import
 * uses; rubrics/rubric-file.schema.json holds a copy that a test keeps equal to this.
 */
export function rubricFileJsonSchema(): Record<string, unknown> {
  return {
    ...z.toJSONSchema(rubricFileSchema, { io: 'input', unrepresentable: 'any' }),
    $id: 'https://stavemark.example/schemas/rubric-file-v1.json',
    title: 'Stavemark rubric file, format version 1',
    description:
      'Extra rules not expressible here: descriptor bands within one criterion may not overlap, no band may exceed the criterion maximum, min ≤ max, and criterion keys are unique. See rubrics/README.md.',
  };
}
