// Views of requirement lists and their versions (issue 3 §3). The request bodies are
// `requirementListVersionBodySchema` and `requirementLineBodySchema` in music/schemas.ts.
import { z } from 'zod';
import type { RequirementLine, SelectionRule } from '../music/domain.js';
import type { PersonRef, VersionStatus } from './rubrics.js';
import { versionStatusSchema } from './rubrics.js';

export const listRequirementListsQuerySchema = z.strictObject({
  grade: z.string().trim().min(1).max(40).optional(),
  status: versionStatusSchema.optional(),
});
export type ListRequirementListsQuery = z.infer<typeof listRequirementListsQuerySchema>;

/** The rubric version a line is marked with, named for display. */
export interface LineRubricRef {
  id: string;
  rubricId: string;
  name: string;
  version: number;
  status: VersionStatus;
}

export interface RequirementLineView extends RequirementLine {
  rubric: LineRubricRef;
}

export interface RequirementListVersionSummary {
  id: string;
  listId: string;
  version: number;
  status: VersionStatus;
  name: string;
  grade: string;
  totalMarks: number;
  lineCount: number;
  /** Set once a sitting has pinned this version; from then on nothing about it may change. */
  usedAt: string | null;
  createdAt: string;
  publishedAt: string | null;
}

export interface RequirementListVersionView extends Omit<
  RequirementListVersionSummary,
  'lineCount'
> {
  selectionRule: SelectionRule;
  lines: RequirementLineView[];
  createdBy: PersonRef | null;
  publishedBy: PersonRef | null;
}

export interface RequirementListSummary {
  id: string;
  name: string;
  grade: string;
  starterKey: string | null;
  latest: RequirementListVersionSummary;
  published: RequirementListVersionSummary | null;
  versionCount: number;
}

export interface RequirementListDetail extends RequirementListSummary {
  versions: RequirementListVersionSummary[];
}
