import { describe, expect, it } from 'vitest';
import type { Request } from '@stavemark/shared';
import { describeRequest, formatSeconds, lineFigures, tempoLabel } from './labels';

const tempo = { bpm: 80, beatUnit: 'quarter' as const, notesPerBeat: 4 };

describe('live line figures (computed with the shared functions)', () => {
  it('a two-octave scale, up and down, at crotchet 80 in semiquavers', () => {
    // Worked by hand: one way 7·2+1 = 15 notes, up and down 2·15−1 = 29; 80·4/60 = 5.33 notes a
    // second; 29 / (16/3) = 5.4375 s.
    const f = lineFigures({ kind: 'scale', octaves: [2], tempo });
    expect(f.problem).toBeNull();
    expect(f.notesPerSecond).toBeCloseTo(16 / 3, 10);
    expect(f.spans).toEqual([{ octaves: 2, direction: 'up_down', notes: 29, seconds: 5.4375 }]);
  });

  it('one entry per octave and direction the line allows, fewest octaves first', () => {
    // Arpeggio (triad), by hand: 1 octave up = 4 notes, up and down = 7; 2 octaves up = 7, up and down = 13.
    const f = lineFigures({
      kind: 'arpeggio',
      octaves: [2, 1],
      directions: ['up', 'up_down'],
      tempo: { bpm: 60, notesPerBeat: 2 },
    });
    expect(f.spans.map((s) => [s.octaves, s.direction, s.notes, s.seconds])).toEqual([
      [1, 'up', 4, 2],
      [1, 'up_down', 7, 3.5],
      [2, 'up', 7, 3.5],
      [2, 'up_down', 13, 6.5],
    ]);
  });

  it('passages use their stated playing time; incomplete lines say what is missing', () => {
    expect(lineFigures({ kind: 'passage', tempo, durationSeconds: 75 }).spans).toEqual([
      { octaves: 0, direction: 'up', notes: null, seconds: 75 },
    ]);
    expect(lineFigures({ kind: 'passage', tempo }).problem).toBe(
      'Give the playing time in seconds.',
    );
    expect(lineFigures({ kind: 'scale', octaves: [], tempo }).problem).toBe(
      'Choose the octaves to see note counts.',
    );
    expect(
      lineFigures({ kind: 'scale', octaves: [2], tempo: { bpm: Number.NaN, notesPerBeat: 4 } })
        .problem,
    ).toMatch(/Give the tempo/);
  });

  it('writes the tempo in the person’s convention', () => {
    expect(tempoLabel({ bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 }, 'british')).toBe(
      'crotchet = 80, semiquavers',
    );
    expect(tempoLabel({ bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 }, 'american')).toBe(
      'quarter = 80, sixteenths',
    );
    expect(tempoLabel({ bpm: 52, beatUnit: 'quarter', notesPerBeat: 3 }, 'british')).toBe(
      'crotchet = 52, 3 notes a beat',
    );
    expect(tempoLabel({ bpm: 60, beatUnit: 'dotted_quarter', notesPerBeat: 3 }, 'british')).toBe(
      'dotted crotchet = 60, quavers',
    );
  });

  it('formats seconds and describes a drawn request in words', () => {
    expect(formatSeconds(5.4375)).toBe('5.4 s');
    expect(formatSeconds(95)).toBe('1 min 35 s');
    const r: Request = {
      index: 0,
      lineId: 'l1',
      kind: 'scale',
      key: 'Bb',
      mode: 'harmonic_minor',
      hands: 'HT',
      motion: 'similar',
      octaves: 2,
      direction: 'up_down',
      articulation: 'legato',
      dynamic: null,
      inversion: null,
      tempo,
      rubricVersionId: 'rv',
      difficultyWeight: 1,
      title: null,
      durationSeconds: null,
      substitution: null,
    };
    expect(describeRequest(r)).toBe(
      'B♭ harmonic minor scale, hands together, similar motion, 2 octaves, up and down, legato',
    );
    expect(
      describeRequest({
        ...r,
        kind: 'diminished_seventh',
        key: 'A',
        mode: null,
        hands: 'RH',
        motion: null,
        inversion: 'first',
      }),
    ).toBe(
      'Diminished seventh starting on A, first inversion, right hand, 2 octaves, up and down, legato',
    );
    expect(
      describeRequest({
        ...r,
        kind: 'passage',
        key: null,
        mode: null,
        motion: null,
        title: 'Study in thirds',
        articulation: null,
      }),
    ).toBe('Study in thirds, hands together');
  });
});
