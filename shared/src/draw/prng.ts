// Seeded pseudo-random numbers for replayable draws (design.md §4.4).

/**
 * 32-bit FNV-1a hash of a string's UTF-8 bytes (Fowler–Noll–Vo; offset basis 0x811c9dc5, prime
 * 0x01000193), used to turn a text seed into the generator's 32-bit state.
 */
export function fnv1a32(text: string): number {
  let h = 0x811c9dc5;
  for (const byte of utf8(text)) {
    h ^= byte;
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** UTF-8 bytes of a string (TextEncoder is not in the ES library this package targets). */
function utf8(text: string): number[] {
  const out: number[] = [];
  for (const ch of text) {
    const cp = ch.codePointAt(0) as number;
    if (cp < 0x80) out.push(cp);
    else if (cp < 0x800) out.push(0xc0 | (cp >> 6), 0x80 | (cp & 63));
    else if (cp < 0x10000) out.push(0xe0 | (cp >> 12), 0x80 | ((cp >> 6) & 63), 0x80 | (cp & 63));
    else
      out.push(
        0xf0 | (cp >> 18),
        0x80 | ((cp >> 12) & 63),
        0x80 | ((cp >> 6) & 63),
        0x80 | (cp & 63),
      );
  }
  return out;
}

/**
 * mulberry32 (Tommy Ettinger, 2017): a small, fast generator with one 32-bit state, good enough
 * for drawing exam requests (not for secrets). `nextUint32` gives raw 32-bit outputs so the
 * generator can be checked against published reference values.
 */
export function mulberry32(seed: number): { next: () => number; nextUint32: () => number } {
  let a = seed >>> 0;
  const nextUint32 = () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return (t ^ (t >>> 14)) >>> 0;
  };
  return { nextUint32, next: () => nextUint32() / 4294967296 };
}

export type Seed = string | number;

/** A seed as the 32-bit state: whole numbers 0..2³²−1 as they are, text through FNV-1a. */
export function seedState(seed: Seed): number {
  if (typeof seed === 'number') {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
      throw new RangeError(
        `A numeric seed must be a whole number from 0 to 4294967295, got ${String(seed)}.`,
      );
    }
    return seed;
  }
  if (typeof seed !== 'string' || seed.length === 0)
    throw new RangeError('A seed must be a non-empty string or a whole number.');
  return fnv1a32(seed);
}

/** A uniform random function in [0, 1) for a seed. */
export function seededRandom(seed: Seed): () => number {
  return mulberry32(seedState(seed)).next;
}

/** A uniformly chosen index 0..n−1. */
export function randomIndex(rand: () => number, n: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`Cannot choose from ${String(n)} items.`);
  return Math.floor(rand() * n);
}

/** Fisher–Yates shuffle into a new array. */
export function shuffled<T>(rand: () => number, items: readonly T[]): T[] {
  const out = [...items];
  for (let i = out.length - 1; i > 0; i--) {
    const j = randomIndex(rand, i + 1);
    [out[i], out[j]] = [out[j] as T, out[i] as T];
  }
  return out;
}
