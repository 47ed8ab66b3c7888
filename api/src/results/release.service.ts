import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type EntityManager } from 'typeorm';
import {
  ADULT_AGE,
  OPEN_MODERATION,
  TENSION_CAUTION,
  type CellValue,
  type ReleaseListView,
  type ReleaseResultsInput,
  type ReleaseSummary,
  type ResultDetail,
  type ResultSummary,
  type TakeHomeReport,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { now } from '../common/clock.js';
import { conflict, invalid, notFound } from '../common/errors.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { MailService, type NewMail } from '../mail/mail.service.js';
import { MarkCell } from '../marking/entities/mark-cell.entity.js';
import { MarkSheet } from '../marking/entities/mark-sheet.entity.js';
import { SlotDraw } from '../marking/entities/slot-draw.entity.js';
import { ModerationCase } from '../moderation/entities/moderation-case.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { Student } from '../students/entities/student.entity.js';
import { Result } from './entities/result.entity.js';
import { requestLabel } from './request-label.js';
import { resultCaller, type ResultCaller } from './result-access.js';
import { ResultsService } from './results.service.js';
import { buildTakeHomeReport, longDate, type CriterionScale } from './take-home.js';

const nameOf = (s: { givenName: string; familyName: string }) => `${s.givenName} ${s.familyName}`;

/** Age in whole years on a date, both YYYY-MM-DD. */
function ageOn(dateOfBirth: string, date: string): number {
  const years = Number(date.slice(0, 4)) - Number(dateOfBirth.slice(0, 4));
  return date.slice(5) >= dateOfBirth.slice(5) ? years : years - 1;
}

export interface OpenFlag {
  slotId: string;
  candidate: string;
  status: string;
}

/**
 * Releasing results (issue 7 §5) and reading them: a teacher releases a sitting's results for the
 * students they teach (an admin for all) once no moderation flag is open; the student then sees
 * their result, marks and comments, and students and consenting guardians of minors receive the
 * take-home report by e-mail, written in the same transaction and sent after commit.
 */
@Injectable()
export class ReleaseService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly results: ResultsService,
    private readonly audit: AuditService,
    private readonly mail: MailService,
  ) {}

  /** Flags of a sitting not yet resolved (open, or waiting for the third marker). */
  async openFlags(em: EntityManager, sittingId: string): Promise<OpenFlag[]> {
    const rows = await em.find(ModerationCase, {
      where: { sittingId, status: In([...OPEN_MODERATION]) },
      relations: { slot: { student: true } },
      order: { createdAt: 'ASC' },
    });
    return rows.map((c) => ({
      slotId: c.slotId,
      candidate: nameOf(c.slot!.student!),
      status: c.status,
    }));
  }

  static blockMessage(open: OpenFlag[]): string {
    const waiting = open.filter((f) => f.status === 'third_marking').length;
    const first = open[0]!.candidate;
    return (
      `${open.length} double-marked pair${open.length === 1 ? ' is' : 's are'} outside tolerance and not resolved yet (first: ${first}` +
      `${waiting ? `; ${waiting} waiting for a third marker` : ''}). Agree the marks or have a third marker mark them before releasing results.`
    );
  }

  /** Why the sitting cannot be marked published yet, or null (used by the sittings' status change). */
  async publishBlocker(em: EntityManager, sittingId: string): Promise<string | null> {
    const open = await this.openFlags(em, sittingId);
    if (open.length) return ReleaseService.blockMessage(open);
    const pending = (
      (await em.query(
        `SELECT count(*)::int AS n FROM results WHERE sitting_id = $1 AND released_at IS NULL`,
        [sittingId],
      )) as { n: number }[]
    )[0]!.n;
    return pending
      ? `${pending} result${pending === 1 ? ' is' : 's are'} not released yet: release them to students first (Release results).`
      : null;
  }

  async release(sittingId: string, input: ReleaseResultsInput): Promise<ReleaseSummary> {
    const summary = await this.db.transaction(async (em) => {
      const who = await resultCaller(em);
      const sittings = new ScopedRepository(em.getRepository(Sitting), 'sitting');
      const sitting = await sittings.getOne({
        where: { id: sittingId },
        lock: { mode: 'pessimistic_write' },
      });
      const all = await new ScopedRepository(em.getRepository(Result), 'result').find({
        where: { sittingId },
        relations: { student: { guardians: true, membership: { person: true } } },
      });
      const mine = all.filter((r) => who.admin || who.teaches.has(r.studentId));
      const taughtHere =
        who.admin ||
        (who.teaches.size > 0 &&
          (await em.count(Slot, { where: { sittingId, studentId: In([...who.teaches]) } })) > 0);
      if (!taughtHere) throw notFound('sitting');
      if (sitting.status !== 'marking_closed' && sitting.status !== 'published')
        throw conflict(
          'Close marking first: results are computed when marking closes, and released after moderation.',
        );
      const open = await this.openFlags(em, sittingId);
      if (open.length)
        throw conflict(ReleaseService.blockMessage(open), [
          { path: 'moderation', message: `${open.length} open` },
        ]);
      if (!mine.length)
        throw conflict('There are no results of your students in this sitting to release.');
      const noteOf = new Map<string, string>();
      const strangers: { path: string; message: string }[] = [];
      input.notes.forEach((n, i) => {
        if (!mine.some((r) => r.studentId === n.studentId))
          strangers.push({
            path: `notes.${i}.studentId`,
            message: 'not a student of yours with a result in this sitting',
          });
        else if (n.note) noteOf.set(n.studentId, n.note);
      });
      if (strangers.length)
        throw invalid(
          'A note is for a student who has no result of yours in this sitting.',
          strangers,
        );

      const toRelease = mine.filter((r) => !r.releasedAt);
      const at = now();
      for (const r of toRelease) {
        r.releasedAt = at;
        r.releasedByPersonId = who.caller.personId;
        r.teacherNote = noteOf.get(r.studentId) ?? r.teacherNote ?? null;
      }
      for (const r of toRelease)
        await em.update(
          Result,
          { id: r.id, organisationId: r.organisationId },
          {
            releasedAt: r.releasedAt,
            releasedByPersonId: r.releasedByPersonId,
            teacherNote: r.teacherNote,
          },
        );
      const org = await em.findOneByOrFail(Organisation, { id: sitting.organisationId });
      const mails: NewMail[] = [];
      for (const r of toRelease) {
        const student = r.student!;
        const report = await this.reportFor(em, r, sitting, student);
        const own = student.email ?? student.membership?.person?.email ?? null;
        if (own)
          mails.push({
            organisationId: org.id,
            kind: 'results_report',
            toAddress: own,
            toName: nameOf(student),
            data: {
              organisationName: org.name,
              recipientName: student.givenName,
              forGuardian: false,
              report,
            },
            accountTokenId: null,
          });
        // Guardians of minors, and only those who said yes to results by e-mail.
        if (ageOn(student.dateOfBirth, sitting.date) < ADULT_AGE) {
          for (const g of student.guardians ?? []) {
            if (g.consentResultsEmail !== true) continue;
            mails.push({
              organisationId: org.id,
              kind: 'results_report',
              toAddress: g.email,
              toName: g.name,
              data: {
                organisationName: org.name,
                recipientName: g.name,
                forGuardian: true,
                report,
              },
              accountTokenId: null,
            });
          }
        }
      }
      if (mails.length) await this.mail.enqueue(em, mails);
      await this.audit.record(
        {
          action: 'results.released',
          entity: 'sitting',
          entityId: sitting.id,
          after: {
            results: toRelease.map((r) => r.id),
            students: toRelease.map((r) => r.studentId),
            notes: noteOf.size,
            mails: mails.length,
          },
        },
        em,
      );
      // Every result released: the sitting's results are published.
      const unreleased = all.filter((r) => !r.releasedAt).length;
      if (!unreleased && sitting.status === 'marking_closed') {
        sitting.status = 'published';
        await sittings.withManager(em).save(sitting);
        await this.audit.record(
          {
            action: 'sitting.published',
            entity: 'sitting',
            entityId: sitting.id,
            before: { status: 'marking_closed' },
            after: { status: 'published' },
          },
          em,
        );
      }
      return {
        released: toRelease.length,
        alreadyReleased: mine.length - toRelease.length,
        mailed: mails.length,
        sittingStatus: sitting.status,
      };
    });
    this.mail.afterCommit();
    return summary;
  }

  /** The caller's students' results in a sitting, for the release page. */
  async releaseList(sittingId: string): Promise<ReleaseListView> {
    return this.db.transaction(async (em) => {
      const who = await resultCaller(em);
      const sitting = await new ScopedRepository(em.getRepository(Sitting), 'sitting').getById(
        sittingId,
      );
      const taught =
        who.admin ||
        (who.teaches.size > 0 &&
          (await em.count(Slot, { where: { sittingId, studentId: In([...who.teaches]) } })) > 0);
      if (!taught) throw notFound('sitting');
      const rows = (
        await new ScopedRepository(em.getRepository(Result), 'result').find({
          where: { sittingId },
          relations: { student: true },
        })
      ).filter((r) => who.admin || who.teaches.has(r.studentId));
      const open = await this.openFlags(em, sittingId);
      const blockedBy =
        sitting.status !== 'marking_closed' && sitting.status !== 'published'
          ? 'Marking is still open: results are computed when marking closes.'
          : open.length
            ? ReleaseService.blockMessage(open)
            : null;
      return {
        sitting: {
          id: sitting.id,
          title: sitting.title,
          date: sitting.date,
          status: sitting.status,
        },
        blockedBy,
        results: rows
          .map((r) => ({
            resultId: r.id,
            studentId: r.studentId,
            name: nameOf(r.student!),
            pupilNumber: r.student!.pupilNumber,
            total: r.total,
            outOf: r.outOf,
            bandLabel: r.bandLabel,
            releasedAt: r.releasedAt?.toISOString() ?? null,
            teacherNote: r.teacherNote,
          }))
          .sort((a, b) => a.name.localeCompare(b.name)),
      };
    });
  }

  /** The signed-in student's own released results. */
  async mine(): Promise<ResultSummary[]> {
    const studentId = await this.db.transaction(async (em) => (await resultCaller(em)).studentId);
    if (!studentId) return [];
    return this.forStudent(studentId);
  }

  // ---------- reading results ----------

  /** A result the caller may see: their teachers and admins any; the student only once released. */
  private async visible(em: EntityManager, who: ResultCaller, r: Result | null): Promise<Result> {
    if (!r) throw notFound('result');
    if (who.admin || who.teaches.has(r.studentId)) return r;
    if (who.studentId === r.studentId && r.releasedAt) return r;
    throw notFound('result');
  }

  async forStudent(studentId: string): Promise<ResultSummary[]> {
    return this.db.transaction(async (em) => {
      const who = await resultCaller(em);
      await new ScopedRepository(em.getRepository(Student), 'student').getById(studentId);
      const own = who.studentId === studentId;
      if (!who.admin && !who.teaches.has(studentId) && !own) throw notFound('student');
      const rows = await new ScopedRepository(em.getRepository(Result), 'result').find({
        where: { studentId },
        relations: { sitting: true, listVersion: true },
      });
      const teacherView = who.admin || who.teaches.has(studentId);
      return rows
        .filter((r) => teacherView || r.releasedAt)
        .sort((a, b) => b.sitting!.date.localeCompare(a.sitting!.date))
        .map((r) => toSummary(r));
    });
  }

  async detail(resultId: string): Promise<ResultDetail> {
    return this.db.transaction(async (em) => {
      const who = await resultCaller(em);
      const r = await this.visible(
        em,
        who,
        await new ScopedRepository(em.getRepository(Result), 'result').findOne({
          where: { id: resultId },
          relations: { sitting: true, listVersion: true, student: true },
        }),
      );
      const { cells, comments } = await this.marksOf(em, r);
      const draw = await em.findOneByOrFail(SlotDraw, {
        slotId: r.slotId,
        organisationId: r.organisationId,
      });
      const rubrics = await this.results.loadRubrics(
        em,
        draw.requests.map((q) => q.rubricVersionId),
      );
      return {
        ...toSummary(r),
        student: { id: r.studentId, name: nameOf(r.student!), pupilNumber: r.student!.pupilNumber },
        requests: draw.requests.map((q) => {
          const p = r.profile.requests.find((x) => x.index === q.index);
          const asked = p?.asked ?? cells.get(`asked:${q.index}`) !== false;
          return {
            index: q.index,
            label: requestLabel(q),
            asked,
            score: p?.score ?? null,
            marks: (rubrics.get(q.rubricVersionId)?.criteria ?? []).map((c) => {
              const v = cells.get(`mark:${q.index}:${c.key}`);
              return {
                key: c.key,
                label: c.label,
                mark: asked && typeof v === 'number' ? v : null,
                maxMark: c.maxMark,
              };
            }),
            comment: comments.perRequest.get(q.index) ?? null,
          };
        }),
        criteria: r.profile.criteria,
        overallComments: comments.overall,
        teacherNote: r.teacherNote,
        caution: TENSION_CAUTION,
      };
    });
  }

  async report(resultId: string): Promise<TakeHomeReport> {
    return this.db.transaction(async (em) => {
      const who = await resultCaller(em);
      const r = await this.visible(
        em,
        who,
        await new ScopedRepository(em.getRepository(Result), 'result').findOne({
          where: { id: resultId },
          relations: { sitting: true, student: true },
        }),
      );
      return this.reportFor(em, r, r.sitting!, r.student!);
    });
  }

  private async reportFor(
    em: EntityManager,
    r: Result,
    sitting: Sitting,
    student: Student,
  ): Promise<TakeHomeReport> {
    const draw = await em.findOneByOrFail(SlotDraw, {
      slotId: r.slotId,
      organisationId: r.organisationId,
    });
    const ids = [...new Set(draw.requests.map((q) => q.rubricVersionId))];
    const rows = (await em.query(
      `SELECT key, max_mark AS "maxMark", descriptors FROM rubric_criteria WHERE rubric_version_id = ANY($1) ORDER BY rubric_version_id = $2 DESC, position`,
      [ids, draw.requests[0]?.rubricVersionId ?? null],
    )) as { key: string; maxMark: number; descriptors: CriterionScale['descriptors'] }[];
    const scales = new Map<string, CriterionScale>();
    // The first rubric of the draw wins when several define a criterion (the starter rubrics agree).
    for (const row of rows)
      if (!scales.has(row.key))
        scales.set(row.key, { maxMark: row.maxMark, descriptors: row.descriptors });
    const policy = (await em.query(`SELECT below FROM band_policies WHERE id = $1`, [
      r.bandPolicyVersionId,
    ])) as { below: { key: string } }[];
    return buildTakeHomeReport({
      resultId: r.id,
      studentName: nameOf(student),
      sittingTitle: sitting.title,
      dateText: longDate(sitting.date),
      bandLabel: r.bandLabel,
      belowEveryBand: policy[0]?.below.key === r.bandKey,
      profile: r.profile,
      scales,
      teacherNote: r.teacherNote,
    });
  }

  /** The marks a result came from and the comments shown with it (design.md §3: the basis). */
  private async marksOf(
    em: EntityManager,
    r: Result,
  ): Promise<{
    cells: Map<string, CellValue>;
    comments: { overall: string[]; perRequest: Map<number, string> };
  }> {
    const sheets = await em.find(MarkSheet, {
      where: { slotId: r.slotId, organisationId: r.organisationId, status: 'submitted' },
    });
    const cellRows = sheets.length
      ? await em.find(MarkCell, { where: { sheetId: In(sheets.map((s) => s.id)) } })
      : [];
    const cellsOf = (role: string) => {
      const s = sheets.find((x) => x.role === role);
      return new Map(
        cellRows.filter((c) => c.sheetId === s?.id).map((c) => [c.cell, c.value] as const),
      );
    };
    const commentSources =
      r.basis === 'third' ? ['third'] : r.basis === 'agreed' ? ['first', 'second'] : ['first'];
    let cells: Map<string, CellValue>;
    if (r.basis === 'agreed') {
      const mc = await em.findOneByOrFail(ModerationCase, {
        slotId: r.slotId,
        organisationId: r.organisationId,
      });
      cells = new Map<string, CellValue>(Object.entries(mc.agreedMarks?.marks ?? {}));
      for (const i of mc.agreedMarks?.notAsked ?? []) cells.set(`asked:${i}`, false);
    } else cells = cellsOf(r.basis === 'third' ? 'third' : 'first');
    const overall: string[] = [];
    const perRequest = new Map<number, string>();
    for (const role of commentSources) {
      const c = cellsOf(role);
      const o = c.get('comment:overall');
      if (typeof o === 'string' && o.trim()) overall.push(o.trim());
      for (const [k, v] of c) {
        const m = /^comment:(\d+)$/.exec(k);
        if (m && typeof v === 'string' && v.trim()) {
          const i = Number(m[1]);
          perRequest.set(i, perRequest.has(i) ? `${perRequest.get(i)} / ${v.trim()}` : v.trim());
        }
      }
    }
    return { cells, comments: { overall, perRequest } };
  }
}

function toSummary(r: Result): ResultSummary {
  return {
    id: r.id,
    sittingId: r.sittingId,
    sittingTitle: r.sitting!.title,
    sittingDate: r.sitting!.date,
    listName: r.listVersion?.name ?? '',
    total: r.total,
    outOf: r.outOf,
    percentage: r.percentage,
    band: { key: r.bandKey, label: r.bandLabel },
    basis: r.basis,
    releasedAt: r.releasedAt?.toISOString() ?? null,
  };
}
