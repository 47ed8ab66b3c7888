import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import {
  entrenchedIssues,
  isTensionCriterion,
  percentileFromCounts,
  persistentLow,
  risingSlipRate,
  splitComparable,
  TENSION_CAUTION,
  trend,
  type AttentionEntry,
  type AttentionEvidence,
  type AttentionView,
  type ProgressExaminerComment,
  type ProgressLine,
  type ProgressSitting,
  type ProgressView,
  type ResultCriterionProfile,
  type ResultRequestProfile,
  type SlotOutcome,
} from '@stavemark/shared';
import { localDate, now } from '../common/clock.js';
import { notFound } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';

/** The year a progress page covers: twelve months back from today. */
const YEAR_DAYS = 365;

interface StudentRow {
  id: string;
  given_name: string;
  family_name: string;
  pupil_number: string;
  grade: number | null;
  membership_id: string | null;
  taught: boolean;
}

interface YearRow {
  slot_id: string;
  outcome: SlotOutcome;
  sitting_id: string;
  title: string;
  date: string;
  status: string;
  list_id: string;
  grade: string;
  list_name: string;
  percentage: number | null;
  total: number | null;
  out_of: number | null;
  band_key: string | null;
  band_label: string | null;
  criteria: ResultCriterionProfile[] | null;
  requests: ResultRequestProfile[] | null;
  slips: number | null;
  notes_played: number | null;
  released_at: Date | null;
}

interface SheetRow {
  slot_id: string;
  role: 'first' | 'second' | 'third';
  examiner_id: string;
  examiner: string;
  cell: string | null;
  value: unknown;
}

const fullName = (s: Pick<StudentRow, 'given_name' | 'family_name'>) => `${s.given_name} ${s.family_name}`;
const minusDays = (date: string, days: number) => {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d - days)).toISOString().slice(0, 10);
};
const pct = (f: number) => `${Math.round(f * 100)} %`;

/**
 * A student's year (issue 8 §1) and the attention list (§2), read from stored results (one row per
 * completed slot, with its criterion profile, slips and notes played) and, for comments and who
 * marked, from the submitted sheets. Every query names the caller's organisation.
 */
@Injectable()
export class ProgressService {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  private today(caller: Caller): string {
    return localDate(now(), caller.timeZone);
  }

  /** The student if the caller may see their progress: admins, their teachers, the student; else 404. */
  private async visibleStudent(caller: Caller, studentId: string): Promise<StudentRow> {
    const [s] = (await this.db.query(
      `SELECT s.id, s.given_name, s.family_name, s.pupil_number, s.grade, s.membership_id,
              EXISTS (SELECT 1 FROM class_members cm JOIN class_teachers ct ON ct.class_id = cm.class_id
                       WHERE cm.student_id = s.id AND ct.membership_id = $3) AS taught
         FROM students s WHERE s.id = $1 AND s.organisation_id = $2`,
      [studentId, caller.organisationId, caller.membershipId],
    )) as StudentRow[];
    if (!s) throw notFound('student');
    const ok =
      caller.roles.includes('admin') ||
      (caller.roles.includes('teacher') && s.taught) ||
      (s.membership_id !== null && s.membership_id === caller.membershipId);
    if (!ok) throw notFound('student');
    return s;
  }

