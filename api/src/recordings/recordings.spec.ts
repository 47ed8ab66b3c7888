import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RecordingSettingsView, RecordingView, SlotRecordingsView } from '@stavemark/shared';
import { binary, mp3LikeFile, textFile, wavFile } from '../../test/support/media-fixtures.js';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { StorageService } from '../storage/storage.service.js';
import { RecordingsRetention } from './recordings-retention.js';
import { RETENTION_QUEUE, RetentionQueue } from './retention-queue.js';
import { consentProblem } from './recording-access.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const DAY = 24 * 3600 * 1000;

function storedFiles(dir: string): string[] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name));
}

describe('recordings', () => {
  let t: TestApp;
  const dir = mkdtempSync(join(tmpdir(), 'stavemark-recordings-'));
  let admin: string;
  let teacher: string;
  let examiner: string;
  let ottilie: string;
  let student: string;
  let otherOrgAdmin: string;
  let sittingId: string;
  /** Ellis Northcott's slot (the demo student, 15, guardian consent on record). */
  let ellisSlot: string;
  let ellisId: string;
  /** A slot Priya marks and Ottilie does not. */
  let priyaOnlySlot: string;
  let guardianOfEllis: string;

  const upload = (token: string, path: string, file: Buffer, name: string, contentType = 'application/octet-stream') =>
    t.http().post(path).set(auth(token)).attach('file', file, { filename: name, contentType });

  beforeAll(async () => {
    t = await createTestApp({
      today: '2026-12-01',
      env: { STAVEMARK_NOW: '2026-12-01T13:00:00Z', STORAGE_DIR: dir, RECORDING_MAX_MB: '1' },
    });
    admin = await signIn(t, 'admin@demo.example');
    teacher = await signIn(t, 'teacher@demo.example');
    examiner = await signIn(t, 'examiner@demo.example');
    ottilie = await signIn(t, 'ottilie.brandt@demo.example');
    student = await signIn(t, 'student@demo.example');
    otherOrgAdmin = await signIn(t, 'admin@fernhill.example');
    const rows = (await t.db.query(
      `SELECT s.id AS sitting_id, sl.id AS slot_id, st.id AS student_id, st.pupil_number, sl.second_examiner_membership_id IS NULL AS single
         FROM sittings s JOIN slots sl ON sl.sitting_id = s.id JOIN students st ON st.id = sl.student_id
        WHERE s.title = 'Grade 5 mock — Thursday Seniors' ORDER BY sl.position`,
    )) as { sitting_id: string; slot_id: string; student_id: string; pupil_number: string; single: boolean }[];
    sittingId = rows[0]!.sitting_id;
    const ellis = rows.find((r) => r.pupil_number === 'KL1021')!;
    ellisSlot = ellis.slot_id;
    ellisId = ellis.student_id;
    priyaOnlySlot = rows.find((r) => r.single && r.pupil_number !== 'KL1021')!.slot_id;
    guardianOfEllis = ((await t.db.query(`SELECT id FROM guardians WHERE student_id = $1`, [ellisId])) as { id: string }[])[0]!.id;
    // The demo school (with its year of marks) and six sign-ins: slow on a loaded machine.
  }, 180_000);
  afterAll(async () => {
    await t.close().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  });

  let teacherRecording: RecordingView;

  it('a teacher adds a WAV to their pupil’s slot: stored, typed by content, timed from its header, audited', async () => {
    const wav = wavFile({ seconds: 2 });
    const res = await upload(teacher, `/api/slots/${ellisSlot}/recordings`, wav, 'ellis-take-1.wav');
    expect(res.status, res.text).toBe(201);
    teacherRecording = res.body as RecordingView;
    expect(teacherRecording).toMatchObject({ purpose: 'slot', slotId: ellisSlot, contentType: 'audio/wav', kind: 'audio', sizeBytes: wav.length, durationSeconds: 2, originalName: 'ellis-take-1.wav', canDelete: true });
    // Default retention 180 days, counted from when it was added.
    expect(new Date(teacherRecording.expiresAt).getTime() - new Date(teacherRecording.createdAt).getTime()).toBe(180 * DAY);
    expect(teacherRecording.playbackUrl).toMatch(/^\/api\/media\/[\w-]+\.[\w-]+$/);
    const audit = (await t.db.query(`SELECT action, actor_person_id FROM audit_events WHERE entity = 'recording' AND entity_id = $1`, [teacherRecording.id])) as { action: string; actor_person_id: string }[];
    expect(audit.map((a) => a.action)).toEqual(['recording.uploaded']);
    expect(audit[0]!.actor_person_id).not.toBeNull();
  });

  it('refuses a text file named .mp3 by its content, keeping nothing', async () => {
    const before = storedFiles(dir).length;
    const res = await upload(teacher, `/api/slots/${ellisSlot}/recordings`, textFile(), 'ellis.mp3', 'audio/mpeg');
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/cannot be kept as a recording/);
    expect(storedFiles(dir).length).toBe(before);
    expect(Number(((await t.db.query(`SELECT count(*) AS n FROM recordings`)) as { n: string }[])[0]!.n)).toBe(1);
  });

  it('refuses a file over the upload limit (RECORDING_MAX_MB=1 here) with 413, keeping nothing', async () => {
    const before = storedFiles(dir).length;
    const res = await upload(teacher, `/api/slots/${ellisSlot}/recordings`, wavFile({ seconds: 70 }), 'long.wav');
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/larger than 1 MB/);
    expect(storedFiles(dir).length).toBe(before);
  });

  it('refuses a minor’s recording without a guardian’s consent on record, and after a refusal, before reading the file', async () => {
    const before = storedFiles(dir).length;
    await t.db.query(`UPDATE guardians SET consent_recordings = NULL WHERE id = $1`, [guardianOfEllis]);
    const none = await upload(teacher, `/api/slots/${ellisSlot}/recordings`, wavFile({ seconds: 0.5 }), 'take.wav');
    expect(none.status).toBe(403);
    expect(none.body.message).toBe('Ellis is under 18 and no guardian’s consent to recordings is on record. A guardian can give it through the consent link the school e-mails them; until then nothing can be uploaded.');
    const list = await t.http().get(`/api/slots/${ellisSlot}/recordings`).set(auth(teacher));
    expect(list.body).toMatchObject({ canUpload: false, uploadBlockedReason: expect.stringMatching(/no guardian’s consent/) });

    await t.db.query(`UPDATE guardians SET consent_recordings = false WHERE id = $1`, [guardianOfEllis]);
    const declined = await upload(teacher, `/api/slots/${ellisSlot}/recordings`, wavFile({ seconds: 0.5 }), 'take.wav');
    expect(declined.status).toBe(403);
    expect(declined.body.message).toMatch(/a guardian has declined recordings/);
    expect(storedFiles(dir).length).toBe(before);
    await t.db.query(`UPDATE guardians SET consent_recordings = true WHERE id = $1`, [guardianOfEllis]);
  });

  it('consent rule: an adult needs none; one guardian’s no is not overridden by another’s yes (age by calendar date)', () => {
    // 18th birthday on the day itself counts as 18 (common practice for age in whole years).
    expect(consentProblem({ givenName: 'Ada', dateOfBirth: '2008-12-01' }, [], '2026-12-01')).toBeNull();
    expect(consentProblem({ givenName: 'Ada', dateOfBirth: '2008-12-02' }, [], '2026-12-01')).toMatch(/no guardian’s consent/);
    expect(consentProblem({ givenName: 'Ada', dateOfBirth: '2012-05-05' }, [{ consentRecordings: true }, { consentRecordings: false }], '2026-12-01')).toMatch(/declined/);
    expect(consentProblem({ givenName: 'Ada', dateOfBirth: '2012-05-05' }, [{ consentRecordings: true }, { consentRecordings: null }], '2026-12-01')).toBeNull();
  });

  it('the student may add their own only when the sitting is a recorded exam, which its planner sets', async () => {
    const refused = await upload(student, `/api/slots/${ellisSlot}/recordings`, mp3LikeFile(), 'mine.mp3');
    expect(refused.status).toBe(403);
    expect(refused.body.message).toMatch(/not a recorded exam/);
    expect((await t.http().put(`/api/sittings/${sittingId}/recorded-exam`).set(auth(student)).send({ recordedExam: true })).status).toBe(403);
    expect((await t.http().put(`/api/sittings/${sittingId}/recorded-exam`).set(auth(teacher)).send({ recordedExam: 'yes' })).status).toBe(400);
    const set = await t.http().put(`/api/sittings/${sittingId}/recorded-exam`).set(auth(teacher)).send({ recordedExam: true });
    expect(set.status).toBe(200);
    const ok = await upload(student, `/api/slots/${ellisSlot}/recordings`, mp3LikeFile(), 'mine.mp3');
    expect(ok.status, ok.text).toBe(201);
    expect(ok.body).toMatchObject({ contentType: 'audio/mpeg', canDelete: true, durationSeconds: null });
    // The student cannot delete the teacher's recording.
    const del = await t.http().delete(`/api/recordings/${teacherRecording.id}`).set(auth(student));
    expect(del.status).toBe(403);
  });

  it('examiners see a slot’s recordings only while the sitting runs, and only for slots they mark', async () => {
    const early = await t.http().get(`/api/slots/${ellisSlot}/recordings`).set(auth(examiner));
    expect(early.status).toBe(403);
    const opened = await t.http().post(`/api/sittings/${sittingId}/status`).set(auth(examiner)).send({ status: 'in_progress' });
    expect(opened.status, opened.text).toBe(200);
    const res = await t.http().get(`/api/slots/${ellisSlot}/recordings`).set(auth(examiner));
    expect(res.status).toBe(200);
    const view = res.body as SlotRecordingsView;
    expect(view.items).toHaveLength(2);
    expect(view.canUpload).toBe(false);
    expect(view.items.every((i) => !i.canDelete)).toBe(true);
    // Play it as the desk does: the signed URL, seeking with a Range.
    const wav = wavFile({ seconds: 2 });
    const media = await t.http().get(view.items[0]!.playbackUrl).set('Range', 'bytes=44-143').buffer(true).parse(binary);
    expect(media.status).toBe(206);
    expect((media.body as Buffer).equals(wav.subarray(44, 144))).toBe(true);
    // Not Ottilie's slot: not there for her.
    expect((await t.http().get(`/api/slots/${priyaOnlySlot}/recordings`).set(auth(ottilie))).status).toBe(404);
    expect((await t.http().get(`/api/recordings/${view.items[0]!.id}/playback`).set(auth(otherOrgAdmin))).status).toBe(404);
    expect((await t.http().get(`/api/slots/${ellisSlot}/recordings`).set(auth(otherOrgAdmin))).status).toBe(404);
    const fresh = await t.http().get(`/api/recordings/${view.items[0]!.id}/playback`).set(auth(examiner));
    expect(fresh.status).toBe(200);
    expect(fresh.body.playbackUrl).toMatch(/^\/api\/media\//);
  });

  it('practice recordings: an adult student needs no consent; a teacher who does not teach them gets 404', async () => {
    const elodie = ((await t.db.query(`SELECT id FROM students WHERE pupil_number = 'KL1031'`)) as { id: string }[])[0]!.id;
    const res = await upload(admin, `/api/students/${elodie}/recordings`, wavFile({ seconds: 1 }), 'practice.wav');
    expect(res.status, res.text).toBe(201);
    expect(res.body).toMatchObject({ purpose: 'practice', slotId: null, durationSeconds: 1 });
    expect((await t.http().get(`/api/students/${elodie}/recordings`).set(auth(admin))).body).toHaveLength(1);
    expect((await t.http().get(`/api/students/${elodie}/recordings`).set(auth(teacher))).status).toBe(404);
    expect((await upload(teacher, `/api/students/${elodie}/recordings`, wavFile({ seconds: 1 }), 'p.wav')).status).toBe(404);
  });

  it('a teacher deletes a recording: the file and the row go, and it is audited', async () => {
    const storage = t.app.get(StorageService);
    const [row] = (await t.db.query(`SELECT storage_key FROM recordings WHERE id = $1`, [teacherRecording.id])) as { storage_key: string }[];
    expect(await storage.driver.stat(row!.storage_key)).not.toBeNull();
    const res = await t.http().delete(`/api/recordings/${teacherRecording.id}`).set(auth(teacher));
    expect(res.status).toBe(204);
    expect(await storage.driver.stat(row!.storage_key)).toBeNull();
    expect((await t.db.query(`SELECT 1 FROM recordings WHERE id = $1`, [teacherRecording.id])).length).toBe(0);
    const audit = (await t.db.query(`SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY at`, [teacherRecording.id])) as { action: string }[];
    expect(audit.map((a) => a.action)).toEqual(['recording.uploaded', 'recording.deleted']);
    expect((await t.http().get(teacherRecording.playbackUrl)).status).toBe(404);
  });

  it('retention: the admin sets the period; the job deletes rows and files past it, and nothing else', async () => {
    expect((await t.http().put('/api/recording-settings').set(auth(teacher)).send({ retentionDays: 30 })).status).toBe(403);
    const bad = await t.http().put('/api/recording-settings').set(auth(admin)).send({ retentionDays: 3 });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/at least 7 days/);
    const set = await t.http().put('/api/recording-settings').set(auth(admin)).send({ retentionDays: 30 });
    expect(set.status).toBe(200);
    expect(set.body as RecordingSettingsView).toMatchObject({ retentionDays: 30, stored: 2, dueForDeletion: 0 });

    const keys = ((await t.db.query(`SELECT id, storage_key, expires_at, created_at FROM recordings`)) as { id: string; storage_key: string; expires_at: Date; created_at: Date }[]);
    expect(keys).toHaveLength(2);
    for (const k of keys) expect(k.expires_at.getTime() - k.created_at.getTime()).toBe(30 * DAY);

    const retention = t.app.get(RecordingsRetention);
    const storage = t.app.get(StorageService);
    const eightDaysOn = new Date(Date.parse('2026-12-01T13:00:00Z') + 8 * DAY);
    expect(await retention.purgeExpired(eightDaysOn)).toBe(0);
    for (const k of keys) expect(await storage.driver.stat(k.storage_key)).not.toBeNull();

    await t.http().put('/api/recording-settings').set(auth(admin)).send({ retentionDays: 7 });
    expect(await retention.purgeExpired(eightDaysOn)).toBe(2);
    expect((await t.db.query(`SELECT 1 FROM recordings`)).length).toBe(0);
    for (const k of keys) expect(await storage.driver.stat(k.storage_key)).toBeNull();
    const audit = (await t.db.query(`SELECT entity_id, actor_person_id FROM audit_events WHERE action = 'recording.deleted_after_retention'`)) as { entity_id: string; actor_person_id: string | null }[];
    expect(audit.map((a) => a.entity_id).sort()).toEqual(keys.map((k) => k.id).sort());
    expect(audit.every((a) => a.actor_person_id === null)).toBe(true);
  });

  it('the retention job is on pg-boss’s schedule', async () => {
    const schedules = await t.app.get(RetentionQueue).schedules();
    expect(schedules.find((s) => s.name === RETENTION_QUEUE)).toMatchObject({ cron: '17 * * * *', timezone: 'UTC' });
  });
});
