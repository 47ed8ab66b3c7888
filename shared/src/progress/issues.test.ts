import { describe, expect, it } from 'vitest';
import { consistencyShare, entrenchedIssues, slipRate, type SittingEvidence } from './issues.js';

// The rule of design.md §4.6, checked on hand-made histories.
const s = (
  id: string,
  date: string,
  examiners: string[],
  tension: number | null,
  outcome: SittingEvidence['outcome'] = 'completed',
): SittingEvidence => ({
  sittingId: id,
  date,
  outcome,
  examinerIds: examiners,
  criteria:
    tension === null
      ? [{ key: 'accuracy', marks: 8, maximum: 10 }]
      : [
          { key: 'tension', label: 'Freedom from tension', marks: tension, maximum: 10 },
          { key: 'accuracy', marks: 8, maximum: 10 },
        ],
});

describe('entrenchedIssues', () => {
  it('three low sittings by two examiners → an issue, with its evidence', () => {
    const r = entrenchedIssues([
      s('a', '2026-01-10', ['x'], 5),
      s('b', '2026-02-10', ['x'], 4),
      s('c', '2026-03-10', ['y'], 5),
    ]);
    expect(r).toEqual([
      {
        criterionKey: 'tension',
        label: 'Freedom from tension',
        sittingIds: ['a', 'b', 'c'],
        fractions: [0.5, 0.4, 0.5],
        examinerIds: ['x', 'y'],
        since: '2026-01-10',
      },
    ]);
  });
  it('the same examiner three times is not enough', () => {
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['x'], 4),
        s('c', '2026-03-10', ['x'], 5),
      ]),
    ).toEqual([]);
  });
  it('an absent sitting neither breaks nor counts; a good mark breaks the run', () => {
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['y'], 4),
        s('z', '2026-02-20', [], null, 'absent'),
        s('c', '2026-03-10', ['x'], 5),
      ]),
    ).toHaveLength(1);
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['y'], 8),
        s('c', '2026-03-10', ['x'], 5),
        s('d', '2026-04-10', ['y'], 5),
      ]),
    ).toEqual([]);
  });
  it('60 % exactly is not below 60 %; a resolved run (latest sitting fine) is not current', () => {
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 6),
        s('b', '2026-02-10', ['y'], 6),
        s('c', '2026-03-10', ['x'], 6),
      ]),
    ).toEqual([]);
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['y'], 5),
        s('c', '2026-03-10', ['x'], 5),
        s('d', '2026-04-10', ['x'], 9),
      ]),
    ).toEqual([]);
  });
  it('a completed sitting that did not assess the criterion breaks the run; input order does not matter', () => {
    expect(
      entrenchedIssues([
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['y'], null),
        s('c', '2026-03-10', ['x'], 5),
        s('d', '2026-04-10', ['y'], 5),
      ]),
    ).toEqual([]);
    expect(
      entrenchedIssues([
        s('c', '2026-03-10', ['y'], 5),
        s('a', '2026-01-10', ['x'], 5),
        s('b', '2026-02-10', ['x'], 4),
      ])[0]?.sittingIds,
    ).toEqual(['a', 'b', 'c']);
  });
});

describe('slip rate and consistency (design.md §4.3; hand-worked)', () => {
  it('3 slips in 58 notes (two-octave scale HT, up and down) = 5.17 per 100 notes', () => {
    expect(slipRate({ slips: 3, notesPlayed: 58 })).toBeCloseTo(300 / 58, 12);
    expect(() => slipRate({ slips: 1, notesPlayed: 0 })).toThrow(/notesPlayed/);
  });
  it('consistency: 3 of 4 attempts without a slip = 0.75; none → null', () => {
    expect(consistencyShare([{ slips: 0 }, { slips: 2 }, { slips: 0 }, { slips: 0 }])).toEqual({
      share: 0.75,
      n: 4,
    });
    expect(consistencyShare([])).toBeNull();
  });
});