  async progress(studentId: string): Promise<ProgressView> {
    const caller = RequestContext.requireCaller();
    const s = await this.visibleStudent(caller, studentId);
    // Staff see closed marking at once; the student sees a result once it is released to them.
    const staff = caller.roles.includes('admin') || (caller.roles.includes('teacher') && s.taught);
    const to = this.today(caller);
    const from = minusDays(to, YEAR_DAYS);
    const rows = ((await this.db.query(
      `SELECT sl.id AS slot_id, sl.outcome, st.id AS sitting_id, st.title, st.date::text AS date, st.status,
              v.list_id, v.grade, v.name AS list_name,
              r.percentage, r.total, r.out_of, r.band_key, r.band_label,
              r.profile -> 'criteria' AS criteria, r.profile -> 'requests' AS requests,
              r.slips, r.notes_played, r.released_at
         FROM slots sl
         JOIN sittings st ON st.id = sl.sitting_id
         JOIN sitting_papers sp ON sp.id = sl.paper_id
         JOIN requirement_list_versions v ON v.id = sp.list_version_id
         LEFT JOIN results r ON r.slot_id = sl.id
        WHERE sl.student_id = $1 AND sl.organisation_id = $2 AND sl.outcome IS NOT NULL
          AND st.status IN ('marking_closed', 'published') AND st.date BETWEEN $3 AND $4
        ORDER BY st.date, sl.starts_at`,
      [s.id, caller.organisationId, from, to],
    )) as YearRow[]).filter((r) =>
      staff ? true : r.outcome === 'completed' ? r.released_at !== null : r.status === 'published',
    );
    // A completed slot without a result (not scored yet) is left out rather than shown as zero.
    const shown = rows.filter((r) => r.outcome !== 'completed' || r.percentage !== null);

    const sheets = shown.length
      ? ((await this.db.query(
          `SELECT ms.slot_id, ms.role, ms.examiner_membership_id AS examiner_id, p.display_name AS examiner, c.cell, c.value
             FROM mark_sheets ms
             JOIN memberships m ON m.id = ms.examiner_membership_id
             JOIN people p ON p.id = m.person_id
             LEFT JOIN mark_cells c ON c.sheet_id = ms.id AND c.cell >= 'comment:' AND c.cell < 'comment;' AND c.cell LIKE 'comment:%'
            WHERE ms.slot_id = ANY($1::uuid[]) AND ms.organisation_id = $2 AND ms.status = 'submitted'
            ORDER BY ms.role, c.cell`,
          [shown.map((r) => r.slot_id), caller.organisationId],
        )) as SheetRow[])
      : [];

    const lines = splitComparable(
      shown.map((r) => ({
        date: r.date,
        percent: r.percentage ?? 0,
        outcome: r.outcome === 'completed' ? ('completed' as const) : r.outcome,
        lineageId: r.list_id,
        grade: r.grade,
        row: r,
      })),
    );
    const lineOf = new Map<string, number>();
    const lineViews: ProgressLine[] = lines.map((line, i) => {
      for (const p of line) lineOf.set(p.row.slot_id, i);
      const t = trend(line);
      const first = line[0]!.row;
      return {
        lineageId: first.list_id,
        grade: first.grade,
        listName: line[line.length - 1]!.row.list_name,
        from: first.date,
        to: line[line.length - 1]!.row.date,
        n: t.n,
        slopePer30Days: t.slopePer30Days,
        standardError: t.standardError,
        firstToLatest: t.firstToLatest,
      };
    });

    let tension = false;
    const sittings: ProgressSitting[] = shown.map((r) => {
      const mine = sheets.filter((x) => x.slot_id === r.slot_id);
      const labels = new Map((r.requests ?? []).map((q) => [`comment:${q.index}`, q.label]));
      const comments: ProgressExaminerComment[] = mine
        .filter((x) => x.cell && typeof x.value === 'string' && x.value.trim() !== '')
        .map((x) => ({
          examiner: x.examiner,
          role: x.role,
          about: x.cell === 'comment:overall' ? 'overall' : (labels.get(x.cell!) ?? `request ${Number(x.cell!.split(':')[1]) + 1}`),
          text: String(x.value),
        }));
      if (r.criteria?.some((c) => isTensionCriterion(c))) tension = true;
      return {
        sittingId: r.sitting_id,
        slotId: r.slot_id,
        title: r.title,
        date: r.date,
        outcome: r.outcome,
        listName: r.list_name,
        lineageId: r.list_id,
        grade: r.grade,
        line: lineOf.get(r.slot_id) ?? 0,
        result:
          r.percentage === null
            ? null
            : {
                percentage: r.percentage,
                total: r.total!,
                outOf: r.out_of!,
                band: { key: r.band_key!, label: r.band_label! },
                criteria: (r.criteria ?? []).map((c) => ({ key: c.key, label: c.label, fraction: c.fraction })),
                slips: r.slips ?? 0,
                notesPlayed: r.notes_played,
                slipRate: r.notes_played ? (100 * (r.slips ?? 0)) / r.notes_played : null,
                released: r.released_at !== null,
              },
        examiners: [...new Set(mine.map((x) => x.examiner))],
        comments,
      };
    });

    const latest = [...sittings].reverse().find((x) => x.result);
    let percentile: ProgressView['percentile'] = null;
    if (latest?.result) {
      // Each same-grade student's latest result in the same list lineage over the year (their own
      // included), counted by percentage. latest_results holds one row per student, lineage and
      // grade (the latest overall: if it is older than the year, so is every earlier one), so this
      // is one index range over the peers, counting those below and equal, not a search for each
      // peer's latest result.
      const [c] = (await this.db.query(
        `SELECT count(*)::int AS n, count(*) FILTER (WHERE l.percentage < $5)::int AS below,
                count(*) FILTER (WHERE l.percentage = $5)::int AS equal
           FROM latest_results l
          WHERE l.organisation_id = $1 AND l.list_id = $2 AND l.grade = $3 AND l.computed_at >= $4::date`,
        [caller.organisationId, latest.lineageId, latest.grade, from, latest.result.percentage],
      )) as { n: number; below: number; equal: number }[];
      // The student's shown result counts even when a later, unreleased one is their stored latest.
      const own = c!.equal === 0 ? 1 : 0;
      const counts = { below: c!.below, equal: c!.equal + own, n: c!.n + own };
      percentile = {
        value: percentileFromCounts(counts),
        students: counts.n,
        grade: latest.grade,
        lineageId: latest.lineageId,
      };
    }

    return {
      student: { id: s.id, name: fullName(s), pupilNumber: s.pupil_number, grade: s.grade },
      from,
      to,
      sittings,
      lines: lineViews,
      percentile,
      tensionCaution: tension ? TENSION_CAUTION : null,
    };
  }

