import { describe, expect, it } from 'vitest';
import type { RequirementLine, RequirementListVersion, SelectionRule } from '../music/domain.js';
import { DrawError, drawRequests, requestIdentity } from './draw.js';

// Property-style tests: each property checked over many seeds (the draw has no published worked
// example; the properties are the rule of design.md §4.4).
const base = {
  motions: [],
  octaves: [2],
  articulations: ['legato'],
  dynamics: [],
  inversions: [],
  tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 },
  rubricVersionId: 'rv-scales',
} as const;
const line = (
  l: Partial<RequirementLine> & Pick<RequirementLine, 'id' | 'kind'>,
): RequirementLine => ({
  keys: [],
  modes: [],
  hands: ['HT'],
  difficultyWeight: 1,
  ...base,
  articulations: [...base.articulations],
  motions: [],
  octaves: [...base.octaves],
  dynamics: [],
  inversions: [],
  tempo: { ...base.tempo },
  ...l,
});
const list: RequirementListVersion = {
  id: 'grade-5',
  totalMarks: 30,
  selectionRule: { count: 6, minPerKind: { scale: 2, arpeggio: 1, passage: 1 } },
  lines: [
    line({
      id: 'sc-a',
      kind: 'scale',
      keys: ['D', 'A', 'E', 'Bb'],
      modes: ['major', 'harmonic_minor'],
      motions: ['similar', 'contrary'],
      articulations: ['legato', 'staccato'],
    }),
    line({
      id: 'sc-b',
      kind: 'scale',
      keys: ['B', 'F#'],
      modes: ['major', 'melodic_minor'],
      hands: ['RH', 'LH'],
      difficultyWeight: 1.5,
      octaves: [2, 3],
    }),
    line({
      id: 'ar',
      kind: 'arpeggio',
      keys: ['D', 'A', 'G'],
      modes: ['major', 'harmonic_minor'],
      hands: ['RH', 'LH', 'HT'],
      inversions: ['root', 'first'],
    }),
    line({ id: 'ch', kind: 'chromatic', keys: ['D', 'Eb'], motions: ['similar', 'contrary'] }),
    line({
      id: 'd7',
      kind: 'dominant_seventh',
      keys: ['C', 'G'],
      hands: ['RH', 'LH'],
      difficultyWeight: 1.2,
    }),
    line({
      id: 'pa',
      kind: 'passage',
      titles: ['Study in C', 'Study in G'],
      durationSeconds: 60,
      difficultyWeight: 2,
    }),
  ],
};
const rule = list.selectionRule;
const SEEDS = Array.from({ length: 400 }, (_, i) => `slot-${i}`);

describe('drawRequests properties over 400 seeds', () => {
  it('honours the rule: exactly count requests, minimum per kind, no request twice', () => {
    for (const seed of SEEDS) {
      const { requests } = drawRequests(list, rule, seed);
      expect(requests).toHaveLength(6);
      const kinds = requests.map((r) => r.kind);
      expect(kinds.filter((k) => k === 'scale').length).toBeGreaterThanOrEqual(2);
      expect(kinds.filter((k) => k === 'arpeggio').length).toBeGreaterThanOrEqual(1);
      expect(kinds.filter((k) => k === 'passage').length).toBeGreaterThanOrEqual(1);
      expect(new Set(requests.map(requestIdentity)).size).toBe(6);
      expect(requests.map((r) => r.index)).toEqual([0, 1, 2, 3, 4, 5]);
    }
  });
  it('the same seed gives the same draw; the seeds give many different draws', () => {
    const seen = new Set<string>();
    for (const seed of SEEDS) {
      const a = drawRequests(list, rule, seed);
      expect(drawRequests(list, rule, seed)).toEqual(a);
      seen.add(JSON.stringify(a.requests));
    }
    expect(seen.size).toBeGreaterThan(300);
  });
  it('spreads kinds: after the minimums the two further requests go to the kinds not yet drawn', () => {
    for (const seed of SEEDS) {
      const kinds = new Set(drawRequests(list, rule, seed).requests.map((r) => r.kind));
      expect([...kinds].sort()).toEqual([
        'arpeggio',
        'chromatic',
        'dominant_seventh',
        'passage',
        'scale',
      ]);
    }
  });
  it('spreads difficulty: the two scales come from the two difficulty weights (1 and 1.5)', () => {
    for (const seed of SEEDS) {
      const weights = drawRequests(list, rule, seed)
        .requests.filter((r) => r.kind === 'scale')
        .map((r) => r.difficultyWeight);
      expect(weights.sort()).toEqual([1, 1.5]);
    }
  });
  it('every request a line offers can be drawn (no option is starved)', () => {
    const arps = new Set<string>();
    for (const seed of SEEDS)
      for (const r of drawRequests(list, rule, seed).requests)
        if (r.kind === 'arpeggio') arps.add(requestIdentity(r));
    // 3 keys × 2 modes × (RH, LH, HT similar) × 2 inversions
    expect(arps.size).toBe(36);
  });
  it('requests carry only what applies: motion for HT only, mode for modal kinds, title for passages', () => {
    for (const seed of SEEDS.slice(0, 100)) {
      for (const r of drawRequests(list, rule, seed).requests) {
        expect(r.motion === null).toBe(r.hands !== 'HT' || r.kind === 'passage');
        expect(r.mode === null).toBe(!['scale', 'arpeggio', 'broken_chord'].includes(r.kind));
        expect(r.title === null).toBe(r.kind !== 'passage');
        expect(r.key === null).toBe(r.kind === 'passage');
      }
    }
  });
  it('avoids the previous requests when the pool allows', () => {
    for (const seed of SEEDS.slice(0, 200)) {
      const before = drawRequests(list, rule, `${seed}-last-term`).requests;
      const now = drawRequests(list, rule, seed, { previous: before });
      const prev = new Set(before.map(requestIdentity));
      expect(now.requests.some((r) => prev.has(requestIdentity(r)))).toBe(false);
      expect(now.repeatsOfPrevious).toBe(0);
    }
  });
  it('repeats a previous request only when nothing else is left, and says so', () => {
    const tiny = [line({ id: 's', kind: 'scale', keys: ['C', 'G', 'D'], modes: ['major'] })];
    const r: SelectionRule = { count: 2, minPerKind: { scale: 2 } };
    const previous = drawRequests({ lines: tiny }, r, 1).requests;
    for (const seed of SEEDS.slice(0, 50)) {
      const d = drawRequests({ lines: tiny }, r, seed, { previous });
      expect(d.requests).toHaveLength(2);
      expect(d.repeatsOfPrevious).toBe(1); // only one fresh key remains
    }
  });
});

