/**
 * Small media files made in code (our own), so tests need no binary fixtures.
 * The WAV layout follows the RIFF/WAVE PCM header (44 bytes: RIFF, fmt chunk of 16, data chunk).
 */
export function wavFile(opts: { seconds: number; sampleRate?: number; frequency?: number } = { seconds: 1 }): Buffer {
  const sampleRate = opts.sampleRate ?? 8000;
  const frequency = opts.frequency ?? 440;
  const samples = Math.round(opts.seconds * sampleRate);
  const dataBytes = samples * 2; // 16-bit mono
  const b = Buffer.alloc(44 + dataBytes);
  b.write('RIFF', 0, 'latin1');
  b.writeUInt32LE(36 + dataBytes, 4);
  b.write('WAVE', 8, 'latin1');
  b.write('fmt ', 12, 'latin1');
  b.writeUInt32LE(16, 16); // PCM fmt chunk size
  b.writeUInt16LE(1, 20); // PCM
  b.writeUInt16LE(1, 22); // mono
  b.writeUInt32LE(sampleRate, 24);
  b.writeUInt32LE(sampleRate * 2, 28); // byte rate
  b.writeUInt16LE(2, 32); // block align
  b.writeUInt16LE(16, 34); // bits per sample
  b.write('data', 36, 'latin1');
  b.writeUInt32LE(dataBytes, 40);
  for (let i = 0; i < samples; i++) {
    b.writeInt16LE(Math.round(Math.sin((2 * Math.PI * frequency * i) / sampleRate) * 12000), 44 + i * 2);
  }
  return b;
}

/** MPEG-1 Layer III frames (128 kbit/s, 44.1 kHz: 417-byte frames, header FF FB 90 64) after an ID3v2 tag. */
export function mp3LikeFile(frames = 20): Buffer {
  const id3 = Buffer.from([0x49, 0x44, 0x33, 4, 0, 0, 0, 0, 0, 0]);
  const frame = Buffer.alloc(417);
  frame.set([0xff, 0xfb, 0x90, 0x64]);
  return Buffer.concat([id3, ...Array.from({ length: frames }, () => frame)]);
}

/** Plain text, whatever name it is given. */
export function textFile(bytes = 5000): Buffer {
  return Buffer.from('These are practice notes, not a recording.\n'.repeat(Math.ceil(bytes / 43))).subarray(0, bytes);
}

/** supertest: collect a binary body as a Buffer. */
export function binary(response: unknown, cb: (err: Error | null, body: Buffer) => void): void {
  const res = response as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
  res.on('error', (e: Error) => cb(e, Buffer.alloc(0)));
}
