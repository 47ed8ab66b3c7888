// The demo school's standardisation exercise (issue 7 §4): a synthesised D major scale (our own
// sound, made in code, kept in storage), reference marks on the starter scales rubric, and two examiners' submitted
// attempts. Priya Halvorsen (examiner@demo.example) has not marked it yet, so the demo can.
import { Readable } from 'node:stream';
import type { EntityManager } from 'typeorm';
import type { ExerciseMark } from '@stavemark/shared';
import { StandardisationAttempt } from '../standardisation/entities/standardisation-attempt.entity.js';
import { StandardisationExercise } from '../standardisation/entities/standardisation-exercise.entity.js';
import { demoScalePerformance } from '../standardisation/reference-audio.js';
import { LocalDiskDriver } from '../storage/local-disk-driver.js';
import { wavDurationSeconds } from '../storage/media-types.js';
import { DEFAULT_STORAGE_DIR } from '../storage/storage.module.js';

/** One file for every seeding: the same synthesised sound, written once per storage folder. */
export const DEMO_RECORDING_KEY = 'standardisation/demo/d-major-scale-reference.wav';

async function storeRecording(): Promise<{ bytes: number; seconds: number | null }> {
  const driver = new LocalDiskDriver(process.env.STORAGE_DIR ?? DEFAULT_STORAGE_DIR);
  const { wav } = demoScalePerformance();
  const there = await driver.stat(DEMO_RECORDING_KEY);
  if (there?.size !== wav.length) await driver.write(DEMO_RECORDING_KEY, Readable.from([wav]));
  return { bytes: wav.length, seconds: wavDurationSeconds(wav.subarray(0, 4100), wav.length) };
}

export const DEMO_EXERCISE_TITLE = 'D major scale — standardisation before the Grade 5 mock';

// Criterion key → mark, for the one request. The recording has a late G (the thumb passing
// under), a descent that hurries, and a heavier top note.
const REFERENCE: Record<string, number> = {
  note_accuracy: 10,
  fingering_consistency: 5,
  grouping: 3,
  motion_economy: 3,
  freedom_from_tension: 4,
  evenness: 6,
  tempo_control: 3,
};
const ATTEMPTS: { email: string; daysAgo: number; marks: Record<string, number> }[] = [
  { email: 'beatrix.oduya@demo.example', daysAgo: 2, marks: { ...REFERENCE, evenness: 7 } },
  {
    email: 'ottilie.brandt@demo.example',
    daysAgo: 1,
    marks: { note_accuracy: 9, fingering_consistency: 4, grouping: 4, motion_economy: 4, freedom_from_tension: 5, evenness: 8, tempo_control: 4 },
  },
];

const marksOf = (m: Record<string, number>): ExerciseMark[] =>
  Object.entries(m)
    .map(([criterion, mark]) => ({ request: 0, criterion, mark }))
    .sort((a, b) => a.criterion.localeCompare(b.criterion));

function dayAt(today: string, daysAgo: number, hour: number): Date {
  const [y, m, d] = today.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d - daysAgo, hour));
}

/** Seeds the exercise once (by title); returns its id. */
export async function seedDemoStandardisation(em: EntityManager, organisationId: string, today: string): Promise<string> {
  // The file first: a storage folder emptied since the last seeding gets it back.
  const recording = await storeRecording();
  const existing = await em.findOne(StandardisationExercise, { where: { organisationId, title: DEMO_EXERCISE_TITLE } });
  if (existing) return existing.id;
  const one = async <T>(sql: string, params: unknown[]): Promise<T> => {
    const rows = (await em.query(sql, params)) as T[];
    if (!rows[0]) throw new Error(`Demo standardisation: nothing found for ${sql} ${JSON.stringify(params)}`);
    return rows[0];
  };
  const membership = (email: string) =>
    one<{ id: string }>(`SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = $1 AND m.organisation_id = $2`, [email, organisationId]).then((r) => r.id);
  const rubric = await one<{ id: string }>(
    `SELECT v.id FROM rubric_versions v JOIN rubrics r ON r.id = v.rubric_id WHERE r.starter_key = 'scales' AND r.organisation_id = $1 AND v.status = 'published' ORDER BY v.version DESC LIMIT 1`,
    [organisationId],
  );
  const keys = ((await em.query(`SELECT key FROM rubric_criteria WHERE rubric_version_id = $1`, [rubric.id])) as { key: string }[]).map((r) => r.key);
  const missing = keys.filter((k) => !(k in REFERENCE));
  if (missing.length) throw new Error(`Demo standardisation: no reference mark for ${missing.join(', ')}`);

  const exercise = await em.save(
    em.create(StandardisationExercise, {
      organisationId,
      title: DEMO_EXERCISE_TITLE,
      instructions:
        'Listen to the whole recording once before marking, then as often as you need. The recording is sound only; what the observer saw is noted here for the criteria you cannot hear: the approved fingering was kept throughout; the wrist lifted and the elbow pulled in at the top of the scale; shoulders stayed relaxed.',
      rubricVersionId: rubric.id,
      requests: [{ title: 'D major scale', details: 'right hand, one octave, up and down, legato, quavers at crotchet = 88' }],
      referenceMarks: marksOf(REFERENCE),
      recordingKey: DEMO_RECORDING_KEY,
      recordingContentType: 'audio/wav',
      recordingBytes: recording.bytes,
      recordingDurationSeconds: recording.seconds,
      status: 'published',
      dueOn: today,
      createdByMembershipId: await membership('admin@demo.example'),
      publishedAt: dayAt(today, 3, 9),
    }),
  );
  for (const a of ATTEMPTS) {
    await em.save(
      em.create(StandardisationAttempt, {
        organisationId,
        exerciseId: exercise.id,
        examinerMembershipId: await membership(a.email),
        marks: marksOf(a.marks),
        status: 'submitted',
        startedAt: dayAt(today, a.daysAgo, 17),
        submittedAt: dayAt(today, a.daysAgo, 18),
      }),
    );
  }
  return exercise.id;
}
