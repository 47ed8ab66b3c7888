// Rubric files (import/export) and the rubric views the API returns (issue 3 §1). The rubric body
// itself (name, kinds, criteria) is `rubricBodySchema` in music/schemas.ts.
import { z } from 'zod';
import type { RequestKind, RubricCriterion } from '../music/domain.js';
import { requestKindSchema, rubricBodySchema } from '../music/schemas.js';

export const VERSION_STATUSES = ['draft', 'published'] as const;
export type VersionStatus = (typeof VERSION_STATUSES)[number];
export const versionStatusSchema = z.enum(VERSION_STATUSES);

/** The `format` of an exported rubric file; see rubrics/README.md for the whole schema. */
export const RUBRIC_FILE_FORMAT = 'stavemark.rubric';
export const RUBRIC_FILE_FORMAT_VERSION = 1;
/** Largest rubric file accepted on import (a 20-criterion rubric with long descriptors is ~60 kB). */
export const RUBRIC_FILE_MAX_BYTES = 256 * 1024;

/**
 * An exported rubric. The rubric sits under `rubric` so that an error path such as
 * `rubric.criteria.2.weight` says exactly where a hand-edited file went wrong.
 */
export const rubricFileSchema = z.strictObject({
  format: z.literal(
    RUBRIC_FILE_FORMAT,
    `Not a rubric file: "format" must be "${RUBRIC_FILE_FORMAT}".`,
  ),
  formatVersion: z.literal(
    RUBRIC_FILE_FORMAT_VERSION,
    `Only format version ${RUBRIC_FILE_FORMAT_VERSION} can be read.`,
  ),
  /** Informational; ignored on import. */
  exportedAt: z.iso.datetime({ offset: true }).optional(),
  /** Informational: where the file came from. Ignored on import (an import is always a new draft). */
  source: z
    .strictObject({
      version: z.number().int().min(1),
      status: versionStatusSchema,
      starterKey: z.string().max(64).optional(),
    })
    .optional(),
  rubric: rubricBodySchema,
});
export type RubricFile = z.infer<typeof rubricFileSchema>;

export const listRubricsQuerySchema = z.strictObject({
  kind: requestKindSchema.optional(),
  status: versionStatusSchema.optional(),
});
export type ListRubricsQuery = z.infer<typeof listRubricsQuerySchema>;

export interface PersonRef {
  id: string;
  displayName: string;
}

export interface RubricVersionSummary {
  id: string;
  rubricId: string;
  version: number;
  status: VersionStatus;
  name: string;
  kinds: RequestKind[];
  criteriaCount: number;
  createdAt: string;
  publishedAt: string | null;
}

export interface RubricVersionView extends Omit<RubricVersionSummary, 'criteriaCount'> {
  criteria: RubricCriterion[];
  createdBy: PersonRef | null;
  publishedBy: PersonRef | null;
}

export interface RubricSummary {
  id: string;
  /** Name and kinds of the latest version the caller may see. */
  name: string;
  kinds: RequestKind[];
  /** The starter-library entry it was seeded from, if any. */
  starterKey: string | null;
  latest: RubricVersionSummary;
  /** The newest published version, if any. */
  published: RubricVersionSummary | null;
  versionCount: number;
}

export interface RubricDetail extends RubricSummary {
  /** Every version the caller may see, newest first. */
  versions: RubricVersionSummary[];
}
