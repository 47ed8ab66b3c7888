// Request bodies for rubrics and requirement lists (issue 3 §1, §3, §6). Strict objects: unknown
// fields are rejected. Every refinement names the field path so the API can say where and why.
import { z } from 'zod';
import {
  ARTICULATIONS,
  BEAT_UNITS,
  DIRECTIONS,
  DYNAMICS,
  HANDS,
  INVERSIONS,
  MODES,
  MOTIONS,
  REQUEST_KINDS,
  isCountedKind,
  isInvertibleKind,
  isModalKind,
} from './domain.js';
import { isKeyName } from './keys.js';
import { MAX_OCTAVES } from './notes.js';

export const requestKindSchema = z.enum(REQUEST_KINDS);
export const modeSchema = z.enum(MODES);
export const handsSchema = z.enum(HANDS);
export const motionSchema = z.enum(MOTIONS);
export const directionSchema = z.enum(DIRECTIONS);
export const articulationSchema = z.enum(ARTICULATIONS);
export const dynamicSchema = z.enum(DYNAMICS);
export const inversionSchema = z.enum(INVERSIONS);
export const beatUnitSchema = z.enum(BEAT_UNITS);

/** Each value at most once in an option list. */
function uniqueList<T extends z.ZodType>(item: T) {
  return z.array(item).refine((a) => new Set(a).size === a.length, 'List each option once.');
}

// ---------- Rubrics ----------

export const levelDescriptorSchema = z.strictObject({
  min: z.number().int().min(0),
  max: z.number().int().min(0),
  text: z.string().trim().min(1, 'Describe the level.').max(1000),
});

export const rubricCriterionSchema = z
  .strictObject({
    key: z
      .string()
      .trim()
      .regex(
        /^[a-z][a-z0-9_]{0,39}$/,
        'Use lower-case letters, digits and _ (start with a letter, at most 40).',
      ),
    label: z.string().trim().min(1, 'Enter a label.').max(120),
    description: z.string().trim().max(2000).optional(),
    weight: z.number().positive('Weight must be greater than 0.').max(100),
    maxMark: z
      .number()
      .int('Maximum mark must be a whole number.')
      .min(1, 'Maximum mark is 1 to 10.')
      .max(10, 'Maximum mark is 1 to 10.'),
    descriptors: z.array(levelDescriptorSchema).min(1, 'Give at least one level descriptor.'),
  })
  .superRefine((c, ctx) => {
    // Descriptors cover marks or bands of marks within 0..maxMark, without overlap.
    const seen = new Set<number>();
    c.descriptors.forEach((d, i) => {
      if (d.min > d.max)
        ctx.addIssue({
          code: 'custom',
          path: ['descriptors', i, 'min'],
          message: 'min must not exceed max.',
        });
      if (d.max > c.maxMark) {
        ctx.addIssue({
          code: 'custom',
          path: ['descriptors', i, 'max'],
          message: `Above the maximum mark (${c.maxMark}).`,
        });
      }
      for (let m = d.min; m <= Math.min(d.max, c.maxMark); m++) {
        if (seen.has(m)) {
          ctx.addIssue({
            code: 'custom',
            path: ['descriptors', i],
            message: `Mark ${m} is described twice.`,
          });
          break;
        }
        seen.add(m);
      }
    });
  });

export const rubricBodySchema = z
  .strictObject({
    name: z.string().trim().min(1, 'Enter a name.').max(120),
    kinds: uniqueList(requestKindSchema).min(1, 'Choose at least one kind.'),
    criteria: z.array(rubricCriterionSchema).min(1, 'Give at least one criterion.').max(20),
  })
  .superRefine((r, ctx) => {
    const keys = new Map<string, number>();
    r.criteria.forEach((c, i) => {
      if (keys.has(c.key))
        ctx.addIssue({
          code: 'custom',
          path: ['criteria', i, 'key'],
          message: `Key "${c.key}" is used twice.`,
        });
      keys.set(c.key, i);
    });
  });
export type RubricBody = z.infer<typeof rubricBodySchema>;

// ---------- Requirement lists ----------

export const tempoSchema = z.strictObject({
  bpm: z
    .number()
    .min(20, 'Tempo is 20 to 320 beats per minute.')
    .max(320, 'Tempo is 20 to 320 beats per minute.'),
  beatUnit: beatUnitSchema,
  notesPerBeat: z.number().int('Notes per beat must be a whole number.').min(1).max(12),
});

