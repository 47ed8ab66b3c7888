// Fingering validation (design.md §4.3): digits 1–5, one per note, for a given span.
import type { Direction, RequestKind } from './domain.js';
import { noteCount } from './notes.js';

export interface FingeringError {
  /** 1-based position of the offending digit; null for an error about the whole sequence. */
  position: number | null;
  code: 'not_a_digit' | 'length' | 'no_note_count';
  message: string;
}

export interface FingeringCheck {
  ok: boolean;
  errors: FingeringError[];
  /** The length the fingering must have, when known. */
  expectedLength: number | null;
}

export interface FingeringInput {
  kind: RequestKind;
  octaves: number;
  direction: Direction;
  digits: readonly number[];
  /** Passages and "other": the number of notes, since none can be computed. */
  noteCount?: number;
}

/**
 * Checks a fingering: every entry a whole digit 1–5 (1 = thumb), and exactly one per note of the
 * span (design.md §4.2 counts). All problems are reported at once, each with its 1-based position,
 * so a teacher can fix the form in one go. Whether a fingering is *good* is a teacher's judgement
 * (fingerings are personal): this checks only that it can be right.
 */
export function validateFingering(input: FingeringInput): FingeringCheck {
  const errors: FingeringError[] = [];
  input.digits.forEach((d, i) => {
    if (!Number.isInteger(d) || d < 1 || d > 5) {
      errors.push({
        position: i + 1,
        code: 'not_a_digit',
        message: `Position ${i + 1}: "${String(d)}" is not a finger; use 1 (thumb) to 5.`,
      });
    }
  });
  const computed = noteCount(input);
  const expected = computed ?? input.noteCount ?? null;
  if (expected === null) {
    errors.push({
      position: null,
      code: 'no_note_count',
      message: `A ${input.kind} has no computed note count: give the number of notes to check the fingering against.`,
    });
  } else if (input.digits.length !== expected) {
    const n = input.digits.length;
    errors.push({
      // The first position that is missing or surplus, so the message points somewhere useful.
      position: n < expected ? n + 1 : expected + 1,
      code: 'length',
      message:
        n < expected
          ? `Too few fingers: ${n} given, ${expected} notes (missing from position ${n + 1}).`
          : `Too many fingers: ${n} given, ${expected} notes (surplus from position ${expected + 1}).`,
    });
  }
  return { ok: errors.length === 0, errors, expectedLength: expected };
}

/**
 * Reads a typed fingering: digits separated by spaces, commas, hyphens or dots ("1-2-3-1"), or a
 * plain run of digits ("12312345"). Throws on anything else, naming the bad piece.
 */
export function parseFingering(text: string): number[] {
  const trimmed = text.trim();
  if (trimmed === '') return [];
  const parts = /^[0-9]+$/.test(trimmed)
    ? trimmed.split('')
    : trimmed.split(/[\s,.\-–]+/).filter((p) => p !== '');
  return parts.map((p, i) => {
    if (!/^[0-9]$/.test(p))
      throw new RangeError(`Position ${i + 1}: "${p}" is not a single finger digit.`);
    return Number(p);
  });
}

/** Writes a fingering the way teachers write it: 1-2-3-1-2-3-4-5. */
export function formatFingering(digits: readonly number[]): string {
  return digits.join('-');
}
