// Interpretation bands for agreement figures, with their published sources, as data the report
// can show beside each figure (issue 7 §3).

export interface InterpretationBand {
  label: string;
  /** The band starts at this value; `inclusive` says whether the value itself belongs to it. */
  min: number;
  inclusive: boolean;
}

export interface InterpretationScale {
  key: 'koo_li_2016' | 'landis_koch_1977' | 'krippendorff_2004';
  /** For which statistic the scale was published. */
  statistic: string;
  source: string;
  note?: string;
  /** From the highest band down; a value takes the first band it reaches. */
  bands: InterpretationBand[];
  /** Label below every band. */
  below: string;
}

export const KOO_LI_2016: InterpretationScale = {
  key: 'koo_li_2016',
  statistic: 'ICC',
  source:
    'Koo, T. K., & Li, M. Y. (2016). A guideline of selecting and reporting intraclass correlation coefficients for reliability research. Journal of Chiropractic Medicine, 15(2), 155–163.',
  note: 'The authors advise judging by the 95 % confidence interval, not the point estimate alone.',
  bands: [
    { label: 'excellent', min: 0.9, inclusive: false },
    { label: 'good', min: 0.75, inclusive: true },
    { label: 'moderate', min: 0.5, inclusive: true },
  ],
  below: 'poor',
};

export const LANDIS_KOCH_1977: InterpretationScale = {
  key: 'landis_koch_1977',
  statistic: 'kappa',
  source:
    'Landis, J. R., & Koch, G. G. (1977). The measurement of observer agreement for categorical data. Biometrics, 33(1), 159–174.',
  note: 'Bands as published to two decimals (0.81–1.00 almost perfect …); values are rounded to two decimals before banding.',
  bands: [
    { label: 'almost perfect', min: 0.81, inclusive: true },
    { label: 'substantial', min: 0.61, inclusive: true },
    { label: 'moderate', min: 0.41, inclusive: true },
    { label: 'fair', min: 0.21, inclusive: true },
    { label: 'slight', min: 0, inclusive: true },
  ],
  below: 'poor',
};

export const KRIPPENDORFF_2004: InterpretationScale = {
  key: 'krippendorff_2004',
  statistic: "Krippendorff's alpha",
  source:
    'Krippendorff, K. (2004). Content Analysis: An Introduction to Its Methodology (2nd ed.), §11.4. Sage.',
  bands: [
    { label: 'reliable', min: 0.8, inclusive: true },
    { label: 'tentative conclusions only', min: 0.667, inclusive: true },
  ],
  below: 'unreliable',
};

export const INTERPRETATION_SCALES = [KOO_LI_2016, LANDIS_KOCH_1977, KRIPPENDORFF_2004] as const;

/** The band label of a value on a scale, with the scale's source to show beside it. */
export function interpret(
  value: number,
  scale: InterpretationScale,
): { label: string; source: string } {
  if (!Number.isFinite(value)) throw new RangeError(`Cannot interpret ${String(value)}.`);
  const v = scale.key === 'landis_koch_1977' ? Math.round(value * 100) / 100 : value;
  for (const b of scale.bands)
    if (b.inclusive ? v >= b.min : v > b.min) return { label: b.label, source: scale.source };
  return { label: scale.below, source: scale.source };
}
