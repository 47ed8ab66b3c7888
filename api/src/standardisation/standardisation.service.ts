import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Request, Response } from 'express';
import { DataSource, In, type EntityManager } from 'typeorm';
import {
  KRIPPENDORFF_2004,
  type AttemptMarksInput,
  type CreateExerciseInput,
  type DeviationHistory,
  type ExerciseMark,
  type ExerciseSummary,
  type ExerciseView,
  type RubricCriterion,
  type UpdateExerciseInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { now } from '../common/clock.js';
import { conflict, invalid, notFound } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { toCriterion } from '../rubrics/rubrics.mapper.js';
import { PLAYABLE_MEDIA, wavDurationSeconds } from '../storage/media-types.js';
import { StorageService, type SignedMediaUrl } from '../storage/storage.service.js';
import { Membership } from '../users/entities/membership.entity.js';
import { checkMarks, deviationFrom, exerciseAgreement, poolCriteria } from './deviation.js';
import { StandardisationAttempt } from './entities/standardisation-attempt.entity.js';
import { StandardisationExercise } from './entities/standardisation-exercise.entity.js';

/** 50 MB: a few minutes of WAV, or far longer compressed. */
export const RECORDING_MAX_BYTES = 50 * 1024 * 1024;

const has = (c: Caller, role: Caller['roles'][number]) => c.roles.includes(role);
const sortMarks = (marks: readonly ExerciseMark[]) =>
  [...marks].sort((a, b) => a.request - b.request || a.criterion.localeCompare(b.criterion));

/**
 * Standardisation exercises (issue 7 §4). Admins and teachers write and publish them; examiners
 * mark published ones blind. Blindness is enforced here, in one place: the reference marks and
 * the other examiners' marks leave the server only for the exercise's managers (admins and its
 * author, who cannot attempt it) and for an examiner whose own attempt is submitted.
 */
@Injectable()
export class StandardisationService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly storage: StorageService,
  ) {}

  private exercises(em: EntityManager) {
    return new ScopedRepository(em.getRepository(StandardisationExercise), 'standardisation exercise');
  }
  private attempts(em: EntityManager) {
    return new ScopedRepository(em.getRepository(StandardisationAttempt), 'standardisation attempt');
  }

  private manages(caller: Caller, ex: StandardisationExercise): boolean {
    return has(caller, 'admin') || (has(caller, 'teacher') && ex.createdByMembershipId === caller.membershipId);
  }

  /** An exercise the caller may see: its managers always; teachers and examiners once published. */
  private async visible(em: EntityManager, id: string): Promise<StandardisationExercise> {
    const caller = RequestContext.requireCaller();
    const ex = await this.exercises(em).getOne({ where: { id }, relations: { createdBy: { person: true } } });
    if (this.manages(caller, ex)) return ex;
    if (ex.status === 'published' && (has(caller, 'teacher') || has(caller, 'examiner'))) return ex;
    throw notFound('standardisation exercise');
  }

  private async managed(em: EntityManager, id: string): Promise<StandardisationExercise> {
    const ex = await this.visible(em, id);
    if (!this.manages(RequestContext.requireCaller(), ex)) throw notFound('standardisation exercise');
    // Two editors at once take turns; the row is re-read under the lock.
    await em.query(`SELECT id FROM standardisation_exercises WHERE id = $1 FOR UPDATE`, [ex.id]);
    return this.exercises(em).getOne({ where: { id: ex.id } });
  }

  private async criteriaOf(em: EntityManager, rubricVersionId: string): Promise<{ version: RubricVersion; criteria: RubricCriterion[] }> {
    const version = await new ScopedRepository(em.getRepository(RubricVersion), 'rubric version').findOne({
      where: { id: rubricVersionId },
      relations: { criteria: true },
    });
    if (!version || version.status !== 'published')
      throw invalid('Choose a published rubric version of this organisation.', [{ path: 'rubricVersionId', message: 'not a published rubric version' }]);
    const criteria = [...(version.criteria ?? [])].sort((a, b) => a.position - b.position).map(toCriterion);
    return { version, criteria };
  }

  // ---------- writing exercises ----------

  async create(input: CreateExerciseInput): Promise<ExerciseView> {
    const caller = RequestContext.requireCaller();
    const id = await this.db.transaction(async (em) => {
      const { criteria } = await this.criteriaOf(em, input.rubricVersionId);
      const referenceMarks = input.referenceMarks ?? [];
      const problems = checkMarks(referenceMarks, input.requests.length, criteria, false);
      if (problems.length) throw invalid('Some reference marks do not fit the rubric.', problems.map((p) => ({ ...p, path: p.path.replace(/^marks/, 'referenceMarks') })));
      const repo = this.exercises(em);
      const ex = await repo.save(
        repo.create({
          title: input.title,
          instructions: input.instructions ?? '',
          rubricVersionId: input.rubricVersionId,
          requests: input.requests.map((r) => ({ title: r.title, details: r.details ?? '' })),
          referenceMarks: sortMarks(referenceMarks),
          status: 'draft',
          dueOn: input.dueOn ?? null,
          createdByMembershipId: caller.membershipId,
          publishedAt: null,
        }),
      );
      await this.audit.record({ action: 'standardisation.exercise_created', entity: 'standardisation_exercise', entityId: ex.id, after: { title: ex.title } }, em);
      return ex.id;
    });
    return this.view(id);
  }

  async update(id: string, input: UpdateExerciseInput): Promise<ExerciseView> {
    await this.db.transaction(async (em) => {
      const ex = await this.managed(em, id);
      if (ex.status !== 'draft') throw conflict('A published exercise is fixed: examiners compare their marks with it.');
      const rubricVersionId = input.rubricVersionId ?? ex.rubricVersionId;
      const requests = input.requests ?? ex.requests;
      const { criteria } = await this.criteriaOf(em, rubricVersionId);
      // Marks of criteria or requests that no longer exist go with them.
      const keys = new Set(criteria.map((c) => c.key));
      const referenceMarks = input.referenceMarks ?? ex.referenceMarks.filter((m) => keys.has(m.criterion) && m.request < requests.length);
      const problems = checkMarks(referenceMarks, requests.length, criteria, false);
      if (problems.length) throw invalid('Some reference marks do not fit the rubric.', problems.map((p) => ({ ...p, path: p.path.replace(/^marks/, 'referenceMarks') })));
      Object.assign(ex, {
        ...(input.title !== undefined ? { title: input.title } : {}),
        ...(input.instructions !== undefined ? { instructions: input.instructions } : {}),
        ...(input.dueOn !== undefined ? { dueOn: input.dueOn } : {}),
        rubricVersionId,
        requests: requests.map((r) => ({ title: r.title, details: r.details ?? '' })),
        referenceMarks: sortMarks(referenceMarks),
      });
      await this.exercises(em).save(ex);
    });
    return this.view(id);
  }

  async publish(id: string): Promise<ExerciseView> {
    await this.db.transaction(async (em) => {
      const ex = await this.managed(em, id);
      if (ex.status === 'published') throw conflict('This exercise is already published.');
      const { criteria } = await this.criteriaOf(em, ex.rubricVersionId);
      // Everything still missing at once, so the author fixes it in one go.
      const problems = checkMarks(ex.referenceMarks, ex.requests.length, criteria, true).map((p) => ({ ...p, path: p.path.replace(/^marks/, 'referenceMarks') }));
      if (!ex.recordingKey) problems.push({ path: 'recording', message: 'Attach the reference recording: examiners mark what they hear.' });
      if (problems.length) throw invalid(`Not ready to publish: ${problems.length} thing(s) missing.`, problems);
      ex.status = 'published';
      ex.publishedAt = now();
      await this.exercises(em).save(ex);
      await this.audit.record({ action: 'standardisation.exercise_published', entity: 'standardisation_exercise', entityId: ex.id, after: { referenceMarks: ex.referenceMarks } }, em);
    });
    return this.view(id);
  }

  // ---------- examiners' attempts ----------

  private mayAttempt(caller: Caller, ex: StandardisationExercise): boolean {
    return has(caller, 'examiner') && ex.status === 'published' && !this.manages(caller, ex);
  }

  /** Saves the caller's marks so far (a draft); a submitted attempt is fixed. */
  async saveAttempt(id: string, input: AttemptMarksInput, submit = false): Promise<ExerciseView> {
    const caller = RequestContext.requireCaller();
    await this.db.transaction(async (em) => {
      const ex = await this.visible(em, id);
      if (!this.mayAttempt(caller, ex))
        throw this.manages(caller, ex)
          ? conflict('You can see the reference marks of this exercise, so your marks would not be blind.')
          : notFound('standardisation exercise');
      const { criteria } = await this.criteriaOf(em, ex.rubricVersionId);
      const repo = this.attempts(em);
      let attempt = await repo.findOne({ where: { exerciseId: ex.id, examinerMembershipId: caller.membershipId }, lock: { mode: 'pessimistic_write' } });
      if (attempt?.status === 'submitted') throw conflict('Your marks for this exercise are submitted and cannot change.');
      const problems = checkMarks(input.marks, ex.requests.length, criteria, submit);
      if (problems.length)
        throw invalid(submit ? `${problems.length} mark(s) missing or wrong: every criterion of every request needs a mark.` : 'Some marks do not fit the rubric.', problems);
      attempt ??= repo.create({ exerciseId: ex.id, examinerMembershipId: caller.membershipId, status: 'draft', submittedAt: null });
      attempt.marks = sortMarks(input.marks);
      if (submit) {
        attempt.status = 'submitted';
        attempt.submittedAt = now();
      }
      attempt = await repo.save(attempt);
      if (submit)
        await this.audit.record({ action: 'standardisation.attempt_submitted', entity: 'standardisation_attempt', entityId: attempt.id, after: { exerciseId: ex.id, marks: attempt.marks } }, em);
    });
    return this.view(id);
  }

  // ---------- the reference recording ----------

  /**
   * Streams the uploaded performance to storage (type from its bytes, size limited), then files
   * it on the draft; a recording it replaces is deleted after the change commits.
   */
  async uploadRecording(id: string, req: Request, res: Response): Promise<ExerciseView> {
    const caller = RequestContext.requireCaller();
    const check = async (em: EntityManager) => {
      const ex = await this.managed(em, id);
      if (ex.status !== 'draft') throw conflict('A published exercise is fixed: its recording cannot change.');
      return ex;
    };
    await this.db.transaction(check);
    const upload = await this.storage.receive(req, res, {
      keyPrefix: `standardisation/${caller.organisationId}`,
      maxBytes: RECORDING_MAX_BYTES,
      accept: PLAYABLE_MEDIA,
      what: 'a reference recording',
    });
    let replaced: string | null = null;
    try {
      await this.db.transaction(async (em) => {
        const ex = await check(em);
        replaced = ex.recordingKey;
        Object.assign(ex, {
          recordingKey: upload.key,
          recordingContentType: upload.mime,
          recordingBytes: upload.size,
          recordingDurationSeconds: upload.mime === 'audio/wav' ? wavDurationSeconds(upload.head, upload.size) : null,
        });
        await this.exercises(em).save(ex);
        await this.audit.record({ action: 'standardisation.recording_attached', entity: 'standardisation_exercise', entityId: ex.id, after: { key: upload.key, contentType: upload.mime, bytes: upload.size } }, em);
      });
    } catch (e) {
      // Published or gone meanwhile: the new file has no owner, so it goes.
      await this.storage.delete(upload.key);
      throw e;
    }
    if (replaced) await this.storage.delete(replaced);
    return this.view(id);
  }

  /** A short-lived address of the recording for whoever may see the exercise. */
  async recordingUrl(id: string): Promise<SignedMediaUrl> {
    return this.db.transaction(async (em) => {
      const ex = await this.visible(em, id);
      if (!ex.recordingKey || !ex.recordingContentType) throw notFound('recording');
      return this.storage.signedUrl(ex.recordingKey, ex.recordingContentType);
    });
  }

  // ---------- reading ----------

  async list(): Promise<ExerciseSummary[]> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const all = await this.exercises(em).find({ relations: { createdBy: { person: true }, rubricVersion: true }, order: { createdAt: 'DESC' } });
      const seen = all.filter((ex) => this.manages(caller, ex) || (ex.status === 'published' && (has(caller, 'teacher') || has(caller, 'examiner'))));
      const ids = seen.map((e) => e.id);
      const attempts = ids.length ? await this.attempts(em).find({ where: { exerciseId: In(ids) } }) : [];
      return seen.map((ex) => {
        const mine = attempts.find((a) => a.exerciseId === ex.id && a.examinerMembershipId === caller.membershipId);
        return {
          id: ex.id,
          title: ex.title,
          status: ex.status,
          dueOn: ex.dueOn,
          rubricName: ex.rubricVersion?.name ?? 'Rubric',
          requests: ex.requests.length,
          hasRecording: ex.recordingKey !== null,
          publishedAt: ex.publishedAt?.toISOString() ?? null,
          createdBy: ex.createdBy?.person?.displayName ?? null,
          canManage: this.manages(caller, ex),
          myAttempt: mine ? { status: mine.status, submittedAt: mine.submittedAt?.toISOString() ?? null } : null,
          submittedAttempts: attempts.filter((a) => a.exerciseId === ex.id && a.status === 'submitted').length,
        };
      });
    });
  }

  async view(id: string): Promise<ExerciseView> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const ex = await this.visible(em, id);
      const { version, criteria } = await this.criteriaOf(em, ex.rubricVersionId).catch(async () => {
        // A draft may point at a version that is no longer published-only; show it as it is.
        const v = await new ScopedRepository(em.getRepository(RubricVersion), 'rubric version').getOne({ where: { id: ex.rubricVersionId }, relations: { criteria: true } });
        return { version: v, criteria: [...(v.criteria ?? [])].sort((a, b) => a.position - b.position).map(toCriterion) };
      });
      const attempts = await this.attempts(em).find({ where: { exerciseId: ex.id }, relations: { examiner: { person: true } }, order: { submittedAt: 'ASC' } });
      const mine = attempts.find((a) => a.examinerMembershipId === caller.membershipId) ?? null;
      const manager = this.manages(caller, ex);
      const revealed = manager || mine?.status === 'submitted';
      const submitted = attempts.filter((a) => a.status === 'submitted');
      const othersMarks = revealed
        ? ex.requests.flatMap((_, r) =>
            criteria.map((c) => ({
              request: r,
              criterion: c.key,
              marks: submitted
                .map((a) => a.marks.find((m) => m.request === r && m.criterion === c.key)?.mark)
                .filter((v): v is number => v !== undefined)
                .sort((a, b) => a - b),
            })),
          )
        : null;
      return {
        id: ex.id,
        title: ex.title,
        instructions: ex.instructions,
        status: ex.status,
        dueOn: ex.dueOn,
        publishedAt: ex.publishedAt?.toISOString() ?? null,
        createdBy: ex.createdBy?.person?.displayName ?? null,
        rubric: { versionId: version.id, name: version.name, version: version.version, criteria },
        requests: ex.requests,
        recording: ex.recordingContentType
          ? { contentType: ex.recordingContentType, bytes: ex.recordingBytes ?? 0, durationSeconds: ex.recordingDurationSeconds }
          : null,
        canManage: manager,
        canAttempt: this.mayAttempt(caller, ex),
        referenceMarks: revealed ? ex.referenceMarks : null,
        myAttempt: mine
          ? { status: mine.status, marks: mine.marks, startedAt: mine.startedAt.toISOString(), submittedAt: mine.submittedAt?.toISOString() ?? null }
          : null,
        myDeviation: mine?.status === 'submitted' ? deviationFrom(mine.marks, ex.referenceMarks, criteria) : null,
        othersMarks,
        agreement: revealed ? exerciseAgreement(submitted.map((a) => a.marks), ex.requests.length, criteria) : null,
        attempts: manager
          ? attempts.map((a) => ({
              examiner: { id: a.examinerMembershipId, name: a.examiner?.person?.displayName ?? 'Examiner' },
              status: a.status,
              submittedAt: a.submittedAt?.toISOString() ?? null,
              deviation: a.status === 'submitted' ? deviationFrom(a.marks, ex.referenceMarks, criteria) : null,
            }))
          : null,
        scales: [KRIPPENDORFF_2004],
      };
    });
  }

  /** The caller's deviation from the reference, one point per submitted exercise, oldest first. */
  async myDeviations(): Promise<DeviationHistory> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const me = await new ScopedRepository(em.getRepository(Membership), 'membership').getOne({ where: { id: caller.membershipId }, relations: { person: true } });
      const attempts = await this.attempts(em).find({
        where: { examinerMembershipId: caller.membershipId, status: 'submitted' },
        relations: { exercise: true },
        order: { submittedAt: 'ASC' },
      });
      const points = [];
      for (const a of attempts) {
        const ex = a.exercise!;
        const version = await new ScopedRepository(em.getRepository(RubricVersion), 'rubric version').getOne({ where: { id: ex.rubricVersionId }, relations: { criteria: true } });
        const criteria = [...(version.criteria ?? [])].sort((x, y) => x.position - y.position).map(toCriterion);
        const d = deviationFrom(a.marks, ex.referenceMarks, criteria);
        points.push({
          exerciseId: ex.id,
          title: ex.title,
          submittedAt: a.submittedAt!.toISOString(),
          meanDifferencePercent: d.meanDifferencePercent,
          meanAbsoluteDifferencePercent: d.meanAbsoluteDifferencePercent,
          exactShare: d.exactShare,
          cells: d.cells,
          criteria: d.criteria,
        });
      }
      return {
        examiner: { id: me.id, name: me.person?.displayName ?? 'Examiner' },
        points,
        criteria: poolCriteria(points.map((p) => p.criteria)),
      };
    });
  }
}
