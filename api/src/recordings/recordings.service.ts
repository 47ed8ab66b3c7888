import { Inject, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import {
  recordingUploadFieldsSchema,
  type PlaybackView,
  type RecordingPurpose,
  type RecordingSettingsInput,
  type RecordingSettingsView,
  type RecordingView,
  type SlotRecordingsView,
} from '@stavemark/shared';
import { DataSource, LessThanOrEqual, type EntityManager, type Repository } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { localDate, now } from '../common/clock.js';
import { forbidden, invalid, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { issuesToDetails } from '../common/validation.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { accessTo, canSeeSitting, canSeeSlot, type SittingAccess } from '../sittings/sitting-access.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SittingsService } from '../sittings/sittings.service.js';
import { PLAYABLE_MEDIA, wavDurationSeconds } from '../storage/media-types.js';
import { StorageService } from '../storage/storage.service.js';
import type { ReceivedUpload, UploadOptions } from '../storage/upload-receiver.js';
import { Student } from '../students/entities/student.entity.js';
import { Recording } from './entities/recording.entity.js';
import {
  canDeleteRecording,
  canViewSlotRecordings,
  canViewStudentRecordings,
  consentProblem,
  looksAfter,
  type StudentFacts,
} from './recording-access.js';

/** Streams the request's file into storage with the options given; the controller binds it to the request. */
export type Receive = (opts: UploadOptions) => Promise<ReceivedUpload>;

const DAY_MS = 24 * 3600 * 1000;

interface SlotContext {
  slot: Slot;
  access: SittingAccess;
}

@Injectable()
export class RecordingsService {
  private readonly recordings: ScopedRepository<Recording>;
  private readonly slots: ScopedRepository<Slot>;
  private readonly students: ScopedRepository<Student>;
  private readonly sittingsRepo: ScopedRepository<Sitting>;

  constructor(
    @InjectRepository(Recording) recordingRepo: Repository<Recording>,
    @InjectRepository(Slot) slotRepo: Repository<Slot>,
    @InjectRepository(Student) studentRepo: Repository<Student>,
    @InjectRepository(Sitting) sittingRepo: Repository<Sitting>,
    private readonly db: DataSource,
    private readonly sittings: SittingsService,
    private readonly storage: StorageService,
    private readonly audit: AuditService,
    @Inject(ENV) private readonly env: Env,
  ) {
    this.recordings = new ScopedRepository(recordingRepo, 'recording');
    this.slots = new ScopedRepository(slotRepo, 'slot');
    this.students = new ScopedRepository(studentRepo, 'student');
    this.sittingsRepo = new ScopedRepository(sittingRepo, 'sitting');
  }

  private get maxBytes(): number {
    return Math.round(this.env.RECORDING_MAX_MB * 1024 * 1024);
  }

  // ---------- access ----------

  private async slotContext(em: EntityManager, slotId: string): Promise<SlotContext> {
    const slot = await this.slots.withManager(em).getOne({
      where: { id: slotId },
      relations: { sitting: { examiners: true }, student: { guardians: true } },
    });
    const sitting = slot.sitting!;
    const access = accessTo(await this.sittings.callerFacts(em), sitting, (sitting.examiners ?? []).map((e) => e.membershipId));
    // Not the caller's to see at all: 404, as for every other slot route.
    if (!canSeeSitting(access, sitting, [slot]) || !canSeeSlot(access, slot)) throw notFound('slot');
    return { slot, access };
  }

  /** Seeing the slot is not enough for its recordings (design.md §8): a planner who does not teach the candidate is told so. */
  private assertCanView(ctx: SlotContext): void {
    if (!canViewSlotRecordings(ctx.access, ctx.slot.sitting!, ctx.slot))
      throw forbidden('A candidate’s recordings are shown to their teachers, the examiners marking the slot while the sitting runs, and the candidate.');
  }

  /** Why the caller may not add a recording to the slot now, or null. */
  private uploadProblem(ctx: SlotContext): { status: 'forbidden' | 'invalid'; message: string } | null {
    const { slot, access } = ctx;
    const sitting = slot.sitting!;
    const own = slot.studentId === access.studentId;
    if (!looksAfter(access, slot.studentId) && !(own && sitting.recordedExam)) {
      return {
        status: 'forbidden',
        message: own
          ? 'This sitting is not a recorded exam, so your teacher adds any recording of your slot.'
          : 'Recordings of a slot are added by the candidate’s teacher (or the candidate, in a recorded exam).',
      };
    }
    if (sitting.status === 'draft') return { status: 'invalid', message: 'The sitting is still a draft; add recordings once it is scheduled.' };
    if (slot.outcome === 'absent' || slot.outcome === 'withdrawn')
      return { status: 'invalid', message: `This slot is recorded as ${slot.outcome}; there is no performance to keep.` };
    const consent = consentProblem(slot.student!, slot.student!.guardians ?? [], localDate(now(), access.caller.timeZone));
    if (consent) return { status: 'forbidden', message: consent };
    return null;
  }

  private async studentFacts(em: EntityManager): Promise<StudentFacts> {
    const { caller, teaches, studentId } = await this.sittings.callerFacts(em);
    return { caller, teaches, studentId };
  }

  // ---------- slot recordings ----------

  async listForSlot(slotId: string): Promise<SlotRecordingsView> {
    const em = this.db.manager;
    const ctx = await this.slotContext(em, slotId);
    this.assertCanView(ctx);
    const rows = await this.recordings.withManager(em).find({
      where: { slotId },
      relations: { uploadedBy: true },
      order: { createdAt: 'ASC' },
    });
    const problem = this.uploadProblem(ctx);
    const mayEverUpload = looksAfter(ctx.access, ctx.slot.studentId) || ctx.slot.studentId === ctx.access.studentId;
    return {
      slotId,
      canUpload: problem === null,
      uploadBlockedReason: problem && mayEverUpload ? problem.message : null,
      recordedExam: ctx.slot.sitting!.recordedExam,
      maxBytes: this.maxBytes,
      items: rows.map((r) => this.view(r, ctx.access)),
    };
  }

  async uploadForSlot(slotId: string, receive: Receive): Promise<RecordingView> {
    const ctx = await this.slotContext(this.db.manager, slotId);
    // Every refusal comes before a byte is read: a refused upload keeps nothing.
    const problem = this.uploadProblem(ctx);
    if (problem) throw problem.status === 'forbidden' ? forbidden(problem.message) : invalid(problem.message);
    return this.store(receive, { purpose: 'slot', slotId, studentId: ctx.slot.studentId }, ctx.access);
  }

  // ---------- practice recordings ----------

  private async studentFor(em: EntityManager, studentId: string): Promise<{ student: Student; facts: StudentFacts }> {
    const facts = await this.studentFacts(em);
    const student = await this.students.withManager(em).getOne({ where: { id: studentId }, relations: { guardians: true } });
    if (!canViewStudentRecordings(facts, student.id)) throw notFound('student');
    return { student, facts };
  }

  async listForStudent(studentId: string): Promise<RecordingView[]> {
    const em = this.db.manager;
    const { facts } = await this.studentFor(em, studentId);
    const rows = await this.recordings.withManager(em).find({
      where: { studentId, purpose: 'practice' },
      relations: { uploadedBy: true },
      order: { createdAt: 'DESC' },
    });
    return rows.map((r) => this.view(r, facts));
  }

  async uploadPractice(studentId: string, receive: Receive): Promise<RecordingView> {
    const { student, facts } = await this.studentFor(this.db.manager, studentId);
    const consent = consentProblem(student, student.guardians ?? [], localDate(now(), facts.caller.timeZone));
    if (consent) throw forbidden(consent);
    return this.store(receive, { purpose: 'practice', slotId: null, studentId }, facts);
  }

  // ---------- one recording ----------

  /** The recording, if the caller may see it (slot rules for a slot's, student rules for practice). */
  private async visible(em: EntityManager, id: string): Promise<{ rec: Recording; facts: StudentFacts }> {
    const rec = await this.recordings.withManager(em).getOne({ where: { id }, relations: { uploadedBy: true } });
    if (rec.slotId) {
      const ctx = await this.slotContext(em, rec.slotId).catch(() => {
        throw notFound('recording');
      });
      if (!canViewSlotRecordings(ctx.access, ctx.slot.sitting!, ctx.slot)) throw notFound('recording');
      return { rec, facts: ctx.access };
    }
    const facts = await this.studentFacts(em);
    if (!canViewStudentRecordings(facts, rec.studentId)) throw notFound('recording');
    return { rec, facts };
  }

  async playback(id: string): Promise<PlaybackView> {
    const { rec } = await this.visible(this.db.manager, id);
    const signed = this.storage.signedUrl(rec.storageKey, rec.contentType);
    return { playbackUrl: signed.url, playbackExpiresAt: signed.expiresAt };
  }

  async remove(id: string): Promise<void> {
    const { rec, facts } = await this.visible(this.db.manager, id);
    if (!canDeleteRecording(facts, rec)) throw forbidden('Only the person who added this recording, the student’s teacher or an admin may delete it.');
    // The file first (see RecordingsRetention): a failure leaves the row, to try again.
    await this.storage.delete(rec.storageKey);
    await this.db.transaction(async (em) => {
      await em.getRepository(Recording).delete({ id: rec.id });
      await this.audit.record({ action: 'recording.deleted', entity: 'recording', entityId: rec.id, before: this.auditShape(rec), after: null }, em);
    });
  }

  // ---------- settings ----------

  async settings(): Promise<RecordingSettingsView> {
    const caller = RequestContext.requireCaller();
    const org = await this.db.getRepository(Organisation).findOneByOrFail({ id: caller.organisationId });
    const [stored, due] = await Promise.all([
      this.recordings.count(),
      this.recordings.count({ where: { expiresAt: LessThanOrEqual(now()) } }),
    ]);
    return { retentionDays: org.recordingRetentionDays, maxBytes: this.maxBytes, stored, dueForDeletion: due };
  }

  /** A new period applies to every stored recording (counted from when it was added), not only to new ones. */
  async updateSettings(input: RecordingSettingsInput): Promise<RecordingSettingsView> {
    const caller = RequestContext.requireCaller();
    await this.db.transaction(async (em) => {
      const org = await em.getRepository(Organisation).findOne({ where: { id: caller.organisationId }, lock: { mode: 'pessimistic_write' } });
      if (!org) throw notFound('organisation');
      const before = org.recordingRetentionDays;
      if (before === input.retentionDays) return;
      org.recordingRetentionDays = input.retentionDays;
      await em.getRepository(Organisation).save(org);
      await em.query(`UPDATE recordings SET expires_at = created_at + make_interval(days => $2) WHERE organisation_id = $1`, [
        caller.organisationId,
        input.retentionDays,
      ]);
      await this.audit.record(
        { action: 'recordings.retention_changed', entity: 'organisation', entityId: org.id, before: { retentionDays: before }, after: { retentionDays: input.retentionDays } },
        em,
      );
    });
    return this.settings();
  }

  /** Editors of the sitting mark it as a recorded exam (candidates may then upload their own). */
  async setRecordedExam(sittingId: string, recordedExam: boolean): Promise<{ sittingId: string; recordedExam: boolean }> {
    return this.db.transaction(async (em) => {
      const sitting = await this.sittingsRepo.withManager(em).getOne({ where: { id: sittingId }, relations: { examiners: true, slots: true } });
      const access = accessTo(await this.sittings.callerFacts(em), sitting, (sitting.examiners ?? []).map((e) => e.membershipId));
      if (!canSeeSitting(access, sitting, sitting.slots ?? [])) throw notFound('sitting');
      if (!access.editor) throw forbidden('Only the teacher who planned the sitting, or an admin, can change whether it is a recorded exam.');
      if (sitting.recordedExam !== recordedExam) {
        await em.getRepository(Sitting).update({ id: sitting.id }, { recordedExam });
        await this.audit.record({ action: 'sitting.recorded_exam', entity: 'sitting', entityId: sitting.id, before: { recordedExam: sitting.recordedExam }, after: { recordedExam } }, em);
      }
      return { sittingId: sitting.id, recordedExam };
    });
  }

  // ---------- storing ----------

  private async store(receive: Receive, target: { purpose: RecordingPurpose; slotId: string | null; studentId: string }, facts: StudentFacts): Promise<RecordingView> {
    const caller = facts.caller;
    const upload = await receive({
      keyPrefix: `recordings/${caller.organisationId}`,
      maxBytes: this.maxBytes,
      accept: PLAYABLE_MEDIA,
      what: 'a recording',
      fields: ['durationSeconds'],
    });
    try {
      const fields = recordingUploadFieldsSchema.safeParse(upload.fields);
      if (!fields.success) {
        const details = issuesToDetails(fields.error);
        throw invalid(details[0]?.message ?? 'Invalid form fields.', details);
      }
      const duration = upload.mime === 'audio/wav' ? wavDurationSeconds(upload.head, upload.size) : (fields.data.durationSeconds ?? null);
      const saved = await this.db.transaction(async (em) => {
        const org = await em.getRepository(Organisation).findOneByOrFail({ id: caller.organisationId });
        const createdAt = now();
        const repo = this.recordings.withManager(em);
        const rec = await repo.save(
          repo.create({
            purpose: target.purpose,
            slotId: target.slotId,
            studentId: target.studentId,
            uploadedByPersonId: caller.personId,
            storageKey: upload.key,
            contentType: upload.mime,
            sizeBytes: upload.size,
            durationSeconds: duration ?? fields.data.durationSeconds ?? null,
            originalName: upload.originalName.slice(0, 200) || 'recording',
            createdAt,
            expiresAt: new Date(createdAt.getTime() + org.recordingRetentionDays * DAY_MS),
          }),
        );
        await this.audit.record({ action: 'recording.uploaded', entity: 'recording', entityId: rec.id, before: null, after: this.auditShape(rec) }, em);
        return rec;
      });
      const full = await this.recordings.getOne({ where: { id: saved.id }, relations: { uploadedBy: true } });
      return this.view(full, facts);
    } catch (err) {
      // Whatever went wrong after the file arrived, it does not stay without its record.
      await this.storage.delete(upload.key).catch(() => undefined);
      throw err;
    }
  }

  private auditShape(r: Recording): Record<string, unknown> {
    return { purpose: r.purpose, slotId: r.slotId, studentId: r.studentId, contentType: r.contentType, sizeBytes: r.sizeBytes, durationSeconds: r.durationSeconds, originalName: r.originalName, expiresAt: r.expiresAt.toISOString() };
  }

  private view(r: Recording, facts: StudentFacts): RecordingView {
    const signed = this.storage.signedUrl(r.storageKey, r.contentType);
    return {
      id: r.id,
      purpose: r.purpose,
      slotId: r.slotId,
      studentId: r.studentId,
      contentType: r.contentType,
      kind: r.contentType.startsWith('video/') ? 'video' : 'audio',
      sizeBytes: r.sizeBytes,
      durationSeconds: r.durationSeconds,
      originalName: r.originalName,
      uploadedBy: r.uploadedBy?.displayName ?? null,
      createdAt: r.createdAt.toISOString(),
      expiresAt: r.expiresAt.toISOString(),
      playbackUrl: signed.url,
      playbackExpiresAt: signed.expiresAt,
      canDelete: canDeleteRecording(facts, r),
    };
  }
}
