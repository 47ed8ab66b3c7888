import { describe, expect, it } from 'vitest';
import { formatFingering, parseFingering, validateFingering } from './fingering.js';

describe('validateFingering against common-practice fingerings', () => {
  it('one-octave C major, right hand up: 1-2-3-1-2-3-4-5 (common practice)', () => {
    const r = validateFingering({
      kind: 'scale',
      octaves: 1,
      direction: 'up',
      digits: [1, 2, 3, 1, 2, 3, 4, 5],
    });
    expect(r).toEqual({ ok: true, errors: [], expectedLength: 8 });
  });
  it('one-octave C major, left hand up: 5-4-3-2-1-3-2-1 (common practice)', () => {
    expect(
      validateFingering({
        kind: 'scale',
        octaves: 1,
        direction: 'up',
        digits: [5, 4, 3, 2, 1, 3, 2, 1],
      }).ok,
    ).toBe(true);
  });
  it('two-octave C major RH up and down, 29 fingers (common practice: 123 1234 123 12345, reversed)', () => {
    const up = parseFingering('1-2-3-1-2-3-4-1-2-3-1-2-3-4-5');
    const down = [...up].reverse().slice(1);
    const r = validateFingering({
      kind: 'scale',
      octaves: 2,
      direction: 'up_down',
      digits: [...up, ...down],
    });
    expect(r.ok).toBe(true);
    expect(r.expectedLength).toBe(29);
  });
  it('C major arpeggio RH one octave 1-2-3-5 and LH 5-4-2-1 (common practice)', () => {
    expect(
      validateFingering({ kind: 'arpeggio', octaves: 1, direction: 'up', digits: [1, 2, 3, 5] }).ok,
    ).toBe(true);
    expect(
      validateFingering({ kind: 'arpeggio', octaves: 1, direction: 'up', digits: [5, 4, 2, 1] }).ok,
    ).toBe(true);
  });
  it('chromatic from C, RH one octave 1-3-1-3-1-2-3-1-3-1-3-1-2 (common practice)', () => {
    expect(
      validateFingering({
        kind: 'chromatic',
        octaves: 1,
        direction: 'up',
        digits: parseFingering('1 3 1 3 1 2 3 1 3 1 3 1 2'),
      }).ok,
    ).toBe(true);
  });
  it('names the 1-based position of a digit outside 1–5', () => {
    const r = validateFingering({
      kind: 'scale',
      octaves: 1,
      direction: 'up',
      digits: [1, 2, 3, 1, 6, 3, 4, 0],
    });
    expect(r.ok).toBe(false);
    expect(r.errors.map((e) => e.position)).toEqual([5, 8]);
    expect(r.errors[0]?.message).toMatch(/Position 5/);
  });
  it('reports a wrong length with the first missing position', () => {
    const r = validateFingering({
      kind: 'scale',
      octaves: 1,
      direction: 'up',
      digits: [1, 2, 3, 1, 2, 3, 4],
    });
    expect(r.errors).toEqual([expect.objectContaining({ code: 'length', position: 8 })]);
    const long = validateFingering({
      kind: 'arpeggio',
      octaves: 1,
      direction: 'up',
      digits: [1, 2, 3, 5, 3],
    });
    expect(long.errors[0]).toMatchObject({ code: 'length', position: 5 });
  });
  it('rejects fractional digits', () => {
    expect(
      validateFingering({ kind: 'arpeggio', octaves: 1, direction: 'up', digits: [1, 2.5, 3, 5] })
        .errors[0]?.position,
    ).toBe(2);
  });
  it('a passage needs a stated note count', () => {
    expect(
      validateFingering({ kind: 'passage', octaves: 1, direction: 'up', digits: [1, 2] }).errors[0]
        ?.code,
    ).toBe('no_note_count');
    expect(
      validateFingering({
        kind: 'passage',
        octaves: 1,
        direction: 'up',
        digits: [1, 2],
        noteCount: 2,
      }).ok,
    ).toBe(true);
  });
});

describe('parseFingering / formatFingering', () => {
  it('reads hyphens, spaces, commas and a plain run of digits', () => {
    expect(parseFingering('1-2-3-1')).toEqual([1, 2, 3, 1]);
    expect(parseFingering('1, 2 3')).toEqual([1, 2, 3]);
    expect(parseFingering('12312345')).toEqual([1, 2, 3, 1, 2, 3, 4, 5]);
    expect(parseFingering('  ')).toEqual([]);
  });
  it('names the bad piece', () => {
    expect(() => parseFingering('1-2-x-4')).toThrow(/Position 3: "x"/);
    expect(() => parseFingering('1-23')).toThrow(/Position 2/);
  });
  it('round-trips', () => {
    expect(formatFingering(parseFingering('5-4-3-2-1-3-2-1'))).toBe('5-4-3-2-1-3-2-1');
  });
});
