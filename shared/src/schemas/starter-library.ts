// The starter library offered to every school (issue 3 §2): what it holds, and the body that
// copies one entry into the caller's organisation.
import { z } from 'zod';
import type { RequestKind } from '../music/domain.js';
import type { RequirementListVersionView } from './requirement-lists.js';

/** Names one entry of the starter library by its key (the file name, e.g. "scales", "grade-1"). */
export const adoptStarterBodySchema = z.strictObject({
  key: z
    .string('Name the starter entry to add by its key, e.g. "scales".')
    .trim()
    .min(1, 'Name the starter entry to add by its key, e.g. "scales".')
    .max(100),
});
export type AdoptStarterBody = z.infer<typeof adoptStarterBodySchema>;

/** Where an entry already is in the caller's school, when it has been added before. */
export interface StarterAdoptedRef {
  id: string;
  name: string;
}

export interface StarterRubricItem {
  key: string;
  name: string;
  kinds: RequestKind[];
  criteriaCount: number;
  adopted: StarterAdoptedRef | null;
}

export interface StarterListItem {
  key: string;
  name: string;
  grade: string;
  totalMarks: number;
  lineCount: number;
  /** Keys of the starter rubrics its lines are marked with (added too when missing). */
  rubricKeys: string[];
  adopted: StarterAdoptedRef | null;
}

export interface StarterLibraryView {
  rubrics: StarterRubricItem[];
  requirementLists: StarterListItem[];
}

/** A list taken from the starter library, and the starter rubrics added with it. */
export interface StarterListAdoption {
  version: RequirementListVersionView;
  rubricsAdded: StarterAdoptedRef[];
}