export const requirementLineBodySchema = z
  .strictObject({
    /** Optional on create: the server assigns one. */
    id: z.string().trim().min(1).max(64).optional(),
    kind: requestKindSchema,
    label: z.string().trim().max(200).optional(),
    keys: uniqueList(
      z.string().trim().refine(isKeyName, 'Not a key or note name (e.g. "F#", "Bb").'),
    ),
    modes: uniqueList(modeSchema),
    hands: uniqueList(handsSchema).min(1, 'Choose at least one hand option.'),
    motions: uniqueList(motionSchema),
    octaves: uniqueList(z.number().int().min(1).max(MAX_OCTAVES)),
    directions: uniqueList(directionSchema).optional(),
    articulations: uniqueList(articulationSchema),
    dynamics: uniqueList(dynamicSchema),
    inversions: uniqueList(inversionSchema),
    tempo: tempoSchema,
    rubricVersionId: z.string().trim().min(1, 'Choose a rubric version.'),
    difficultyWeight: z.number().positive('Difficulty weight must be greater than 0.').max(100),
    titles: uniqueList(z.string().trim().min(1).max(200)).optional(),
    durationSeconds: z.number().positive('Duration must be greater than 0.').max(3600).optional(),
  })
  .superRefine((line, ctx) => {
    const need = (cond: boolean, path: string, message: string) => {
      if (!cond) ctx.addIssue({ code: 'custom', path: [path], message });
    };
    if (isCountedKind(line.kind)) {
      need(line.keys.length > 0, 'keys', 'Give at least one key or starting note.');
      need(line.octaves.length > 0, 'octaves', 'Give at least one octave option.');
    } else {
      need(
        (line.titles?.length ?? 0) > 0,
        'titles',
        `A ${line.kind} line needs at least one title.`,
      );
      need(
        line.durationSeconds !== undefined,
        'durationSeconds',
        `A ${line.kind} line needs its playing time in seconds.`,
      );
    }
    if (isModalKind(line.kind)) need(line.modes.length > 0, 'modes', 'Choose at least one mode.');
    else need(line.modes.length === 0, 'modes', `Modes do not apply to a ${line.kind}.`);
    if (!isInvertibleKind(line.kind))
      need(
        line.inversions.length === 0,
        'inversions',
        `Inversions do not apply to a ${line.kind}.`,
      );
    if (line.inversions.includes('third')) {
      need(
        line.kind === 'dominant_seventh' || line.kind === 'diminished_seventh',
        'inversions',
        'Only seventh chords have a third inversion.',
      );
    }
    if (line.motions.length > 0)
      need(line.hands.includes('HT'), 'motions', 'Motion applies only to hands together (HT).');
  });
export type RequirementLineBody = z.infer<typeof requirementLineBodySchema>;

export const selectionRuleSchema = z.strictObject({
  count: z.number().int().min(1, 'Ask at least one request.').max(40),
  minPerKind: z.partialRecord(requestKindSchema, z.number().int().min(0)).default({}),
});

export const requirementListVersionBodySchema = z
  .strictObject({
    name: z.string().trim().min(1, 'Enter a name.').max(120),
    grade: z.string().trim().min(1, 'Enter the grade.').max(40),
    totalMarks: z.number().int('Total marks must be a whole number.').min(1).max(1000),
    selectionRule: selectionRuleSchema,
    lines: z.array(requirementLineBodySchema).min(1, 'Add at least one line.').max(100),
  })
  .superRefine((list, ctx) => {
    const { count, minPerKind } = list.selectionRule;
    let sum = 0;
    for (const [kind, min] of Object.entries(minPerKind)) {
      sum += min ?? 0;
      if ((min ?? 0) > 0 && !list.lines.some((l) => l.kind === kind)) {
        ctx.addIssue({
          code: 'custom',
          path: ['selectionRule', 'minPerKind', kind],
          message: `No ${kind} line to draw from.`,
        });
      }
    }
    if (sum > count) {
      ctx.addIssue({
        code: 'custom',
        path: ['selectionRule', 'minPerKind'],
        message: `The minimums add up to ${sum}, more than the ${count} requests asked.`,
      });
    }
    const ids = new Set<string>();
    list.lines.forEach((l, i) => {
      if (l.id === undefined) return;
      if (ids.has(l.id))
        ctx.addIssue({
          code: 'custom',
          path: ['lines', i, 'id'],
          message: `Line id "${l.id}" is used twice.`,
        });
      ids.add(l.id);
    });
  });
export type RequirementListVersionBody = z.infer<typeof requirementListVersionBodySchema>;
