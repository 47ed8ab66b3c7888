// A synthesised practice performance for the demo's standardisation exercise: our own sound made
// in code (no recording of anyone), written as a PCM WAVE file.

export interface SynthNote {
  /** MIDI note number (60 = middle C). */
  midi: number;
  /** Start and length in seconds. */
  start: number;
  duration: number;
  /** 0..1 */
  velocity: number;
}

/** Twelve-tone equal temperament with A4 = 440 Hz (the standard pitch of ISO 16:1975). */
export function frequencyOf(midi: number): number {
  return 440 * 2 ** ((midi - 69) / 12);
}

/**
 * 16-bit mono PCM in a RIFF/WAVE container (the canonical 44-byte header: "RIFF", size, "WAVE",
 * a 16-byte "fmt " chunk with format 1 = PCM, then "data").
 */
export function encodeWav(samples: Float32Array, sampleRate: number): Buffer {
  const dataBytes = samples.length * 2;
  const b = Buffer.alloc(44 + dataBytes);
  b.write('RIFF', 0, 'ascii');
  b.writeUInt32LE(36 + dataBytes, 4);
  b.write('WAVE', 8, 'ascii');
  b.write('fmt ', 12, 'ascii');
  b.writeUInt32LE(16, 16);
  b.writeUInt16LE(1, 20); // PCM
  b.writeUInt16LE(1, 22); // mono
  b.writeUInt32LE(sampleRate, 24);
  b.writeUInt32LE(sampleRate * 2, 28); // byte rate
  b.writeUInt16LE(2, 32); // block align
  b.writeUInt16LE(16, 34); // bits per sample
  b.write('data', 36, 'ascii');
  b.writeUInt32LE(dataBytes, 40);
  for (let i = 0; i < samples.length; i++) {
    const v = Math.max(-1, Math.min(1, samples[i]!));
    b.writeInt16LE(Math.round(v * 32767), 44 + i * 2);
  }
  return b;
}

/** A plucked, piano-like tone: a few harmonics under a fast attack and exponential decay. */
export function render(notes: readonly SynthNote[], sampleRate = 22_050, tail = 0.8): Float32Array {
  const end = Math.max(0, ...notes.map((n) => n.start + n.duration)) + tail;
  const out = new Float32Array(Math.ceil(end * sampleRate));
  for (const n of notes) {
    const f = frequencyOf(n.midi);
    const first = Math.floor(n.start * sampleRate);
    const length = Math.floor((n.duration + tail) * sampleRate);
    for (let i = 0; i < length && first + i < out.length; i++) {
      const t = i / sampleRate;
      const attack = Math.min(1, t / 0.005);
      // Held for its length, then released quickly (the key comes up).
      const release = t < n.duration ? 1 : Math.exp(-(t - n.duration) / 0.06);
      const env = attack * Math.exp(-t / 0.9) * release * n.velocity;
      const s = Math.sin(2 * Math.PI * f * t) + 0.35 * Math.sin(4 * Math.PI * f * t) + 0.12 * Math.sin(6 * Math.PI * f * t);
      out[first + i] = out[first + i]! + 0.3 * env * s;
    }
  }
  return out;
}

/**
 * The demo exercise's performance: D major, one octave up and down, quavers at crotchet = 88,
 * with what an examiner should hear: the fourth note (G) arrives late and the descent rushes a
 * little, and the top note is played louder than the rest.
 */
export function demoScalePerformance(): { notes: SynthNote[]; wav: Buffer; sampleRate: number } {
  const D_MAJOR = [62, 64, 66, 67, 69, 71, 73, 74];
  const pitches = [...D_MAJOR, ...D_MAJOR.slice(0, -1).reverse()];
  const step = 60 / 88 / 2; // a quaver at crotchet = 88
  let t = 0.3;
  const notes = pitches.map((midi, i) => {
    const late = i === 3 ? 0.09 : 0;
    const rushed = i > 8 ? -0.025 : 0;
    const note = { midi, start: t + late, duration: step * 0.92, velocity: i === 7 ? 1 : 0.7 };
    t += step + rushed;
    return note;
  });
  const sampleRate = 22_050;
  return { notes, wav: encodeWav(render(notes, sampleRate), sampleRate), sampleRate };
}
