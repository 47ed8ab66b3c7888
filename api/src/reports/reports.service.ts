import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { Readable } from 'node:stream';
import type { Response } from 'express';
import { DataSource, Repository } from 'typeorm';
import {
  QUICK_FLAG_LABELS,
  SITTING_EXPORT_COLUMNS,
  YEAR_EXPORT_COLUMNS,
  type ClassComparisonView,
  type ClassResultsView,
  type QuickFlag,
  type ResultRow,
  type ResultsPeriodQuery,
  type SittingResultsView,
  type SlotOutcome,
} from '@stavemark/shared';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { localDate, now } from '../common/clock.js';
import { forbidden, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { SittingExaminer } from '../sittings/entities/sitting-examiner.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { accessTo, marksSlot, type SittingAccess } from '../sittings/sitting-access.js';
import { SittingsService } from '../sittings/sittings.service.js';
import { sendCsv, writeCsv, writeQueryCsv } from './csv-export.js';
import { loadReportDefinition, fill, type ReportDefinition, type ReportKey } from './pdf/report-definition.js';
import { renderReport } from './pdf/render-pdf.js';
import { bandOrder, criterionMeans, HEALTH_CAUTION, isTension, summarise, type BandPolicyRow } from './results-math.js';

/** Results are there once marking closes; an examiner sees the rows of the slots they marked from then on. */
const CLOSED: readonly string[] = ['marking_closed', 'published'];

interface ResultDbRow {
  id: string;
  slot_id: string;
  sitting_id: string;
  sitting_title: string;
  sitting_date: string;
  student_id: string;
  given_name: string;
  family_name: string;
  pupil_number: string;
  grade: number | null;
  list_name: string;
  total: number;
  out_of: number;
  percentage: number;
  band_key: string;
  band_label: string;
  basis: string;
  examiner: string | null;
  released_at: Date | null;
  band_policy_version_id: string;
  profile: { requests?: { index: number; label: string; asked: boolean; score: number | null }[]; criteria?: { key: string; label: string; fraction: number; marks: number; maximum: number }[] };
}

const RESULT_SELECT = `
  SELECT r.id, r.slot_id, r.sitting_id, s.title AS sitting_title, s.date::text AS sitting_date,
         st.id AS student_id, st.given_name, st.family_name, st.pupil_number, st.grade,
         lv.name AS list_name, r.total, r.out_of, r.percentage, r.band_key, r.band_label, r.basis,
         p.display_name AS examiner, r.released_at, r.band_policy_version_id, r.profile
    FROM results r
    JOIN sittings s ON s.id = r.sitting_id
    JOIN students st ON st.id = r.student_id
    JOIN requirement_list_versions lv ON lv.id = r.list_version_id
    JOIN slots sl ON sl.id = r.slot_id
    LEFT JOIN memberships m ON m.id = sl.examiner_membership_id
    LEFT JOIN people p ON p.id = m.person_id`;

const nameOf = (r: { given_name: string; family_name: string }) => `${r.given_name} ${r.family_name}`;

function toRow(r: ResultDbRow): ResultRow {
  return {
    resultId: r.id,
    slotId: r.slot_id,
    sittingId: r.sitting_id,
    sittingTitle: r.sitting_title,
    sittingDate: r.sitting_date,
    student: { id: r.student_id, name: nameOf(r), pupilNumber: r.pupil_number, grade: r.grade },
    listName: r.list_name,
    total: r.total,
    outOf: r.out_of,
    percentage: r.percentage,
    band: { key: r.band_key, label: r.band_label },
    basis: r.basis,
    examiner: r.examiner,
    releasedAt: r.released_at ? r.released_at.toISOString() : null,
  };
}

/**
 * The marks behind a result, as one jsonb object by cell ("mark:0:note_accuracy" → 7), by its
 * basis: the agreed marks moderation stored for 'agreed'; the third marker's submitted sheet for
 * 'third'; else the first examiner's (single, or first of a double-marked pair).
 */
const RESULT_MARKS = `
  CASE WHEN o.basis = 'agreed'
       THEN (SELECT mc.agreed_marks -> 'marks' FROM moderation_cases mc
              WHERE mc.slot_id = o.slot_id AND mc.organisation_id = o.organisation_id AND mc.status = 'agreed')
       ELSE (SELECT jsonb_object_agg(c.cell, c.value) FROM mark_sheets ms JOIN mark_cells c ON c.sheet_id = ms.id
              WHERE ms.slot_id = o.slot_id AND ms.organisation_id = o.organisation_id AND ms.status = 'submitted'
                AND ms.role = (CASE WHEN o.basis = 'third' THEN 'third' ELSE 'first' END) AND c.cell LIKE 'mark:%')
  END`;

/**
 * The marks of results, one row per asked request × criterion with a mark (RESULT_MARKS).
 * Rows come in order of the sitting date, sitting, student, request and the rubric's criteria.
 * The results are sorted first (small rows); each one's cells then follow in their own order, so
 * the cells themselves are never sorted together. Per result, the marks, the draw's rubric versions
 * and the request labels are unpacked once (OFFSET 0 keeps a subquery from being folded into, and
 * re-run for, every cell).
 */
function yearRowsSql(where: string): string {
  return `
  SELECT o.pupil_number, o.given_name, o.family_name, o.grade, o.sitting_date, o.title, o.list_name,
         x.request_no, x.request_label, x.criterion_key, x.criterion_label, x.mark, x.max_mark,
         o.total, o.out_of, o.band_label, o.basis
    FROM (
      SELECT r.slot_id, r.organisation_id, r.basis, r.total, r.out_of, r.band_label, r.profile,
             st.pupil_number, st.given_name, st.family_name, st.grade, st.id AS student_id,
             s.date, s.date::text AS sitting_date, s.title, s.id AS sitting_id, lv.name AS list_name
        FROM results r
        JOIN sittings s ON s.id = r.sitting_id
        JOIN students st ON st.id = r.student_id
        JOIN requirement_list_versions lv ON lv.id = r.list_version_id
       WHERE ${where}
       ORDER BY s.date, s.title, s.id, st.family_name, st.given_name, st.id
      OFFSET 0
    ) o
   CROSS JOIN LATERAL (
     SELECT q.idx + 1 AS request_no, q.label AS request_label, rc.key AS criterion_key, rc.label AS criterion_label,
            (u.marks ->> ('mark:' || q.idx || ':' || rc.key))::int AS mark, rc.max_mark
       FROM (SELECT ${RESULT_MARKS} AS marks,
                    (SELECT jsonb_object_agg(e ->> 'index', e ->> 'rubricVersionId') FROM slot_draws d, jsonb_array_elements(d.requests) e
                      WHERE d.slot_id = o.slot_id AND d.organisation_id = o.organisation_id) AS rubric_of
             OFFSET 0) u
      CROSS JOIN LATERAL (
        SELECT (e ->> 'index')::int AS idx, COALESCE(e ->> 'label', '') AS label
          FROM jsonb_array_elements(o.profile -> 'requests') e
         WHERE COALESCE((e ->> 'asked')::boolean, true)
      ) q
      JOIN rubric_criteria rc ON rc.rubric_version_id = (u.rubric_of ->> q.idx::text)::uuid
      WHERE jsonb_typeof(u.marks -> ('mark:' || q.idx || ':' || rc.key)) = 'number'
      ORDER BY q.idx, rc.position
   ) x
   ORDER BY o.date, o.title, o.sitting_id, o.family_name, o.given_name, o.student_id`;
}

@Injectable()
export class ReportsService {
  private readonly sittings: ScopedRepository<Sitting>;
  private readonly slots: ScopedRepository<Slot>;
  private readonly panels: ScopedRepository<SittingExaminer>;
  private readonly classes: ScopedRepository<ClassGroup>;
  private readonly definitions = new Map<ReportKey, ReportDefinition>();

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly sittingsService: SittingsService,
    @InjectRepository(Sitting) sittingRepo: Repository<Sitting>,
    @InjectRepository(Slot) slotRepo: Repository<Slot>,
    @InjectRepository(SittingExaminer) panelRepo: Repository<SittingExaminer>,
    @InjectRepository(ClassGroup) classRepo: Repository<ClassGroup>,
    @InjectRepository(Organisation) private readonly orgRepo: Repository<Organisation>,
  ) {
    this.sittings = new ScopedRepository(sittingRepo, 'sitting');
    this.slots = new ScopedRepository(slotRepo, 'slot');
    this.panels = new ScopedRepository(panelRepo, 'examiner of this sitting');
    this.classes = new ScopedRepository(classRepo, 'class');
  }

  private org(): string {
    return RequestContext.requireCaller().organisationId;
  }

  private definition(key: ReportKey): ReportDefinition {
    let d = this.definitions.get(key);
    if (!d) {
      d = loadReportDefinition(key);
      this.definitions.set(key, d);
    }
    return d;
  }

  // ---------- who sees which rows ----------

  private async sittingAccess(sittingId: string): Promise<{ sitting: Sitting; access: SittingAccess; slots: Slot[] }> {
    const sitting = await this.sittings.getById(sittingId);
    const [panel, slots, facts] = await Promise.all([
      this.panels.find({ where: { sittingId } }),
      this.slots.find({ where: { sittingId }, relations: { student: true }, order: { position: 'ASC' } }),
      this.sittingsService.callerFacts(undefined, sittingId),
    ]);
    return { sitting, access: accessTo(facts, sitting, panel.map((p) => p.membershipId)), slots };
  }

  /** Minors' results only to those who need them (design.md §8): planners and admins, the pupil's teachers, the slot's examiners after close. */
  private seesSlot(a: SittingAccess, sitting: Sitting, slot: Slot): boolean {
    if (a.editor || a.teaches.has(slot.studentId)) return true;
    return CLOSED.includes(sitting.status) && marksSlot(a, slot);
  }

  private async visibleSlots(sittingId: string) {
    const { sitting, access, slots } = await this.sittingAccess(sittingId);
    const visible = slots.filter((s) => this.seesSlot(access, sitting, s));
    // A sitting the caller has no row of is not theirs to see.
    if (visible.length === 0 && !access.editor) throw notFound('sitting');
    const scope: SittingResultsView['scope'] = access.editor ? 'all' : slots.some((s) => access.teaches.has(s.studentId)) ? 'own_pupils' : 'marked';
    return { sitting, access, visible, scope };
  }

  private async policies(ids: string[]): Promise<BandPolicyRow[]> {
    if (ids.length === 0) {
      return this.db.query(`SELECT bands, below FROM band_policies WHERE organisation_id = $1 ORDER BY version DESC LIMIT 1`, [this.org()]);
    }
    return this.db.query(`SELECT bands, below FROM band_policies WHERE organisation_id = $1 AND id = ANY($2::uuid[])`, [this.org(), [...new Set(ids)]]);
  }

  // ---------- a sitting ----------

  private async loadSitting(sittingId: string) {
    const { sitting, visible, scope } = await this.visibleSlots(sittingId);
    const rows: ResultDbRow[] = await this.db.query(
      `${RESULT_SELECT} WHERE r.organisation_id = $1 AND r.sitting_id = $2 AND r.slot_id = ANY($3::uuid[])
       ORDER BY st.family_name, st.given_name, st.pupil_number`,
      [this.org(), sittingId, visible.map((s) => s.id)],
    );
    const withResult = new Set(rows.map((r) => r.slot_id));
    const order = bandOrder(await this.policies(rows.map((r) => r.band_policy_version_id)));
    return { sitting, scope, rows, order, without: visible.filter((s) => !withResult.has(s.id)) };
  }

  async sittingResults(sittingId: string): Promise<SittingResultsView> {
    const { sitting, scope, rows, order, without } = await this.loadSitting(sittingId);
    const results = rows.map(toRow);
    return {
      sitting: { id: sitting.id, title: sitting.title, date: sitting.date, room: sitting.room, status: sitting.status },
      scope,
      results,
      withoutResult: without.map((s) => ({
        slotId: s.id,
        student: { id: s.studentId, name: `${s.student!.givenName} ${s.student!.familyName}`, pupilNumber: s.student!.pupilNumber },
        outcome: s.outcome as SlotOutcome | null,
      })),
      summary: summarise(results, order),
      criteria: criterionMeans(rows.map((r) => ({ criteria: r.profile.criteria ?? [] }))),
    };
  }

  /** A sitting's results: one row per candidate, a column per criterion (its share in percent). */
  async exportSitting(sittingId: string, res: Response, bom: boolean): Promise<void> {
    const { sitting, rows, without } = await this.loadSitting(sittingId);
    const criteria = criterionMeans(rows.map((r) => ({ criteria: r.profile.criteria ?? [] })));
    const data: unknown[][] = [
      ...rows.map((r) => {
        const share = new Map((r.profile.criteria ?? []).map((c) => [c.key, c.fraction]));
        return [
          r.pupil_number, r.given_name, r.family_name, r.grade, r.list_name, r.total, r.out_of, round1(r.percentage), r.band_label,
          r.basis, r.examiner ?? '', r.released_at ? r.released_at.toISOString().slice(0, 10) : '', 'completed',
          ...criteria.map((c) => { const f = share.get(c.key); return f === undefined ? null : round1(f * 100); }),
        ];
      }),
      ...without.map((s) => [
        s.student!.pupilNumber, s.student!.givenName, s.student!.familyName, s.student!.grade, '', null, null, null, '', '', '', '',
        s.outcome ?? 'no result yet', ...criteria.map(() => null),
      ]),
    ];
    const header = [...SITTING_EXPORT_COLUMNS, ...criteria.map((c) => `${c.label} (%)`)];
    // One sitting is small: its rows go through the same neutralising CSV writer from memory.
    await sendCsv(res, `results-${slug(sitting.title)}-${sitting.date}.csv`, (out) => writeCsv(Readable.from(data), header, out, { bom }), { expectedRows: data.length });
  }

  // ---------- a class ----------

  private async ownClass(classId: string): Promise<ClassGroup> {
    const caller = RequestContext.requireCaller();
    const cls = await this.classes.getById(classId, { relations: { teachers: true } });
    if (!caller.roles.includes('admin') && !(cls.teachers ?? []).some((t) => t.id === caller.membershipId)) throw notFound('class');
    return cls;
  }

  /** The class's academic year from its term, or the twelve months up to today. */
  private async periodOf(cls: ClassGroup | null, q: ResultsPeriodQuery): Promise<{ from: string; to: string }> {
    if (q.from && q.to) return { from: q.from, to: q.to };
    let from: string | undefined;
    let to: string | undefined;
    if (cls?.termId) {
      const [y] = await this.db.query(
        `SELECT min(t.starts_on)::text AS from, max(t.ends_on)::text AS to FROM terms t
          WHERE t.organisation_id = $1 AND t.academic_year = (SELECT academic_year FROM terms WHERE id = $2)`,
        [this.org(), cls.termId],
      );
      from = y?.from ?? undefined;
      to = y?.to ?? undefined;
    }
    if (!from || !to) {
      const today = localDate(now(), RequestContext.requireCaller().timeZone);
      const d = new Date(`${today}T00:00:00Z`);
      d.setUTCFullYear(d.getUTCFullYear() - 1);
      d.setUTCDate(d.getUTCDate() + 1);
      from = d.toISOString().slice(0, 10);
      to = today;
    }
    return { from: q.from ?? from, to: q.to ?? to };
  }

  async classResults(classId: string, q: ResultsPeriodQuery): Promise<ClassResultsView> {
    const cls = await this.ownClass(classId);
    const period = await this.periodOf(cls, q);
    const [{ n }] = await this.db.query(`SELECT count(*)::int AS n FROM class_members WHERE class_id = $1`, [classId]);
    const rows: ResultDbRow[] = await this.db.query(
      `${RESULT_SELECT}
       WHERE r.organisation_id = $1 AND r.student_id IN (SELECT student_id FROM class_members WHERE class_id = $2)
         AND s.date BETWEEN $3 AND $4
       ORDER BY s.date, s.title, st.family_name, st.given_name`,
      [this.org(), classId, period.from, period.to],
    );
    const order = bandOrder(await this.policies(rows.map((r) => r.band_policy_version_id)));
    const results = rows.map(toRow);
    const bySitting = new Map<string, ResultRow[]>();
    for (const r of results) bySitting.set(r.sittingId, [...(bySitting.get(r.sittingId) ?? []), r]);
    return {
      class: { id: cls.id, name: cls.name, code: cls.code, grade: cls.grade, students: n },
      period,
      results,
      sittings: [...bySitting.values()].map((rs) => ({ sittingId: rs[0]!.sittingId, title: rs[0]!.sittingTitle, date: rs[0]!.sittingDate, ...summarise(rs, order) })),
      summary: summarise(results, order),
      criteria: criterionMeans(rows.map((r) => ({ criteria: r.profile.criteria ?? [] }))),
    };
  }

  /** Every class the caller may compare (an admin: all active ones; a teacher: their own) over one period. */
  async compareClasses(q: ResultsPeriodQuery): Promise<ClassComparisonView> {
    const caller = RequestContext.requireCaller();
    const period = await this.periodOf(null, q);
    const admin = caller.roles.includes('admin');
    const rows: {
      id: string; name: string; code: string; grade: number | null; students: number; with_results: number;
      results: number; mean: number | null; median: number | null; bands: Record<string, number> | null; policy_ids: string[] | null;
    }[] = await this.db.query(
      `WITH cls AS (
         SELECT c.id, c.name, c.code, c.grade FROM classes c
          WHERE c.organisation_id = $1 AND c.active
            AND ($4::boolean OR EXISTS (SELECT 1 FROM class_teachers t WHERE t.class_id = c.id AND t.membership_id = $5))
       ), res AS (
         SELECT cm.class_id, r.student_id, r.percentage, r.band_key, r.band_policy_version_id
           FROM class_members cm
           JOIN cls ON cls.id = cm.class_id
           JOIN results r ON r.student_id = cm.student_id AND r.organisation_id = $1
           JOIN sittings s ON s.id = r.sitting_id
          WHERE s.date BETWEEN $2 AND $3
       ), per_band AS (
         SELECT class_id, jsonb_object_agg(band_key, n) AS bands FROM (SELECT class_id, band_key, count(*)::int AS n FROM res GROUP BY 1, 2) b GROUP BY 1
       )
       SELECT cls.id, cls.name, cls.code, cls.grade,
              (SELECT count(*)::int FROM class_members cm WHERE cm.class_id = cls.id) AS students,
              count(DISTINCT res.student_id)::int AS with_results, count(res.*)::int AS results,
              avg(res.percentage) AS mean, percentile_cont(0.5) WITHIN GROUP (ORDER BY res.percentage) AS median,
              pb.bands, array_agg(DISTINCT res.band_policy_version_id) FILTER (WHERE res.band_policy_version_id IS NOT NULL) AS policy_ids
         FROM cls LEFT JOIN res ON res.class_id = cls.id LEFT JOIN per_band pb ON pb.class_id = cls.id
        GROUP BY cls.id, cls.name, cls.code, cls.grade, pb.bands
        ORDER BY cls.name`,
      [this.org(), period.from, period.to, admin, caller.membershipId],
    );
    const order = bandOrder(await this.policies(rows.flatMap((r) => r.policy_ids ?? [])));
    return {
      period,
      bands: order,
      classes: rows.map((r) => ({
        classId: r.id,
        name: r.name,
        code: r.code,
        grade: r.grade,
        students: r.students,
        studentsWithResults: r.with_results,
        results: r.results,
        meanPercent: r.mean === null ? null : Number(r.mean),
        medianPercent: r.median === null ? null : Number(r.median),
        bands: order.map((b) => {
          const count = r.bands?.[b.key] ?? 0;
          return { key: b.key, label: b.label, count, percent: r.results ? (count / r.results) * 100 : 0 };
        }),
      })),
    };
  }

  /** A class's year: one row per student × sitting × request × criterion, streamed. */
  async exportClassYear(classId: string, q: ResultsPeriodQuery, res: Response, bom: boolean): Promise<void> {
    const cls = await this.ownClass(classId);
    const period = await this.periodOf(cls, q);
    const where = `r.organisation_id = $1 AND s.date BETWEEN $2 AND $3 AND r.student_id IN (SELECT student_id FROM class_members WHERE class_id = $4)`;
    const params = [this.org(), period.from, period.to, classId];
    // The same statement counted, so the header always agrees with the rows (a class's year is small).
    const [{ n }] = await this.db.query(`SELECT count(*)::int AS n FROM (${yearRowsSql(where)}) t`, params);
    await sendCsv(res, `marks-${slug(cls.code)}-${period.from}-to-${period.to}.csv`, (out) => writeQueryCsv(this.db, { sql: yearRowsSql(where), params, header: YEAR_EXPORT_COLUMNS }, out, { bom }), { expectedRows: n });
  }

  /** The organisation's year, for the office (admins): the same rows for every student. */
  async exportOrganisationYear(q: ResultsPeriodQuery, res: Response, bom: boolean): Promise<void> {
    const period = await this.periodOf(null, q);
    const where = `r.organisation_id = $1 AND s.date BETWEEN $2 AND $3`;
    const query = { sql: yearRowsSql(where), params: [this.org(), period.from, period.to], header: YEAR_EXPORT_COLUMNS };
    await sendCsv(res, `marks-${period.from}-to-${period.to}.csv`, (out) => writeQueryCsv(this.db, query, out, { bom }));
  }

  /** The SQL of the organisation's year export, for the benchmark's COPY of the same rows. */
  static yearExportSql(): string {
    return yearRowsSql(`r.organisation_id = $1 AND s.date BETWEEN $2 AND $3`);
  }

  // ---------- printable reports ----------

  /** One result the caller may see, with its sitting and slot; a student only their own released one. */
  private async resultFor(resultId: string, allowStudent: boolean) {
    const caller = RequestContext.requireCaller();
    const [r]: (ResultDbRow & { teacher_note: string | null; room: string; date_text: string })[] = await this.db.query(
      `${RESULT_SELECT.replace('r.profile', 'r.profile, r.teacher_note, s.room')} WHERE r.organisation_id = $1 AND r.id = $2`,
      [this.org(), resultId],
    );
    if (!r) throw notFound('result');
    const { sitting, access, slots } = await this.sittingAccess(r.sitting_id);
    const slot = slots.find((s) => s.id === r.slot_id);
    if (!slot) throw notFound('result');
    const ownReleased = allowStudent && access.studentId === r.student_id && r.released_at !== null;
    if (!ownReleased && !this.seesSlot(access, sitting, slot)) throw notFound('result');
    if (!ownReleased && caller.roles.length === 1 && caller.roles[0] === 'student') throw forbidden();
    return { r, sitting, slot };
  }

  private async orgName(): Promise<string> {
    const o = await this.orgRepo.findOneBy({ id: this.org() });
    return o?.name ?? '';
  }

  /**
   * The marks behind a result: each request's criteria, flags and comment, and the overall comment.
   * The sheet is the third marker's for a 'third' result, else the first examiner's; for an
   * 'agreed' result the marks are the agreed ones moderation stored, while flags and comments stay
   * the first examiner's (as ResultsService scores it: agreement is about marks).
   */
  private async sheetDetail(r: ResultDbRow) {
    const cells: { cell: string; value: unknown }[] = await this.db.query(
      `SELECT c.cell, c.value FROM mark_sheets ms JOIN mark_cells c ON c.sheet_id = ms.id
        WHERE ms.organisation_id = $1 AND ms.slot_id = $2 AND ms.role = $3 AND ms.status = 'submitted'
          AND NOT ($4::boolean AND (c.cell LIKE 'mark:%' OR c.cell LIKE 'asked:%'))
       UNION ALL
       SELECT a.key, a.value FROM moderation_cases mc CROSS JOIN LATERAL jsonb_each(mc.agreed_marks -> 'marks') a
        WHERE $4::boolean AND mc.organisation_id = $1 AND mc.slot_id = $2 AND mc.status = 'agreed'`,
      [this.org(), r.slot_id, r.basis === 'third' ? 'third' : 'first', r.basis === 'agreed'],
    );
    const [draw]: { requests: { index: number; rubricVersionId: string }[] }[] = await this.db.query(
      `SELECT requests FROM slot_draws WHERE organisation_id = $1 AND slot_id = $2`,
      [this.org(), r.slot_id],
    );
    const versionIds = [...new Set((draw?.requests ?? []).map((q) => q.rubricVersionId))];
    const criteria: { rubric_version_id: string; key: string; label: string; max_mark: number; position: number }[] = versionIds.length
      ? await this.db.query(`SELECT rubric_version_id, key, label, max_mark, position FROM rubric_criteria WHERE rubric_version_id = ANY($1::uuid[]) ORDER BY position`, [versionIds])
      : [];
    const value = new Map(cells.map((c) => [c.cell, c.value]));
    const requests = (r.profile.requests ?? []).map((pr) => {
      const drawn = draw?.requests.find((q) => q.index === pr.index);
      const crit = criteria.filter((c) => c.rubric_version_id === drawn?.rubricVersionId);
      const flags = (Object.keys(QUICK_FLAG_LABELS) as QuickFlag[])
        .map((f) => ({ f, n: Number(value.get(`flag:${pr.index}:${f}`) ?? 0) }))
        .filter((x) => x.n > 0)
        .map((x) => `${QUICK_FLAG_LABELS[x.f]} ×${x.n}`)
        .join(', ');
      const comment = value.get(`comment:${pr.index}`);
      return {
        number: pr.index + 1,
        label: pr.label,
        notAsked: !pr.asked,
        criteria: pr.asked
          ? crit.map((c) => {
              const m = value.get(`mark:${pr.index}:${c.key}`);
              return { key: c.key, label: c.label, mark: typeof m === 'number' ? m : '—', outOf: c.max_mark };
            })
          : [],
        flags,
        comment: typeof comment === 'string' ? comment : '',
      };
    });
    const overall = value.get('comment:overall');
    const tension = criteria.some((c) => isTension(c));
    return { requests, overallComment: typeof overall === 'string' ? overall : '', tension };
  }

  private common(r: ResultDbRow & { room?: string }, org: string) {
    return {
      organisation: org,
      printedOn: longDate(localDate(now(), RequestContext.requireCaller().timeZone)),
      sitting: { title: r.sitting_title, date: r.sitting_date, dateText: longDate(r.sitting_date), room: r.room ?? '' },
      student: { name: nameOf(r), pupilNumber: r.pupil_number },
      listName: r.list_name,
      examiner: r.examiner ?? '',
      total: r.total,
      outOf: r.out_of,
      percentText: pct(r.percentage),
      band: r.band_label,
    };
  }

  async markSheetPdf(resultId: string): Promise<{ fileName: string; pdf: Buffer }> {
    const { r } = await this.resultFor(resultId, false);
    const detail = await this.sheetDetail(r);
    const data = {
      ...this.common(r, await this.orgName()),
      basisText: BASIS_TEXT[r.basis] ?? '',
      requests: detail.requests,
      overallComment: detail.overallComment,
      healthCaution: detail.tension ? HEALTH_CAUTION : '',
    };
    return this.render('mark-sheet', data);
  }

  async takeHomePdf(resultId: string): Promise<{ fileName: string; pdf: Buffer }> {
    const { r } = await this.resultFor(resultId, true);
    const detail = await this.sheetDetail(r);
    const def = this.definition('take-home');
    const crit = (r.profile.criteria ?? []).map((c) => ({ ...c, percentText: pct(c.fraction * 100) }));
    const phrase = (c: (typeof crit)[number], kind: 'strength' | 'nextStep') =>
      fill(def.phrases?.[c.key]?.[kind] ?? def.phraseDefaults?.[kind] ?? '{{label}}', c);
    // Strengths: the best parts at 70 % or more; next steps: the weakest below 60 % (the level
    // design.md §4.6 treats as low), or the weakest part when nothing is that low.
    const sorted = [...crit].sort((a, b) => b.fraction - a.fraction);
    const strengths = sorted.filter((c) => c.fraction >= 0.7).slice(0, 3).map((c) => ({ text: phrase(c, 'strength') }));
    let low = [...sorted].reverse().filter((c) => c.fraction < 0.6).slice(0, 3);
    if (low.length === 0 && sorted.length && sorted[sorted.length - 1]!.fraction < 0.85) low = [sorted[sorted.length - 1]!];
    const data = {
      ...this.common(r, await this.orgName()),
      strengths,
      nextSteps: low.map((c) => ({ text: phrase(c, 'nextStep') })),
      criteria: crit,
      teacherNote: (r as { teacher_note?: string | null }).teacher_note ?? '',
      overallComment: detail.overallComment,
      healthCaution: crit.some((c) => isTension(c)) ? HEALTH_CAUTION : '',
    };
    return this.render('take-home', data);
  }

  async classSummaryPdf(classId: string, q: ResultsPeriodQuery): Promise<{ fileName: string; pdf: Buffer }> {
    const view = await this.classResults(classId, q);
    const bandsText = (b: { label: string; count: number }[]) => b.filter((x) => x.count > 0).map((x) => `${x.label} ${x.count}`).join(', ');
    const data = {
      organisation: await this.orgName(),
      printedOn: longDate(localDate(now(), RequestContext.requireCaller().timeZone)),
      class: view.class,
      period: { ...view.period, text: `${longDate(view.period.from)} – ${longDate(view.period.to)}` },
      summary: {
        ...view.summary,
        meanText: view.summary.meanPercent === null ? '—' : pct(view.summary.meanPercent),
        medianText: view.summary.medianPercent === null ? '—' : pct(view.summary.medianPercent),
        bands: view.summary.results ? view.summary.bands.map((b) => ({ ...b, percentText: pct(b.percent) })) : [],
      },
      sittingCount: view.sittings.length,
      sittings: view.sittings.map((s) => ({ ...s, dateText: longDate(s.date), meanText: s.meanPercent === null ? '—' : pct(s.meanPercent), bandsText: bandsText(s.bands) })),
      results: view.results.map((r) => ({ student: r.student.name, sitting: `${r.sittingTitle} (${r.sittingDate})`, total: r.total, outOf: r.outOf, percentText: pct(r.percentage), band: r.band.label })),
      criteria: view.criteria.map((c) => ({ ...c, percentText: pct(c.meanFraction * 100) })),
      healthCaution: view.criteria.some((c) => c.tension) ? HEALTH_CAUTION : '',
    };
    return this.render('class-summary', data);
  }

  private async render(key: ReportKey, data: Record<string, unknown>): Promise<{ fileName: string; pdf: Buffer }> {
    const def = this.definition(key);
    const fileName = fill(def.fileName, data).replace(/[^A-Za-z0-9._-]+/g, '-');
    return { fileName, pdf: await renderReport(def, data) };
  }
}

const BASIS_TEXT: Record<string, string> = {
  single: '',
  first: 'Double-marked: these are the first examiner’s marks.',
  agreed: 'Double-marked: the total is the examiners’ agreed result.',
  third: 'Double-marked: the total is the third marker’s result.',
};

const round1 = (x: number) => Math.round(x * 10) / 10;
const pct = (x: number) => `${round1(x).toFixed(1)} %`;
const slug = (s: string) => s.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'export';
function longDate(iso: string): string {
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${iso}T00:00:00Z`));
}
