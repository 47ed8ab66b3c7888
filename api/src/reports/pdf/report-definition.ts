// The shape of a report definition in the repository's reports/ folder, and its loader.
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

const here = dirname(fileURLToPath(import.meta.url));
/** The checkout's reports/ folder, from src/reports/pdf or dist/reports/pdf alike. */
export const REPORTS_DIR = resolve(here, '../../../../reports');

const text = z.string().max(2000);
const path = z.string().regex(/^[A-Za-z][A-Za-z0-9_.]*$/, 'A path such as "student.name".');
const when = path.optional();

const column = z.strictObject({
  header: z.string().max(60),
  value: text,
  /** Share of the page width, 0..1; the shares of a table add up to at most 1. */
  width: z.number().gt(0).max(1),
  align: z.enum(['left', 'right']).default('left'),
});

type Section =
  | { type: 'heading'; text: string; level: 1 | 2; when?: string | undefined }
  | { type: 'paragraph'; text: string; style: 'body' | 'lead' | 'small'; when?: string | undefined }
  | { type: 'fields'; fields: { label: string; value: string }[]; when?: string | undefined }
  | {
      type: 'table';
      title?: string | undefined;
      rows: string;
      columns: z.infer<typeof column>[];
      empty?: string | undefined;
      when?: string | undefined;
    }
  | { type: 'list'; items: string; text: string; empty?: string | undefined; when?: string | undefined }
  | { type: 'note'; text: string; when?: string | undefined }
  | { type: 'bars'; items: string; label: string; value: string; text: string; empty?: string | undefined; when?: string | undefined }
  | { type: 'repeat'; items: string; sections: Section[]; when?: string | undefined };

const section: z.ZodType<Section> = z.lazy(() =>
  z.discriminatedUnion('type', [
    z.strictObject({ type: z.literal('heading'), text, level: z.union([z.literal(1), z.literal(2)]).default(1), when }),
    z.strictObject({ type: z.literal('paragraph'), text, style: z.enum(['body', 'lead', 'small']).default('body'), when }),
    z.strictObject({
      type: z.literal('fields'),
      fields: z.array(z.strictObject({ label: z.string().max(60), value: text })).min(1),
      when,
    }),
    z
      .strictObject({
        type: z.literal('table'),
        title: z.string().max(120).optional(),
        rows: path,
        columns: z.array(column).min(1).max(8),
        empty: text.optional(),
        when,
      })
      .refine((t) => t.columns.reduce((s, c) => s + c.width, 0) <= 1.0001, 'Column widths add up to more than the page.'),
    z.strictObject({ type: z.literal('list'), items: path, text, empty: text.optional(), when }),
    z.strictObject({ type: z.literal('note'), text, when }),
    z.strictObject({ type: z.literal('bars'), items: path, label: text, value: path, text, empty: text.optional(), when }),
    z.strictObject({ type: z.literal('repeat'), items: path, sections: z.array(section).min(1), when }),
  ]),
);

export const reportDefinitionSchema = z.strictObject({
  format: z.literal('stavemark.report'),
  formatVersion: z.literal(1),
  key: z.string().regex(/^[a-z][a-z0-9-]{0,39}$/),
  title: z.string().min(1).max(120),
  fileName: z.string().min(1).max(200),
  footer: text.optional(),
  sections: z.array(section).min(1),
  /** Plain-word lines per criterion key (take-home report): what went well, what to do next. */
  phrases: z.record(z.string(), z.strictObject({ strength: text, nextStep: text })).optional(),
  phraseDefaults: z.strictObject({ strength: text, nextStep: text }).optional(),
});
export type ReportDefinition = z.infer<typeof reportDefinitionSchema>;
export type ReportSection = Section;

export const REPORT_KEYS = ['mark-sheet', 'take-home', 'class-summary'] as const;
export type ReportKey = (typeof REPORT_KEYS)[number];

/** Reads and checks one definition; a broken file fails loudly with every problem's path. */
export function loadReportDefinition(key: ReportKey, dir = REPORTS_DIR): ReportDefinition {
  const file = join(dir, `${key}.report.json`);
  const parsed = reportDefinitionSchema.safeParse(JSON.parse(readFileSync(file, 'utf8')));
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.') || '(file)'}: ${i.message}`).join('; ');
    throw new Error(`Report definition ${file} is not valid: ${problems}`);
  }
  if (parsed.data.key !== key) throw new Error(`Report definition ${file} names itself "${parsed.data.key}".`);
  return parsed.data;
}

type Data = Record<string, unknown>;

/** The value at a dotted path, or undefined. */
export function valueAt(data: unknown, p: string): unknown {
  let cur: unknown = data;
  for (const part of p.split('.')) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Data)[part];
  }
  return cur;
}

/** Present: not undefined, null, false, the empty string or an empty list. */
export function present(v: unknown): boolean {
  if (v === undefined || v === null || v === false || v === '') return false;
  return !Array.isArray(v) || v.length > 0;
}

/** Fills `{{path}}` placeholders; a missing value prints as nothing. */
export function fill(template: string, data: unknown): string {
  return template.replace(/\{\{\s*([A-Za-z][A-Za-z0-9_.]*)\s*\}\}/g, (_m, p: string) => {
    const v = valueAt(data, p);
    return v === undefined || v === null ? '' : String(v);
  });
}
