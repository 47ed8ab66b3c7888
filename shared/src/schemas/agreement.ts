// Views of the agreement report (issue 7 §3; design.md §4.5): how well two examiners who marked
// the same candidates agree, per sitting or per term. Computed by the API from submitted
// double-marked pairs; the figures come with their interpretation and its published source.
import type { IccForm } from '../stats/icc.js';
import type { InterpretationScale } from '../stats/interpretation.js';

export interface ExaminerRef {
  id: string;
  name: string;
}

export interface Interpretation {
  label: string;
  /** The published source of the scale, to show beside the figure. */
  source: string;
}

export interface IccFigure {
  /** ICC(1,1) when double-marking pairs vary, ICC(2,1) when the same two examiners mark every candidate. */
  form: Extract<IccForm, 'ICC(1,1)' | 'ICC(2,1)'>;
  /** Why this form, in words. */
  formReason: string;
  /** Double-marked candidates in the figure. */
  n: number;
  value: number | null;
  lower: number | null;
  upper: number | null;
  /** n reaches the minimum for an interpretation (design.md §4.5: 30). */
  enough: boolean;
  interpretation: Interpretation | null;
  /** Bands of the interval's ends, as Koo & Li advise judging by the interval. */
  intervalInterpretation: { lower: string; upper: string } | null;
  /** "Too few to judge", or why no value could be computed. */
  note: string | null;
  /** Where the form and its interval come from. */
  method: string;
}

export interface BandAgreementFigure {
  n: number;
  exact: number | null;
  /** Same or neighbouring band (exact included). */
  adjacent: number | null;
  note: string;
}

export interface PairKappa {
  examiners: [ExaminerRef, ExaminerRef];
  n: number;
  /** Quadratic-weighted kappa on bands. */
  kappa: number | null;
  standardError: number | null;
  enough: boolean;
  interpretation: Interpretation | null;
  note: string | null;
}

export interface SeverityFigure {
  examiner: ExaminerRef;
  /** Double-marked sheets of this examiner in the report. */
  n: number;
  /** Shown only from MIN_SHEETS_FOR_SEVERITY sheets; the figures below are null until then. */
  shown: boolean;
  /** Mean of (this examiner − the other marker), in percentage points of the total. */
  meanDifference: number | null;
  standardError: number | null;
  lower: number | null;
  upper: number | null;
  /** What the 95 % interval says: lower, higher or no clear difference. */
  reading: 'more severe' | 'more lenient' | 'no clear difference' | null;
  note: string | null;
}

export interface AgreementReport {
  scope: { kind: 'sitting' | 'term'; id: string; title: string; from: string; to: string };
  sittings: { id: string; title: string; date: string }[];
  /** Totals are compared as a percentage of each paper's total marks, so grades can be pooled. */
  totalsAs: 'percentage';
  counts: {
    /** Slots with a second examiner. */
    doubleMarkedSlots: number;
    /** Candidates in the figures: completed, both sheets submitted and scored. */
    included: number;
    /** Left out: absent, withdrawn or incomplete (by the slot or either sheet). */
    notCompleted: number;
    /** Left out: a sheet missing or not yet submitted. */
    notSubmitted: number;
  };
  thresholds: { minCandidates: number; minSheetsForSeverity: number };
  icc: IccFigure;
  bands: BandAgreementFigure;
  pairs: PairKappa[];
  severity: SeverityFigure[];
  /** The published scales the report uses, to show in full. */
  scales: InterpretationScale[];
}

/** What a caller may report on: terms and sittings with double marking. */
export interface AgreementScopes {
  terms: { id: string; name: string; academicYear: string; startsOn: string; endsOn: string }[];
  sittings: {
    id: string;
    title: string;
    date: string;
    status: string;
    doubleMarkedSlots: number;
  }[];
}