  /** Teachers: their own classes' students; admins: everyone in the organisation. */
  async attention(): Promise<AttentionView> {
    const caller = RequestContext.requireCaller();
    const admin = caller.roles.includes('admin');
    const students = (await this.db.query(
      admin
        ? `SELECT s.id, s.given_name, s.family_name, s.pupil_number, s.grade FROM students s WHERE s.organisation_id = $1 AND s.active`
        : `SELECT DISTINCT s.id, s.given_name, s.family_name, s.pupil_number, s.grade
             FROM students s JOIN class_members cm ON cm.student_id = s.id JOIN class_teachers ct ON ct.class_id = cm.class_id
            WHERE s.organisation_id = $1 AND s.active AND ct.membership_id = $2`,
      admin ? [caller.organisationId] : [caller.organisationId, caller.membershipId],
    )) as StudentRow[];
    const view: AttentionView = { entries: [], students: students.length, caution: TENSION_CAUTION };
    if (!students.length) return view;
    const from = minusDays(this.today(caller), YEAR_DAYS);
    // One statement for the whole list. Only students who could have an entry are read in full:
    // at least 3 results with a criterion below 60 % (entrenched, persistent tension), or a result
    // with at least 2 slips per 100 notes (a rising rate must end there). The rules themselves are
    // applied below, unchanged; this only spares reading everyone's year of profiles.
    const scope = admin
      ? `r.organisation_id = $1`
      : `r.organisation_id = $1 AND r.student_id IN (SELECT cm.student_id FROM class_members cm JOIN class_teachers ct ON ct.class_id = cm.class_id WHERE ct.membership_id = $3)`;
    const rows = (await this.db.query(
      `WITH year AS (
         SELECT r.student_id, r.slot_id, r.sitting_id, st.title, st.date, r.profile -> 'criteria' AS criteria, r.slips, r.notes_played
           FROM results r JOIN sittings st ON st.id = r.sitting_id
          WHERE ${scope} AND st.organisation_id = $1 AND st.date >= $2
       ), candidates AS (
         SELECT y.student_id FROM year y
          GROUP BY y.student_id
         HAVING count(*) FILTER (WHERE EXISTS (
                  SELECT 1 FROM jsonb_array_elements(y.criteria) c
                   WHERE (c ->> 'fraction')::float < 0.6
                      OR (c ->> 'marks')::float < 0.6 * NULLIF((c ->> 'maximum')::float, 0))) >= 3
             OR bool_or(y.notes_played > 0 AND 100 * y.slips >= 2 * y.notes_played)
       )
       SELECT y.student_id, y.slot_id, y.sitting_id, y.title, y.date::text AS date, y.criteria, y.slips, y.notes_played,
              e.examiner_ids, e.examiners
         FROM year y
         JOIN candidates USING (student_id)
         LEFT JOIN LATERAL (
           SELECT array_agg(ms.examiner_membership_id::text ORDER BY ms.role) AS examiner_ids,
                  array_agg(p.display_name ORDER BY ms.role) AS examiners
             FROM mark_sheets ms JOIN memberships m ON m.id = ms.examiner_membership_id JOIN people p ON p.id = m.person_id
            WHERE ms.slot_id = y.slot_id AND ms.organisation_id = $1 AND ms.status = 'submitted'
         ) e ON true
        ORDER BY y.date`,
      admin ? [caller.organisationId, from] : [caller.organisationId, from, caller.membershipId],
    )) as {
      student_id: string;
      slot_id: string;
      sitting_id: string;
      title: string;
      date: string;
      criteria: ResultCriterionProfile[];
      slips: number;
      notes_played: number | null;
      examiner_ids: string[] | null;
      examiners: string[] | null;
    }[];
    const bySittingOf = new Map(rows.map((r) => [`${r.student_id}|${r.sitting_id}`, r]));
    // Each student's rows, in date order, found by key rather than by scanning every row per student.
    const rowsOf = new Map<string, typeof rows>();
    for (const r of rows) {
      const list = rowsOf.get(r.student_id);
      if (list) list.push(r);
      else rowsOf.set(r.student_id, [r]);
    }
    for (const s of students) {
      const mine = rowsOf.get(s.id) ?? [];
      if (!mine.length) continue;
      const student = { id: s.id, name: fullName(s), pupilNumber: s.pupil_number, grade: s.grade };
      const evidenceOf = (sittingId: string, value: string): AttentionEvidence => {
        const r = bySittingOf.get(`${s.id}|${sittingId}`)!;
        return { sittingId, title: r.title, date: r.date, slotId: r.slot_id, value, examiners: [...new Set(r.examiners ?? [])] };
      };
      const tensionKeys = new Set<string>();
      for (const issue of entrenchedIssues(
        mine.map((r) => ({ sittingId: r.sitting_id, date: r.date, outcome: 'completed', examinerIds: r.examiner_ids ?? [], criteria: r.criteria })),
      )) {
        const tense = isTensionCriterion({ key: issue.criterionKey, label: issue.label });
        if (tense) tensionKeys.add(issue.criterionKey);
        view.entries.push({
          kind: tense ? 'tension' : 'entrenched',
          student,
          criterion: { key: issue.criterionKey, label: issue.label },
          summary: `${issue.label} below 60 % in ${issue.sittingIds.length} sittings in a row, marked by ${issue.examinerIds.length} examiners`,
          since: issue.since,
          evidence: issue.sittingIds.map((id, i) => evidenceOf(id, `${issue.label} ${pct(issue.fractions[i]!)}`)),
          caution: tense ? TENSION_CAUTION : null,
        });
      }
      // Persistent low tension marks (3 of the latest 4), when not already listed as entrenched.
      const tensionCriteria = new Map<string, string>();
      for (const r of mine) for (const c of r.criteria) if (isTensionCriterion(c)) tensionCriteria.set(c.key, c.label);
      for (const [key, label] of tensionCriteria) {
        if (tensionKeys.has(key)) continue;
        const low = persistentLow(
          mine.flatMap((r) => {
            const c = r.criteria.find((x) => x.key === key);
            return c ? [{ sittingId: r.sitting_id, date: r.date, fraction: c.fraction }] : [];
          }),
        );
        if (!low) continue;
        view.entries.push({
          kind: 'tension',
          student,
          criterion: { key, label },
          summary: `${label} below 60 % in ${low.length} of the latest 4 sittings`,
          since: low[0]!.date,
          evidence: low.map((p) => evidenceOf(p.sittingId, `${label} ${pct(p.fraction)}`)),
          caution: TENSION_CAUTION,
        });
      }
      const rising = risingSlipRate(
        mine.map((r) => ({ sittingId: r.sitting_id, date: r.date, slips: r.slips, notesPlayed: r.notes_played ?? 0 })),
      );
      if (rising) {
        view.entries.push({
          kind: 'rising_slips',
          student,
          criterion: null,
          summary: `Fingering slips rising: ${rising.first.toFixed(1)} → ${rising.latest.toFixed(1)} per 100 notes (${rising.slopePer30Days >= 0 ? '+' : ''}${rising.slopePer30Days.toFixed(1)} per 30 days)`,
          since: rising.points[0]!.date,
          evidence: rising.points.map((p) => evidenceOf(p.sittingId, `${p.rate.toFixed(1)} slips per 100 notes`)),
          caution: null,
        });
      }
    }
    const order: Record<AttentionEntry['kind'], number> = { tension: 0, entrenched: 1, rising_slips: 2 };
    view.entries.sort((a, b) => order[a.kind] - order[b.kind] || a.student.name.localeCompare(b.student.name));
    return view;
  }
}
