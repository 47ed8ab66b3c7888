// The agreement report's assembly (issue 7 §3; design.md §4.5), pure: the service loads and scores
// the double-marked pairs, this file chooses the ICC form, applies the thresholds and attaches the
// interpretation bands with their published sources.
import {
  cohenKappa,
  icc,
  interpret,
  KOO_LI_2016,
  LANDIS_KOCH_1977,
  MIN_CANDIDATES_FOR_ICC,
  MIN_SHEETS_FOR_SEVERITY,
  severity,
  type AgreementReport,
  type BandAgreementFigure,
  type ExaminerRef,
  type IccFigure,
  type PairKappa,
  type SeverityFigure,
} from '@stavemark/shared';

export interface MarkerScore {
  examiner: ExaminerRef;
  /** The sheet's rounded total as a percentage of the paper's total marks. */
  percent: number;
  /** The band's place in its policy, 0 = the lowest band. */
  bandRank: number;
}

/** One double-marked candidate: both sheets submitted and scored. */
export interface ScoredPair {
  slotId: string;
  first: MarkerScore;
  second: MarkerScore;
}

export interface ReportInput {
  scope: AgreementReport['scope'];
  sittings: AgreementReport['sittings'];
  counts: Omit<AgreementReport['counts'], 'included'>;
  pairs: readonly ScoredPair[];
  /** Number of bands in the policy (the widest one when sittings differ), for kappa's weights. */
  bandLevels: number;
}

const TOO_FEW = (n: number) =>
  `Too few to judge: ${n} double-marked candidate${n === 1 ? '' : 's'}, an interpretation needs at least ${MIN_CANDIDATES_FOR_ICC}.`;
const ICC_METHOD =
  'Shrout, P. E., & Fleiss, J. L. (1979). Intraclass correlations: uses in assessing rater reliability. Psychological Bulletin, 86(2), 420–428; 95 % interval after McGraw, K. O., & Wong, S. P. (1996). Forming inferences about some intraclass correlation coefficients. Psychological Methods, 1(1), 30–46.';

const pairKey = (a: string, b: string) => (a < b ? `${a}|${b}` : `${b}|${a}`);

/** The ICC form design.md §4.5 asks for: ICC(2,1) when one fixed pair marked every candidate. */
export function chooseIccForm(pairs: readonly ScoredPair[]): {
  form: IccFigure['form'];
  reason: string;
} {
  const keys = new Set(pairs.map((p) => pairKey(p.first.examiner.id, p.second.examiner.id)));
  if (pairs.length > 0 && keys.size === 1) {
    const [a, b] = [pairs[0]!.first.examiner.name, pairs[0]!.second.examiner.name].sort();
    return {
      form: 'ICC(2,1)',
      reason: `The same two examiners (${a} and ${b}) marked every candidate: two-way random effects, absolute agreement, single rater.`,
    };
  }
  return {
    form: 'ICC(1,1)',
    reason:
      keys.size > 1
        ? `Double-marking pairs vary (${keys.size} different pairs): one-way random effects, single rater.`
        : 'One-way random effects, single rater (pairs vary or are unknown).',
  };
}

function iccFigure(pairs: readonly ScoredPair[]): IccFigure {
  const { form, reason } = chooseIccForm(pairs);
  const n = pairs.length;
  const enough = n >= MIN_CANDIDATES_FOR_ICC;
  const base = {
    form,
    formReason: reason,
    n,
    enough,
    method: ICC_METHOD,
  };
  const empty = { value: null, lower: null, upper: null, interpretation: null, intervalInterpretation: null };
  if (n < 2)
    return { ...base, ...empty, note: n === 0 ? 'No double-marked candidate has both sheets submitted yet.' : TOO_FEW(n) };
  // ICC(2,1) needs the same examiner in the same column: order each row by examiner id.
  const fixedOrder = form === 'ICC(2,1)' ? [pairs[0]!.first.examiner.id, pairs[0]!.second.examiner.id].sort() : null;
  const rows = pairs.map((p) => {
    if (!fixedOrder) return [p.first.percent, p.second.percent];
    return p.first.examiner.id === fixedOrder[0] ? [p.first.percent, p.second.percent] : [p.second.percent, p.first.percent];
  });
  let r: ReturnType<typeof icc>;
  try {
    r = icc(rows, form);
  } catch (e) {
    return { ...base, ...empty, note: `No ICC: ${(e as Error).message}` };
  }
  return {
    ...base,
    value: r.value,
    lower: r.lower,
    upper: r.upper,
    interpretation: enough ? interpret(r.value, KOO_LI_2016) : null,
    intervalInterpretation: enough
      ? { lower: interpret(r.lower, KOO_LI_2016).label, upper: interpret(r.upper, KOO_LI_2016).label }
      : null,
    note: enough ? null : TOO_FEW(n),
  };
}

