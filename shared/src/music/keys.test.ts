import { Key, Scale } from '@tonaljs/tonal';
import { describe, expect, it } from 'vitest';
import { MODES } from './domain.js';
import {
  allowedKeys,
  diminishedSeventhNotes,
  dominantSeventhNotes,
  keyLabel,
  keySignatureAccidentals,
  normaliseKeyName,
  requestPitchClasses,
  scaleNotes,
  scaleSpelling,
  triadNotes,
} from './keys.js';

describe('scale spellings', () => {
  it('D harmonic minor is D E F G A B♭ C♯ (handbook spelling, common practice)', () => {
    expect(scaleNotes('D', 'harmonic_minor')).toEqual(['D', 'E', 'F', 'G', 'A', 'Bb', 'C#']);
  });
  it('agree with @tonaljs/tonal Scale.get and Key for every allowed key and mode', () => {
    for (const mode of MODES) {
      for (const tonic of allowedKeys(mode)) {
        const name = {
          major: 'major',
          harmonic_minor: 'harmonic minor',
          melodic_minor: 'melodic minor',
          natural_minor: 'aeolian',
        }[mode];
        expect(scaleNotes(tonic, mode)).toEqual(Scale.get(`${tonic} ${name}`).notes);
      }
    }
    expect(scaleNotes('A', 'natural_minor')).toEqual(Key.minorKey('A').natural.scale);
    expect(scaleNotes('F#', 'major')).toEqual(Key.majorKey('F#').scale);
  });
  it('handbook spellings (common practice): E♭ major, F♯ major with E♯, G♯ harmonic minor with F𝄪', () => {
    expect(scaleNotes('Eb', 'major')).toEqual(['Eb', 'F', 'G', 'Ab', 'Bb', 'C', 'D']);
    expect(scaleNotes('F#', 'major')).toEqual(['F#', 'G#', 'A#', 'B', 'C#', 'D#', 'E#']);
    expect(scaleNotes('G#', 'harmonic_minor')).toEqual(['G#', 'A#', 'B', 'C#', 'D#', 'E', 'F##']);
  });
  it('B melodic minor rises with G♯ A♯ and falls as the natural minor (classical teaching, common practice)', () => {
    expect(scaleSpelling('B', 'melodic_minor')).toEqual({
      ascending: ['B', 'C#', 'D', 'E', 'F#', 'G#', 'A#', 'B'],
      descending: ['B', 'A', 'G', 'F#', 'E', 'D', 'C#', 'B'],
    });
    expect(scaleSpelling('C', 'major').descending).toEqual([
      'C',
      'B',
      'A',
      'G',
      'F',
      'E',
      'D',
      'C',
    ]);
  });
});

describe('keys', () => {
  it('15 major keys Cb … C# and 15 minor keys Ab … A# (circle of fifths, common practice)', () => {
    expect(allowedKeys('major')).toEqual([
      'Cb',
      'Gb',
      'Db',
      'Ab',
      'Eb',
      'Bb',
      'F',
      'C',
      'G',
      'D',
      'A',
      'E',
      'B',
      'F#',
      'C#',
    ]);
    expect(allowedKeys('harmonic_minor')).toEqual([
      'Ab',
      'Eb',
      'Bb',
      'F',
      'C',
      'G',
      'D',
      'A',
      'E',
      'B',
      'F#',
      'C#',
      'G#',
      'D#',
      'A#',
    ]);
  });
  it('key signatures: D major 2 sharps, D minor 1 flat, C♭ major 7 flats (common practice)', () => {
    expect(keySignatureAccidentals('D', 'major')).toBe(2);
    expect(keySignatureAccidentals('D', 'harmonic_minor')).toBe(-1);
    expect(keySignatureAccidentals('Cb', 'major')).toBe(-7);
  });
  it('normalises names and refuses non-keys', () => {
    expect(normaliseKeyName(' eb ')).toBe('Eb');
    expect(() => normaliseKeyName('H')).toThrow(/not a key/);
    expect(() => normaliseKeyName('C4')).toThrow(/not a key/);
    expect(() => normaliseKeyName('Fbb')).toThrow(/not a key/);
  });
  it('labels keys for display', () => {
    expect(keyLabel('F#', 'major')).toBe('F♯ major');
    expect(keyLabel('bb', 'harmonic_minor')).toBe('B♭ harmonic minor');
    expect(keyLabel('Bb', null, { unicode: false })).toBe('Bb');
  });
});

describe('chords (common practice)', () => {
  it('tonic triads: D minor D F A, F♯ major F♯ A♯ C♯', () => {
    expect(triadNotes('D', 'natural_minor')).toEqual(['D', 'F', 'A']);
    expect(triadNotes('F#', 'major')).toEqual(['F#', 'A#', 'C#']);
  });
  it('dominant seventh in C is G B D F; in C minor G B D F too (harmonic minor V7)', () => {
    expect(dominantSeventhNotes('C')).toEqual(['G', 'B', 'D', 'F']);
    expect(dominantSeventhNotes('Eb')).toEqual(['Bb', 'D', 'F', 'Ab']);
  });
  it('diminished seventh on B is B D F A♭', () => {
    expect(diminishedSeventhNotes('B')).toEqual(['B', 'D', 'F', 'Ab']);
  });
  it('inversions rotate the chord: C major first inversion E G C', () => {
    expect(
      requestPitchClasses({ kind: 'arpeggio', key: 'C', mode: 'major', inversion: 'first' }),
    ).toEqual(['E', 'G', 'C']);
    expect(
      requestPitchClasses({ kind: 'dominant_seventh', key: 'C', mode: null, inversion: 'third' }),
    ).toEqual(['F', 'G', 'B', 'D']);
    expect(() =>
      requestPitchClasses({ kind: 'arpeggio', key: 'C', mode: 'major', inversion: 'third' }),
    ).toThrow(/no third inversion/);
    expect(
      requestPitchClasses({ kind: 'passage', key: null, mode: null, inversion: null }),
    ).toBeNull();
  });
});
