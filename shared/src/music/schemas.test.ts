import { describe, expect, it } from 'vitest';
import type { RequirementLine, RubricCriterion, SelectionRule } from './domain.js';
import {
  requirementLineBodySchema,
  requirementListVersionBodySchema,
  rubricBodySchema,
} from './schemas.js';

const criterion = {
  key: 'note_accuracy',
  label: 'Note accuracy',
  weight: 2,
  maxMark: 5,
  descriptors: [
    { min: 0, max: 1, text: 'Many wrong notes.' },
    { min: 2, max: 3, text: 'Some slips, recovered.' },
    { min: 4, max: 5, text: 'Secure throughout.' },
  ],
};
const line = {
  id: 'l1',
  kind: 'scale',
  keys: ['D', 'Bb'],
  modes: ['major', 'harmonic_minor'],
  hands: ['HT'],
  motions: ['similar'],
  octaves: [2],
  articulations: ['legato'],
  dynamics: [],
  inversions: [],
  tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 },
  rubricVersionId: 'rv1',
  difficultyWeight: 1,
};
const list = {
  name: 'Grade 3 technique',
  grade: '3',
  totalMarks: 21,
  selectionRule: { count: 3, minPerKind: { scale: 1 } },
  lines: [line],
};

function paths(r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) {
  return (r.error?.issues ?? []).map((i) => i.path.join('.'));
}

describe('rubric body schema', () => {
  it('accepts a valid rubric, and its criteria fit the domain type', () => {
    const r = rubricBodySchema.parse({ name: 'Scales', kinds: ['scale'], criteria: [criterion] });
    const c: RubricCriterion = r.criteria[0]!;
    expect(c.maxMark).toBe(5);
  });
  it('rejects unknown fields, weight ≤ 0, a maximum over 10, naming the field', () => {
    expect(
      paths(
        rubricBodySchema.safeParse({
          name: 'x',
          kinds: ['scale'],
          criteria: [criterion],
          colour: 'red',
        }),
      ),
    ).toContain('');
    expect(
      paths(
        rubricBodySchema.safeParse({
          name: 'x',
          kinds: ['scale'],
          criteria: [{ ...criterion, weight: 0 }],
        }),
      ),
    ).toEqual(['criteria.0.weight']);
    const over = rubricBodySchema.safeParse({
      name: 'x',
      kinds: ['scale'],
      criteria: [{ ...criterion, maxMark: 11, descriptors: [{ min: 0, max: 11, text: 'a' }] }],
    });
    expect(paths(over)).toContain('criteria.0.maxMark');
  });
  it('rejects duplicate keys and overlapping or out-of-range descriptors', () => {
    expect(
      paths(
        rubricBodySchema.safeParse({
          name: 'x',
          kinds: ['scale'],
          criteria: [criterion, criterion],
        }),
      ),
    ).toEqual(['criteria.1.key']);
    const bad = {
      ...criterion,
      descriptors: [
        { min: 0, max: 3, text: 'a' },
        { min: 3, max: 6, text: 'b' },
      ],
    };
    expect(
      paths(rubricBodySchema.safeParse({ name: 'x', kinds: ['scale'], criteria: [bad] })),
    ).toEqual(expect.arrayContaining(['criteria.0.descriptors.1.max', 'criteria.0.descriptors.1']));
  });
});

describe('requirement list schema', () => {
  it('accepts a valid list whose lines and rule fit the domain types', () => {
    const parsed = requirementListVersionBodySchema.parse(list);
    const l: Omit<RequirementLine, 'id'> = parsed.lines[0]!;
    const rule: SelectionRule = parsed.selectionRule;
    expect(l.kind).toBe('scale');
    expect(rule.count).toBe(3);
  });
  it('rejects a key that is not a note name', () => {
    expect(paths(requirementLineBodySchema.safeParse({ ...line, keys: ['H'] }))).toEqual([
      'keys.0',
    ]);
  });
  it('rejects modes on a chromatic line and a passage without titles or duration', () => {
    expect(paths(requirementLineBodySchema.safeParse({ ...line, kind: 'chromatic' }))).toEqual([
      'modes',
    ]);
    const p = requirementLineBodySchema.safeParse({
      ...line,
      kind: 'passage',
      modes: [],
      keys: [],
      octaves: [],
    });
    expect(paths(p)).toEqual(['titles', 'durationSeconds']);
  });
  it('rejects motion without hands together and a third inversion on a triad', () => {
    expect(paths(requirementLineBodySchema.safeParse({ ...line, hands: ['RH'] }))).toEqual([
      'motions',
    ]);
    expect(
      paths(
        requirementLineBodySchema.safeParse({ ...line, kind: 'arpeggio', inversions: ['third'] }),
      ),
    ).toEqual(['inversions']);
  });
  it('rejects minimums above the count and a minimum for a kind without lines', () => {
    const r = requirementListVersionBodySchema.safeParse({
      ...list,
      selectionRule: { count: 1, minPerKind: { scale: 1, arpeggio: 1 } },
    });
    expect(paths(r)).toEqual(['selectionRule.minPerKind.arpeggio', 'selectionRule.minPerKind']);
  });
  it('rejects unknown fields in a line', () => {
    expect(requirementLineBodySchema.safeParse({ ...line, speed: 'fast' }).success).toBe(false);
  });
});
