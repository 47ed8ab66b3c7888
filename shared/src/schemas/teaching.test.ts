import { describe, expect, it } from 'vitest';
import { rubricFileSchema } from './rubrics.js';
import { studentFingeringBodySchema } from './fingerings.js';

const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  (r.error?.issues ?? []).map((i) => i.path.join('.'));

describe('student fingering body', () => {
  // C major, one octave, right hand: 1-2-3-1-2-3-4-5 up (common practice, from memory).
  const body = {
    kind: 'scale',
    key: 'c',
    mode: 'major',
    hand: 'RH',
    octaves: 1,
    direction: 'up',
    digits: [1, 2, 3, 1, 2, 3, 4, 5],
  };

  it('accepts a fingering of the right length and normalises the key with the music-theory library', () => {
    const r = studentFingeringBodySchema.parse(body);
    expect(r.key).toBe('C');
    expect(r.inversion).toBeNull();
  });

  it('names the field and position of every problem', () => {
    expect(
      paths(studentFingeringBodySchema.safeParse({ ...body, digits: [1, 2, 3, 1, 2, 3, 4] })),
    ).toEqual(['digits']);
    expect(
      paths(studentFingeringBodySchema.safeParse({ ...body, digits: [1, 2, 0, 1, 2, 3, 4, 5] })),
    ).toEqual(['digits.2']);
    expect(paths(studentFingeringBodySchema.safeParse({ ...body, mode: null }))).toEqual(['mode']);
    // A chromatic scale has no mode; one octave up is 12·1+1 = 13 notes, so only the mode is wrong.
    expect(
      paths(
        studentFingeringBodySchema.safeParse({
          ...body,
          kind: 'chromatic',
          digits: Array(13).fill(1),
        }),
      ),
    ).toEqual(['mode']);
    expect(paths(studentFingeringBodySchema.safeParse({ ...body, inversion: 'first' }))).toEqual([
      'inversion',
    ]);
    expect(paths(studentFingeringBodySchema.safeParse({ ...body, key: 'H' }))).toEqual(['key']);
    expect(paths(studentFingeringBodySchema.safeParse({ ...body, hand: 'HT' }))).toEqual(['hand']);
    expect(paths(studentFingeringBodySchema.safeParse({ ...body, extra: 1 }))).toEqual(['']);
  });

  it('checks the length against up-and-down counts: a one-octave scale up and down is 15 notes', () => {
    // 2·(7·1+1)−1 = 15 (design.md §4.2, worked by hand).
    const upDown = [1, 2, 3, 1, 2, 3, 4, 5, 4, 3, 2, 1, 3, 2, 1];
    expect(
      studentFingeringBodySchema.safeParse({ ...body, direction: 'up_down', digits: upDown })
        .success,
    ).toBe(true);
    expect(studentFingeringBodySchema.safeParse({ ...body, direction: 'up_down' }).success).toBe(
      false,
    );
  });
});

describe('rubric file', () => {
  const file = {
    format: 'stavemark.rubric',
    formatVersion: 1,
    rubric: {
      name: 'Scales',
      kinds: ['scale'],
      criteria: [
        {
          key: 'evenness',
          label: 'Evenness',
          weight: 1,
          maxMark: 4,
          descriptors: [{ min: 0, max: 4, text: 'x' }],
        },
      ],
    },
  };
  it('accepts a file and says where a hand-edited one went wrong', () => {
    expect(rubricFileSchema.safeParse(file).success).toBe(true);
    expect(paths(rubricFileSchema.safeParse({ ...file, format: 'other' }))).toEqual(['format']);
    expect(paths(rubricFileSchema.safeParse({ ...file, formatVersion: 2 }))).toEqual([
      'formatVersion',
    ]);
    const bad = {
      ...file,
      rubric: { ...file.rubric, criteria: [{ ...file.rubric.criteria[0], maxMark: 12 }] },
    };
    expect(paths(rubricFileSchema.safeParse(bad))).toContain('rubric.criteria.0.maxMark');
  });
});