function bandFigure(pairs: readonly ScoredPair[]): BandAgreementFigure {
  const n = pairs.length;
  const note =
    'Shares of candidates given the same band, and the same or a neighbouring band, by both examiners. No published interpretation scale is applied to these shares; read them with n.';
  if (n === 0) return { n, exact: null, adjacent: null, note };
  const exact = pairs.filter((p) => p.first.bandRank === p.second.bandRank).length;
  const adjacent = pairs.filter((p) => Math.abs(p.first.bandRank - p.second.bandRank) <= 1).length;
  return { n, exact: exact / n, adjacent: adjacent / n, note };
}

function pairKappas(pairs: readonly ScoredPair[], bandLevels: number): PairKappa[] {
  const groups = new Map<string, { a: ExaminerRef; b: ExaminerRef; rows: [number, number][] }>();
  for (const p of pairs) {
    const [a, b] = p.first.examiner.id < p.second.examiner.id ? [p.first, p.second] : [p.second, p.first];
    const key = pairKey(a.examiner.id, b.examiner.id);
    const g = groups.get(key) ?? { a: a.examiner, b: b.examiner, rows: [] };
    g.rows.push([a.bandRank, b.bandRank]);
    groups.set(key, g);
  }
  const categories = Array.from({ length: Math.max(2, bandLevels) }, (_, i) => i);
  return [...groups.values()]
    .map((g): PairKappa => {
      const n = g.rows.length;
      const enough = n >= MIN_CANDIDATES_FOR_ICC;
      try {
        const k = cohenKappa(
          g.rows.map((r) => r[0]),
          g.rows.map((r) => r[1]),
          'quadratic',
          { categories },
        );
        return {
          examiners: [g.a, g.b],
          n,
          kappa: k.value,
          standardError: k.standardError,
          enough,
          interpretation: enough ? interpret(k.value, LANDIS_KOCH_1977) : null,
          note: enough ? null : TOO_FEW(n),
        };
      } catch (e) {
        return {
          examiners: [g.a, g.b],
          n,
          kappa: null,
          standardError: null,
          enough,
          interpretation: null,
          note: `No kappa: ${(e as Error).message}`,
        };
      }
    })
    .sort((x, y) => y.n - x.n || x.examiners[0].name.localeCompare(y.examiners[0].name));
}

function severities(pairs: readonly ScoredPair[]): SeverityFigure[] {
  const by = new Map<string, { examiner: ExaminerRef; diffs: { examiner: number; other: number }[] }>();
  for (const p of pairs) {
    for (const [me, other] of [
      [p.first, p.second],
      [p.second, p.first],
    ] as const) {
      const e = by.get(me.examiner.id) ?? { examiner: me.examiner, diffs: [] };
      e.diffs.push({ examiner: me.percent, other: other.percent });
      by.set(me.examiner.id, e);
    }
  }
  return [...by.values()]
    .map(({ examiner, diffs }): SeverityFigure => {
      const n = diffs.length;
      if (n < MIN_SHEETS_FOR_SEVERITY)
        return {
          examiner,
          n,
          shown: false,
          meanDifference: null,
          standardError: null,
          lower: null,
          upper: null,
          reading: null,
          note: `Shown from ${MIN_SHEETS_FOR_SEVERITY} double-marked sheets; ${n} so far.`,
        };
      const s = severity(diffs);
      const reading =
        s.upper !== null && s.upper < 0
          ? 'more severe'
          : s.lower !== null && s.lower > 0
            ? 'more lenient'
            : 'no clear difference';
      return {
        examiner,
        n,
        shown: true,
        meanDifference: s.meanDifference,
        standardError: s.standardError,
        lower: s.lower,
        upper: s.upper,
        reading,
        note: null,
      };
    })
    .sort((a, b) => a.examiner.name.localeCompare(b.examiner.name));
}

export function buildAgreementReport(input: ReportInput): AgreementReport {
  return {
    scope: input.scope,
    sittings: input.sittings,
    totalsAs: 'percentage',
    counts: { ...input.counts, included: input.pairs.length },
    thresholds: { minCandidates: MIN_CANDIDATES_FOR_ICC, minSheetsForSeverity: MIN_SHEETS_FOR_SEVERITY },
    icc: iccFigure(input.pairs),
    bands: bandFigure(input.pairs),
    pairs: pairKappas(input.pairs, input.bandLevels),
    severity: severities(input.pairs),
    scales: [KOO_LI_2016, LANDIS_KOCH_1977],
  };
}