describe('drawRequests refuses impossible rules with a clear error', () => {
  it('a minimum larger than the list offers', () => {
    expect(() => drawRequests(list, { count: 6, minPerKind: { chromatic: 5 } }, 's')).toThrow(
      /at least 5 chromatic.*only 4/,
    );
  });
  it('more requests than the list offers', () => {
    const tiny = { lines: [line({ id: 's', kind: 'scale', keys: ['C'], modes: ['major'] })] };
    expect(() => drawRequests(tiny, { count: 2, minPerKind: {} }, 's')).toThrow(DrawError);
  });
  it('minimums adding up to more than the count, or a count below 1', () => {
    expect(() =>
      drawRequests(list, { count: 2, minPerKind: { scale: 2, arpeggio: 1 } }, 's'),
    ).toThrow(/add up to 3/);
    expect(() => drawRequests(list, { count: 0, minPerKind: {} }, 's')).toThrow(/at least one/);
  });
});

describe('substitutions (access arrangements)', () => {
  it('hands separately turns every HT request into RH then LH, recording the original', () => {
    for (const seed of SEEDS.slice(0, 100)) {
      const plain = drawRequests(list, rule, seed).requests;
      const sub = drawRequests(list, rule, seed, {
        substitutions: [{ type: 'hands_separately' }],
      }).requests;
      const ht = plain.filter((r) => r.hands === 'HT').length;
      expect(sub).toHaveLength(6 + ht);
      expect(sub.some((r) => r.hands === 'HT')).toBe(false);
      const split = sub.filter((r) => r.substitution?.types.includes('hands_separately'));
      expect(split).toHaveLength(2 * ht);
      expect(split.every((r) => r.motion === null && r.substitution?.original.hands === 'HT')).toBe(
        true,
      );
    }
  });
  it('single hand, octave limit and tempo percentage', () => {
    const d = drawRequests(list, rule, 'x', {
      substitutions: [
        { type: 'single_hand', hand: 'LH', appliesTo: ['scale'] },
        { type: 'max_octaves', octaves: 1 },
        { type: 'tempo_percent', percent: 75 },
      ],
    }).requests;
    expect(d.filter((r) => r.kind === 'scale').some((r) => r.hands === 'HT')).toBe(false);
    // appliesTo is respected: the chromatic scale (HT only) stays hands together.
    expect(d.find((r) => r.kind === 'chromatic')?.hands).toBe('HT');
    expect(
      d
        .filter((r) => r.kind === 'scale' && r.substitution?.types.includes('single_hand'))
        .every((r) => r.hands === 'LH'),
    ).toBe(true);
    expect(d.every((r) => r.octaves <= 1)).toBe(true);
    expect(d.every((r) => r.tempo.bpm === 60)).toBe(true);
  });
  it('refuses two hands substitutions for the same kind and impossible values', () => {
    expect(() =>
      drawRequests(list, rule, 'x', {
        substitutions: [{ type: 'hands_separately' }, { type: 'single_hand', hand: 'RH' }],
      }),
    ).toThrow(/More than one hands/);
    expect(() =>
      drawRequests(list, rule, 'x', { substitutions: [{ type: 'tempo_percent', percent: 0 }] }),
    ).toThrow(/tempo_percent/);
  });
});
