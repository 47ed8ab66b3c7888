// A student's approved fingering (issue 3 §4): body and views. Checked with validateFingering, so
// the API and the web form refuse the same things with the same messages.
import { z } from 'zod';
import {
  COUNTED_KINDS,
  isInvertibleKind,
  isModalKind,
  type Direction,
  type Hand,
  type Inversion,
  type Mode,
  type RequestKind,
} from '../music/domain.js';
import { validateFingering } from '../music/fingering.js';
import { isKeyName, normaliseKeyName } from '../music/keys.js';
import { MAX_OCTAVES } from '../music/notes.js';
import { directionSchema, inversionSchema, modeSchema } from '../music/schemas.js';
import type { PersonRef } from './rubrics.js';

export const FINGERING_KINDS = COUNTED_KINDS;
export const handSchema = z.enum(['RH', 'LH']);

export const studentFingeringBodySchema = z
  .strictObject({
    kind: z.enum(
      FINGERING_KINDS,
      'Fingerings are recorded for scales, arpeggios, broken chords, chromatic scales and seventh chords.',
    ),
    key: z
      .string()
      .trim()
      .refine(isKeyName, 'Not a key or note name (e.g. "F#", "Bb").')
      .transform((k) => normaliseKeyName(k)),
    mode: modeSchema.nullable().default(null),
    hand: handSchema,
    inversion: inversionSchema.nullable().default(null),
    octaves: z.number().int('Octaves must be a whole number.').min(1).max(MAX_OCTAVES),
    direction: directionSchema.default('up_down'),
    /** One finger per note, 1 (thumb) to 5; checked against the note count of the span. */
    digits: z.array(z.number()).max(400),
    note: z.string().trim().max(500).optional(),
  })
  .superRefine((f, ctx) => {
    if (isModalKind(f.kind) && f.mode === null)
      ctx.addIssue({
        code: 'custom',
        path: ['mode'],
        message: `Choose the mode of the ${f.kind.replace('_', ' ')}.`,
      });
    if (!isModalKind(f.kind) && f.mode !== null)
      ctx.addIssue({
        code: 'custom',
        path: ['mode'],
        message: `Modes do not apply to a ${f.kind.replace('_', ' ')}.`,
      });
    if (f.inversion !== null && !isInvertibleKind(f.kind)) {
      ctx.addIssue({
        code: 'custom',
        path: ['inversion'],
        message: `Inversions do not apply to a ${f.kind.replace('_', ' ')}.`,
      });
    }
    if (
      f.inversion === 'third' &&
      f.kind !== 'dominant_seventh' &&
      f.kind !== 'diminished_seventh'
    ) {
      ctx.addIssue({
        code: 'custom',
        path: ['inversion'],
        message: 'Only seventh chords have a third inversion.',
      });
    }
    const check = validateFingering({
      kind: f.kind,
      octaves: f.octaves,
      direction: f.direction,
      digits: f.digits,
    });
    for (const e of check.errors) {
      // A bad digit is named by its index; a wrong length by the field as a whole.
      const path =
        e.code === 'not_a_digit' && e.position !== null ? ['digits', e.position - 1] : ['digits'];
      ctx.addIssue({ code: 'custom', path, message: e.message });
    }
  });
export type StudentFingeringBody = z.input<typeof studentFingeringBodySchema>;
export type StudentFingeringInput = z.output<typeof studentFingeringBodySchema>;

export interface FingeringView {
  id: string;
  studentId: string;
  kind: RequestKind;
  key: string;
  mode: Mode | null;
  hand: Hand;
  inversion: Inversion | null;
  octaves: number;
  direction: Direction;
  digits: number[];
  note: string | null;
  /** 1 for the first fingering recorded for this kind, key, mode, hand and inversion; +1 per change. */
  revision: number;
  setBy: PersonRef | null;
  setAt: string;
}

/** The current fingering for one kind, key, mode, hand and inversion, with the earlier ones. */
export interface CurrentFingering extends FingeringView {
  /** Earlier fingerings for the same request, newest first. */
  history: FingeringView[];
}
