import { describe, expect, it } from 'vitest';
import { demoScalePerformance, encodeWav, frequencyOf, render } from './reference-audio.js';

describe('equal-tempered pitch (A4 = 440 Hz, ISO 16:1975)', () => {
  it('A4 440, middle C 261.626 Hz, D4 293.665 Hz (published equal-temperament tables)', () => {
    expect(frequencyOf(69)).toBe(440);
    expect(frequencyOf(60)).toBeCloseTo(261.626, 3);
    expect(frequencyOf(62)).toBeCloseTo(293.665, 3);
    expect(frequencyOf(81)).toBeCloseTo(880, 9);
  });
});

describe('the WAVE file (canonical 44-byte PCM header of the RIFF WAVE format)', () => {
  it('header fields and data length', () => {
    const wav = encodeWav(new Float32Array([0, 0.5, -0.5, 1, -1, 2]), 8000);
    expect(wav.toString('ascii', 0, 4)).toBe('RIFF');
    expect(wav.readUInt32LE(4)).toBe(36 + 12);
    expect(wav.toString('ascii', 8, 16)).toBe('WAVEfmt ');
    expect(wav.readUInt32LE(16)).toBe(16);
    expect(wav.readUInt16LE(20)).toBe(1);
    expect(wav.readUInt16LE(22)).toBe(1);
    expect(wav.readUInt32LE(24)).toBe(8000);
    expect(wav.readUInt32LE(28)).toBe(16000);
    expect(wav.readUInt16LE(32)).toBe(2);
    expect(wav.readUInt16LE(34)).toBe(16);
    expect(wav.toString('ascii', 36, 40)).toBe('data');
    expect(wav.readUInt32LE(40)).toBe(12);
    // Samples clip to ±1 and scale to ±32767, rounded (±16383.5 → 16384 and −16383, JavaScript's Math.round).
    expect([0, 1, 2, 3, 4, 5].map((i) => wav.readInt16LE(44 + i * 2))).toEqual([0, 16384, -16383, 32767, -32767, 32767]);
  });

  it('a rendered note sounds at its pitch: zero crossings of the first 0.2 s of A4 give 440 Hz', () => {
    const rate = 22_050;
    const s = render([{ midi: 69, start: 0, duration: 0.5, velocity: 1 }], rate, 0);
    let crossings = 0;
    const n = Math.floor(0.2 * rate);
    for (let i = 1; i < n; i++) if (s[i - 1]! < 0 !== s[i]! < 0) crossings++;
    // Two crossings per period (the harmonics here add none at the fundamental's crossings).
    expect(crossings / 2 / 0.2).toBeCloseTo(440, -1);
  });

  it('the demo performance: fifteen notes of D major up and down, a few seconds of mono audio', () => {
    const p = demoScalePerformance();
    expect(p.notes.map((n) => n.midi)).toEqual([62, 64, 66, 67, 69, 71, 73, 74, 73, 71, 69, 67, 66, 64, 62]);
    const seconds = p.wav.readUInt32LE(40) / 2 / p.sampleRate;
    expect(seconds).toBeGreaterThan(5);
    expect(seconds).toBeLessThan(8);
    // The fourth note is late: its gap is longer than the others'.
    const gaps = p.notes.slice(1).map((n, i) => n.start - p.notes[i]!.start);
    expect(gaps[2]).toBeGreaterThan(gaps[1]! + 0.05);
  });
});
