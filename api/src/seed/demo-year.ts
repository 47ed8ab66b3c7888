// A school year of past mock sittings for the demo (issue 8): nine Grade 5 sittings for the
// Thursday Seniors over the last eleven months and three Grade 3 sittings for the Wednesday
// Intermediates in the spring, with drawn requests and submitted mark sheets for every completed
// slot. All of it is an invented scenario, made reproducible by a seeded generator:
// - Ellis Northcott (the demo student) improves steadily and misses the April sitting;
// - Wren Ashdown's evenness stays below 60 % for months (an entrenched issue, two examiners);
// - Yara Ambrose's freedom from tension stays low all year (attention, with the health caution);
// - Anouk Wetherby's fingering slips rise through the autumn;
// - Cosima Rooksby sat Grade 3 in the spring and moved up to Grade 5 in September (a new line);
// - the autumn sittings are mostly double-marked (≥ 30 double-marked candidates in the term), and
//   the latest (marking closed, not yet released) holds one pair outside tolerance.
import type { EntityManager } from 'typeorm';
import {
  compareSheets,
  drawRequests,
  noteCount,
  parseClock,
  scoreMarkSheet,
  type CellValue,
  type Request,
  type RequirementLineView,
  type SelectionRule,
  type SheetScore,
  type SlotOutcome,
} from '@stavemark/shared';
import { bulkInsert } from '../common/bulk-sql.js';
import { writeSubmittedSheet } from '../marking/seed-sheets.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { toLineView } from '../requirement-lists/requirement-lists.mapper.js';
import { candidateMinutes, paperMinutes, planDay } from '../sittings/day-plan.js';
import { spreadIndices } from '../sittings/double-marking.js';
import { ResultsService } from '../results/results.service.js';
import { refreshLatest } from '../results/latest-results.js';
import { localToInstant } from '../sittings/zoned-time.js';

const PRIYA = 'examiner@demo.example';
const OTTILIE = 'ottilie.brandt@demo.example';

/** Thursday Seniors in the order of the day; Cosima joins the Grade 5 sittings in September. */
const SENIORS = ['KL1021', 'KL1023', 'KL1041', 'KL1025', 'KL1027', 'KL1029', 'KL1042', 'KL1043', 'KL1044', 'KL1045', 'KL1046'];
const INTERMEDIATES = ['KL1011', 'KL1013', 'KL1015', 'KL1017', 'KL1019', 'KL1029'];

export interface YearSitting {
  daysFromToday: number;
  list: 'grade-3' | 'grade-5';
  className: string;
  panel: [string, string];
  candidates: string[];
  status: 'published' | 'marking_closed';
  doubleMarkShare: number;
  outcomes: Record<string, Exclude<SlotOutcome, 'completed'>>;
  /** Candidate whose second marker scores one request far lower (outside tolerance, design.md §4.5). */
  discrepancy?: string;
}

const withoutCosima = SENIORS.filter((p) => p !== 'KL1029');

/**
 * The year, oldest first. In the autumn the double-marked positions (spreadIndices of 11 at 80 %:
 * all but positions 2 and 8) are kept clear of absences, so the term holds 36 double-marked
 * completed candidates.
 */
export const DEMO_YEAR: YearSitting[] = [
  { daysFromToday: -322, list: 'grade-5', className: 'Thursday Seniors', panel: [PRIYA, OTTILIE], candidates: withoutCosima, status: 'published', doubleMarkShare: 30, outcomes: {} },
  { daysFromToday: -315, list: 'grade-3', className: 'Wednesday Intermediates', panel: [OTTILIE, PRIYA], candidates: INTERMEDIATES, status: 'published', doubleMarkShare: 34, outcomes: {} },
  { daysFromToday: -287, list: 'grade-5', className: 'Thursday Seniors', panel: [OTTILIE, PRIYA], candidates: withoutCosima, status: 'published', doubleMarkShare: 30, outcomes: { KL1043: 'absent' } },
  { daysFromToday: -252, list: 'grade-5', className: 'Thursday Seniors', panel: [PRIYA, OTTILIE], candidates: withoutCosima, status: 'published', doubleMarkShare: 30, outcomes: { KL1041: 'withdrawn' } },
  { daysFromToday: -245, list: 'grade-3', className: 'Wednesday Intermediates', panel: [PRIYA, OTTILIE], candidates: INTERMEDIATES, status: 'published', doubleMarkShare: 34, outcomes: { KL1017: 'absent' } },
  { daysFromToday: -217, list: 'grade-5', className: 'Thursday Seniors', panel: [OTTILIE, PRIYA], candidates: withoutCosima, status: 'published', doubleMarkShare: 30, outcomes: { KL1021: 'absent' } },
  { daysFromToday: -175, list: 'grade-3', className: 'Wednesday Intermediates', panel: [OTTILIE, PRIYA], candidates: INTERMEDIATES, status: 'published', doubleMarkShare: 34, outcomes: {} },
  { daysFromToday: -168, list: 'grade-5', className: 'Thursday Seniors', panel: [PRIYA, OTTILIE], candidates: withoutCosima, status: 'published', doubleMarkShare: 30, outcomes: { KL1045: 'absent' } },
  { daysFromToday: -76, list: 'grade-5', className: 'Thursday Seniors', panel: [OTTILIE, PRIYA], candidates: SENIORS, status: 'published', doubleMarkShare: 80, outcomes: { KL1041: 'absent' } },
  { daysFromToday: -55, list: 'grade-5', className: 'Thursday Seniors', panel: [PRIYA, OTTILIE], candidates: SENIORS, status: 'published', doubleMarkShare: 80, outcomes: {} },
  { daysFromToday: -34, list: 'grade-5', className: 'Thursday Seniors', panel: [OTTILIE, PRIYA], candidates: SENIORS, status: 'published', doubleMarkShare: 80, outcomes: { KL1044: 'absent' } },
  { daysFromToday: -20, list: 'grade-5', className: 'Thursday Seniors', panel: [PRIYA, OTTILIE], candidates: SENIORS, status: 'marking_closed', doubleMarkShare: 80, outcomes: {}, discrepancy: 'KL1043' },
];

// ---------- The invented students' year ----------

interface Scenario {
  /** Share of the maximum at the start of the year and the change by its end. */
  base: number;
  gain: number;
  /** Per-criterion adjustments, as a function of the year's progress t ∈ [0, 1]. */
  offsets?: (t: number) => Partial<Record<string, number>>;
  /** Fingering slips per 100 notes at t = 0 and t = 1 (linear between), or a function. */
  slips: (t: number) => number;
}
const linear = (a: number, b: number) => (t: number) => a + (b - a) * t;

const SCENARIOS: Record<string, Scenario> = {
  KL1021: { base: 0.56, gain: 0.27, slips: linear(3.2, 0.7), offsets: (t) => ({ evenness: -0.06 * (1 - t), tempo_control: 0.04 }) },
  KL1023: { base: 0.67, gain: 0.02, slips: linear(1.6, 1.8), offsets: (t) => ({ evenness: -0.06 - 0.16 * t }) },
  KL1025: { base: 0.68, gain: 0.05, slips: linear(1.4, 1.2), offsets: () => ({ freedom_from_tension: -0.33, motion_economy: -0.08 }) },
  KL1027: { base: 0.71, gain: 0.0, slips: (t) => (t < 0.6 ? 1.0 : 1.0 + ((t - 0.6) / 0.4) * 8), offsets: (t) => ({ fingering_consistency: t < 0.6 ? 0 : -0.25 * ((t - 0.6) / 0.4) }) },
  KL1029: { base: 0.6, gain: 0.12, slips: linear(1.5, 1.1) },
  KL1041: { base: 0.62, gain: 0.1, slips: linear(2.2, 1.6) },
  KL1042: { base: 0.75, gain: 0.06, slips: linear(1.0, 0.8), offsets: () => ({ shape_and_phrasing: 0.06 }) },
  KL1043: { base: 0.52, gain: 0.13, slips: linear(2.8, 2.0) },
  KL1044: { base: 0.8, gain: 0.05, slips: linear(0.7, 0.5) },
  KL1045: { base: 0.67, gain: -0.05, slips: linear(1.2, 1.5) },
  KL1046: { base: 0.57, gain: 0.16, slips: linear(2.5, 1.4) },
  // Grade 3 in the spring (t runs over those three sittings only).
  KL1011: { base: 0.66, gain: 0.08, slips: linear(1.8, 1.4) },
  KL1013: { base: 0.74, gain: 0.06, slips: linear(1.2, 1.0) },
  KL1015: { base: 0.61, gain: 0.1, slips: linear(2.4, 1.8) },
  KL1017: { base: 0.69, gain: 0.03, slips: linear(1.5, 1.5) },
  KL1019: { base: 0.55, gain: 0.07, slips: linear(2.6, 2.2) },
};
/** Cosima at Grade 3 before moving up: comfortable at that level. */
const COSIMA_GRADE3: Scenario = { base: 0.76, gain: 0.07, slips: linear(1.2, 0.9) };

/**
 * How often each examiner gives a mark below / above what the performance deserved (the chance
 * of −1 is the first number, of +1 is one minus the second): Ottilie is a little stricter than
 * Priya, for the severity and agreement reports.
 */
const LEANING: Record<string, [number, number]> = { [PRIYA]: [0.1, 0.88], [OTTILIE]: [0.16, 0.92] };

// ---------- Deterministic randomness ----------

function hash32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}
function generator(seedText: string): () => number {
  let a = hash32(seedText);
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
function poisson(rand: () => number, lambda: number): number {
  const limit = Math.exp(-lambda);
  let k = 0;
  let p = rand();
  while (p > limit) {
    k++;
    p *= rand();
  }
  return k;
}

// ---------- Comments in the examiners' words (invented) ----------

const PRAISE: Record<string, string> = {
  note_accuracy: 'Notes were secure throughout',
  fingering_consistency: 'fingering held steady even in the awkward keys',
  grouping: 'the groups were clearly felt',
  motion_economy: 'hands stayed close to the keys',
  freedom_from_tension: 'shoulders and wrists looked easy',
  evenness: 'the runs were beautifully even',
  tempo_control: 'the pulse stayed steady to the last note',
  tone_and_dynamics: 'the passage had a warm, varied tone',
  shape_and_phrasing: 'the phrases had a clear shape',
};
const NEXT_STEP: Record<string, string> = {
  note_accuracy: 'slow, hands-separate practice in the sharper keys would settle the wrong notes',
  fingering_consistency: 'keep to the agreed fingering at the turn of each octave',
  grouping: 'think in groups of four so the runs do not sound note by note',
  motion_economy: 'let the thumb pass under earlier instead of jumping the hand',
  freedom_from_tension: 'watch for a raised right shoulder and a locked wrist in the longer runs',
  evenness: 'the thumb notes still bump: practise the runs in dotted rhythms, then evenly',
  tempo_control: 'the tempo crept forward in the second octave: count one bar in first',
  tone_and_dynamics: 'give the crescendo more room before the top of the phrase',
  shape_and_phrasing: 'breathe at the ends of phrases rather than running on',
};

function overallComment(fractions: Map<string, number>, percent: number): string {
  const sorted = [...fractions.entries()].sort((a, b) => b[1] - a[1]);
  const best = sorted[0]![0];
  const worst = sorted[sorted.length - 1]![0];
  const opening = percent >= 80 ? 'A confident, well-prepared set.' : percent >= 65 ? 'A solid set with real strengths.' : 'Some good moments; the basics need more time.';
  const praise = PRAISE[best] ?? 'the preparation showed';
  const next = NEXT_STEP[worst] ?? 'keep the practice slow and careful';
  return `${opening} ${praise.charAt(0).toUpperCase()}${praise.slice(1)}; next, ${next}.`;
}

// ---------- Seeding ----------

function addDays(date: string, days: number): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
export function yearSittingTitle(s: YearSitting, date: string): string {
  const grade = s.list === 'grade-5' ? 5 : 3;
  // Class first, so no title contains another's (today's is "Grade 5 mock — Thursday Seniors").
  return `${s.className} — Grade ${grade} mock, ${Number(date.slice(8, 10))} ${MONTHS[Number(date.slice(5, 7)) - 1]}`;
}

interface PlannedSheet {
  slotId: string;
  examinerMembershipId: string;
  role: 'first' | 'second';
  submittedAt: Date;
  /** Cell name (`mark:0:evenness`, `flag:1:slip`, `comment:overall`) → value. */
  cells: Record<string, CellValue>;
}

interface LoadedList {
  versionId: string;
  lines: RequirementLineView[];
  selectionRule: SelectionRule;
  totalMarks: number;
  criteria: Map<string, { key: string; label: string; weight: number; maxMark: number }[]>;
}

/**
 * Seeds the year once: sittings already there (same title and date) are left alone, so running
 * the seed again changes nothing. Returns the number of sittings added.
 */
export async function seedDemoYear(em: EntityManager, organisationId: string, today: string): Promise<number> {
  const planned = DEMO_YEAR.map((s) => {
    const date = addDays(today, s.daysFromToday);
    return { s, date, title: yearSittingTitle(s, date) };
  });
  const existing = (await em.query(`SELECT title, date::text AS date FROM sittings WHERE organisation_id = $1 AND title = ANY($2)`, [
    organisationId,
    planned.map((p) => p.title),
  ])) as { title: string; date: string }[];
  const have = new Set(existing.map((e) => `${e.title}|${e.date}`));
  const todo = planned.filter((p) => !have.has(`${p.title}|${p.date}`));
  if (todo.length === 0) return 0;

  const [org] = (await em.query(`SELECT time_zone FROM organisations WHERE id = $1`, [organisationId])) as { time_zone: string }[];
  const tz = org!.time_zone;
  const people = (await em.query(
    `SELECT p.email, m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE m.organisation_id = $1`,
    [organisationId],
  )) as { email: string; id: string }[];
  const membership = new Map(people.map((p) => [p.email, p.id]));
  const need = (email: string) => {
    const id = membership.get(email);
    if (!id) throw new Error(`Demo year: ${email} is not in the organisation`);
    return id;
  };
  const studentRows = (await em.query(`SELECT id, pupil_number, given_name, family_name FROM students WHERE organisation_id = $1`, [organisationId])) as {
    id: string;
    pupil_number: string;
    given_name: string;
    family_name: string;
  }[];
  const student = new Map(studentRows.map((r) => [r.pupil_number, r]));
  const [policy] = (await em.query(`SELECT id FROM band_policies WHERE organisation_id = $1 ORDER BY version DESC LIMIT 1`, [organisationId])) as { id: string }[];
  if (!policy) throw new Error('Demo year: no band policy (seed the demo sittings first)');
  const arrangements = (await em.query(
    `SELECT student_id, extra_time_percent, rest_break_minutes, substitutions FROM access_arrangements WHERE organisation_id = $1`,
    [organisationId],
  )) as { student_id: string; extra_time_percent: number; rest_break_minutes: number; substitutions: never[] }[];
  const planner = need('teacher@demo.example');

  const lists = new Map<string, LoadedList>();
  for (const key of ['grade-3', 'grade-5']) {
    const [row] = (await em.query(`SELECT id FROM requirement_lists WHERE starter_key = $1 AND organisation_id = $2`, [key, organisationId])) as { id: string }[];
    if (!row) throw new Error(`Demo year: no starter list ${key}`);
    const version = await em.findOne(RequirementListVersion, { where: { listId: row.id, status: 'published' }, relations: { lines: { rubricVersion: true } }, order: { version: 'DESC' } });
    if (!version?.lines) throw new Error(`Demo year: no published version of ${key}`);
    const lines = [...version.lines].sort((a, b) => a.position - b.position).map(toLineView);
    const rubricIds = [...new Set(lines.map((l) => l.rubricVersionId))];
    const crit = (await em.query(`SELECT rubric_version_id, key, label, weight, max_mark FROM rubric_criteria WHERE rubric_version_id = ANY($1) ORDER BY position`, [rubricIds])) as {
      rubric_version_id: string;
      key: string;
      label: string;
      weight: number;
      max_mark: number;
    }[];
    const criteria: LoadedList['criteria'] = new Map();
    for (const c of crit) criteria.set(c.rubric_version_id, [...(criteria.get(c.rubric_version_id) ?? []), { key: c.key, label: c.label, weight: c.weight, maxMark: c.max_mark }]);
    lists.set(key, { versionId: version.id, lines, selectionRule: version.selectionRule, totalMarks: version.totalMarks, criteria });
  }

  // Sittings and papers, one statement each.
  const writeUp = 3;
  const dayStart = '09:30';
  const dayEnd = '13:30';
  const breaks = [{ start: '11:00', end: '11:15', label: 'Break' }];
  const sittingRows = todo.map(({ s, date, title }) => {
    return [
      organisationId,
      title,
      date,
      'Recital Room',
      tz,
      localToInstant(date, parseClock(dayStart), tz),
      localToInstant(date, parseClock(dayEnd), tz),
      breaks,
      writeUp,
      2,
      s.status,
      planner,
      localToInstant(addDays(date, -14), 9 * 60, tz),
      policy.id,
      1,
    ];
  });
  const inserted = await bulkInsert(
    em,
    'sittings',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'title', type: 'text' },
      { name: 'date', type: 'date' },
      { name: 'room', type: 'text' },
      { name: 'time_zone', type: 'text' },
      { name: 'starts_at', type: 'timestamptz' },
      { name: 'ends_at', type: 'timestamptz' },
      { name: 'breaks', type: 'jsonb' },
      { name: 'write_up_gap_minutes', type: 'integer' },
      { name: 'changeover_minutes', type: 'integer' },
      { name: 'status', type: 'text' },
      { name: 'planned_by_membership_id', type: 'uuid' },
      { name: 'scheduled_at', type: 'timestamptz' },
      { name: 'band_policy_id', type: 'uuid' },
      { name: 'revision', type: 'integer' },
    ],
    sittingRows,
    'id, title',
  );
  const sittingId = new Map(inserted.map((r) => [r['title']!, r['id']!]));
  // Pinned rubric versions are an array per row, which unnest() cannot carry: one update per list.
  for (const [key, list] of lists) {
    const ids = todo.filter((p) => p.s.list === key).map((p) => sittingId.get(p.title));
    await em.query(`UPDATE sittings SET pinned_rubric_version_ids = $1::uuid[] WHERE id = ANY($2::uuid[])`, [
      [...new Set(list.lines.map((l) => l.rubricVersionId))].sort(),
      ids,
    ]);
  }
  await em.query(`UPDATE requirement_list_versions SET used_at = COALESCE(used_at, now()) WHERE id = ANY($1)`, [[...lists.values()].map((l) => l.versionId)]);

  const paperLength = new Map([...lists].map(([k, l]) => [k, paperMinutes(l, writeUp, null)]));
  const papers = await bulkInsert(
    em,
    'sitting_papers',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'sitting_id', type: 'uuid' },
      { name: 'list_version_id', type: 'uuid' },
      { name: 'position', type: 'integer' },
      { name: 'suggested_minutes', type: 'integer' },
    ],
    todo.map(({ s, title }) => {
      const list = lists.get(s.list)!;
      return [organisationId, sittingId.get(title), list.versionId, 0, paperLength.get(s.list)];
    }),
    'id, sitting_id',
  );
  const paperOf = new Map(papers.map((r) => [r['sitting_id']!, r['id']!]));
  await bulkInsert(
    em,
    'sitting_examiners',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'sitting_id', type: 'uuid' },
      { name: 'membership_id', type: 'uuid' },
      { name: 'position', type: 'integer' },
    ],
    todo.flatMap(({ s, title }) => s.panel.map((email, i) => [organisationId, sittingId.get(title), need(email), i])),
  );

  // Slots, laid out as the service would.
  interface SlotPlan {
    key: string;
    sitting: (typeof todo)[number];
    pupil: string;
    studentId: string;
    position: number;
    startsAt: Date;
    endsAt: Date;
    minutes: number;
    first: string;
    second: string | null;
    outcome: SlotOutcome;
  }
  const slotPlans: SlotPlan[] = [];
  const lengthOf = new Map<string, number>(); // planSlotMinutes is costly; one per list and arrangement
  for (const p of todo) {
    const list = lists.get(p.s.list)!;
    const lengths = p.s.candidates.map((pupil) => {
      const a = arrangements.find((x) => x.student_id === student.get(pupil)?.id);
      const key = `${p.s.list}|${JSON.stringify(a ?? null)}`;
      let minutes = lengthOf.get(key);
      if (minutes === undefined) {
        minutes = candidateMinutes({ list, writeUpGapMinutes: writeUp, fixedMinutes: null, extraTimePercent: a?.extra_time_percent ?? 0, restBreakMinutes: a?.rest_break_minutes ?? 0, substitutions: a?.substitutions ?? [] });
        lengthOf.set(key, minutes);
      }
      return minutes;
    });
    const plan = planDay({
      dayStart: parseClock(dayStart),
      dayEnd: parseClock(dayEnd),
      changeoverMinutes: 2,
      breaks: breaks.map((b) => ({ start: parseClock(b.start), end: parseClock(b.end) })),
      slots: p.s.candidates.map((pupil, i) => ({ id: pupil, name: pupil, minutes: lengths[i]! })),
    });
    if (plan.problems.length) throw new Error(`Demo year: ${p.title}: ${plan.problems[0]!.message}`);
    const doubled = new Set(spreadIndices(p.s.candidates.length, p.s.doubleMarkShare));
    p.s.candidates.forEach((pupil, i) => {
      const st = student.get(pupil);
      if (!st) throw new Error(`Demo year: no student ${pupil}`);
      slotPlans.push({
        key: `${p.title}|${pupil}`,
        sitting: p,
        pupil,
        studentId: st.id,
        position: i,
        startsAt: localToInstant(p.date, plan.placed[i]!.start, tz),
        endsAt: localToInstant(p.date, plan.placed[i]!.end, tz),
        minutes: lengths[i]!,
        first: need(p.s.panel[0]),
        second: doubled.has(i) ? need(p.s.panel[1]) : null,
        outcome: p.s.outcomes[pupil] ?? 'completed',
      });
    });
  }
  const slotRows = await bulkInsert(
    em,
    'slots',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'sitting_id', type: 'uuid' },
      { name: 'paper_id', type: 'uuid' },
      { name: 'student_id', type: 'uuid' },
      { name: 'position', type: 'integer' },
      { name: 'starts_at', type: 'timestamptz' },
      { name: 'ends_at', type: 'timestamptz' },
      { name: 'minutes', type: 'integer' },
      { name: 'examiner_membership_id', type: 'uuid' },
      { name: 'second_examiner_membership_id', type: 'uuid' },
      { name: 'outcome', type: 'text' },
      { name: 'outcome_note', type: 'text' },
      { name: 'outcome_recorded_at', type: 'timestamptz' },
    ],
    slotPlans.map((sp) => {
      const sid = sittingId.get(sp.sitting.title)!;
      return [
        organisationId,
        sid,
        paperOf.get(sid),
        sp.studentId,
        sp.position,
        sp.startsAt,
        sp.endsAt,
        sp.minutes,
        sp.first,
        sp.second,
        sp.outcome,
        sp.outcome === 'withdrawn' ? 'Withdrawn the day before: a wrist sprain from sport.' : sp.outcome === 'absent' ? 'Did not arrive; no message.' : null,
        sp.endsAt,
      ];
    }),
    'id, sitting_id, student_id',
  );
  const slotId = new Map(slotRows.map((r) => [`${r['sitting_id']}|${r['student_id']}`, r['id']!]));
  const idOf = (sp: SlotPlan) => slotId.get(`${sittingId.get(sp.sitting.title)}|${sp.studentId}`)!;

  // Draws (replayable: the seed is stored) and sheets, in date order so each draw avoids the
  // candidate's previous requests as the desk does.
  const previous = new Map<string, Request[]>();
  const draws: unknown[][] = [];
  const sheets: PlannedSheet[] = [];
  const ordered = [...slotPlans].sort((a, b) => a.sitting.s.daysFromToday - b.sitting.s.daysFromToday || a.position - b.position);
  const spans = { 'grade-3': span(DEMO_YEAR.filter((s) => s.list === 'grade-3')), 'grade-5': span(DEMO_YEAR.filter((s) => s.list === 'grade-5')) };
  for (const sp of ordered) {
    if (sp.outcome !== 'completed') continue;
    const list = lists.get(sp.sitting.s.list)!;
    const drawSeed = hash32(`${sp.key}|draw`).toString(16).padStart(8, '0');
    const result = drawRequests({ lines: list.lines }, list.selectionRule, drawSeed, { previous: previous.get(sp.pupil) ?? [] });
    previous.set(sp.pupil, result.requests);
    draws.push([organisationId, idOf(sp), sp.studentId, drawSeed, result.algorithm, result.requests, result.requests, result.repeatsOfPrevious, sp.startsAt]);

    const scenario = sp.pupil === 'KL1029' && sp.sitting.s.list === 'grade-3' ? COSIMA_GRADE3 : SCENARIOS[sp.pupil];
    if (!scenario) throw new Error(`Demo year: no scenario for ${sp.pupil}`);
    const [from, to] = spans[sp.sitting.s.list];
    const t = sp.pupil === 'KL1029' && sp.sitting.s.list === 'grade-5' ? (sp.sitting.s.daysFromToday + 76) / 56 : (sp.sitting.s.daysFromToday - from) / (to - from || 1);
    const rand = generator(sp.key);
    const form = (rand() - 0.5) * 0.08; // the candidate's form on the day, shared by both examiners
    const offsets = scenario.offsets?.(t) ?? {};
    const slips = result.requests.map((r) => {
      const notes = noteCount({ kind: r.kind, octaves: r.octaves, direction: r.direction });
      return notes === null ? 0 : poisson(rand, (scenario.slips(t) / 100) * notes * (r.hands === 'HT' ? 2 : 1));
    });
    const restarts = result.requests.map(() => (rand() < 0.06 ? 1 : 0));
    const truth = result.requests.map(() => (rand() - 0.5) * 0.06); // how each request went
    const examiners: { who: string; role: 'first' | 'second' }[] = [{ who: sp.first, role: 'first' }];
    if (sp.second) examiners.push({ who: sp.second, role: 'second' });
    // The marks the performance deserved; each examiner then differs by a mark here and there.
    const trueMarks = result.requests.map((r, i) => {
      const m = new Map<string, number>();
      for (const c of list.criteria.get(r.rubricVersionId) ?? []) {
        const slipPenalty = c.key === 'fingering_consistency' ? -0.03 * slips[i]! : 0;
        const f = scenario.base + scenario.gain * t + form + truth[i]! + (offsets[c.key] ?? 0) + slipPenalty + (rand() - 0.5) * 0.12;
        m.set(c.key, Math.round(clamp(f, 0.1, 1) * c.maxMark));
      }
      return m;
    });
    const makeSheet = (who: string, role: 'first' | 'second', attempt: number) => {
      const email = people.find((x) => x.id === who)!.email;
      const own = generator(`${sp.key}|${email}|${attempt}`);
      const cells: Record<string, CellValue> = {};
      const sums = new Map<string, { m: number; max: number }>();
      let got = 0;
      let max = 0;
      result.requests.forEach((r, i) => {
        const far = role === 'second' && sp.pupil === sp.sitting.s.discrepancy && i === result.requests.length - 1;
        for (const c of list.criteria.get(r.rubricVersionId) ?? []) {
          const [down, up] = LEANING[email] ?? [0.12, 0.88];
          const u = own();
          let mark = trueMarks[i]!.get(c.key)! + (u < down ? -1 : u > up ? 1 : 0);
          if (far) mark -= Math.round(0.4 * c.maxMark); // heard the last request very differently
          mark = clamp(mark, 0, c.maxMark);
          cells[`mark:${i}:${c.key}`] = mark;
          const sum = sums.get(c.key) ?? { m: 0, max: 0 };
          sums.set(c.key, { m: sum.m + mark, max: sum.max + c.maxMark });
          got += mark;
          max += c.maxMark;
        }
        // Both examiners hear the same slips; now and then one of them misses or adds one.
        const heard = Math.max(0, slips[i]! + (own() < 0.15 ? (own() < 0.5 ? -1 : 1) : 0));
        if (heard > 0) cells[`flag:${i}:slip`] = heard;
        if (restarts[i]) cells[`flag:${i}:restart`] = 1;
        if (role === 'first' && slips[i]! >= 3) cells[`comment:${i}`] = 'Fingering changed between the octaves; agree one and keep to it.';
      });
      const fractions = new Map([...sums.entries()].map(([k, v]) => [k, v.m / v.max]));
      cells['comment:overall'] = overallComment(fractions, (100 * got) / max);
      const submittedAt = new Date(sp.endsAt.getTime() + (role === 'first' ? 0 : 4 * 60_000));
      return { slotId: idOf(sp), examinerMembershipId: who, role, submittedAt, cells };
    };
    const firstSheet = makeSheet(sp.first, 'first', 0);
    sheets.push(firstSheet);
    if (sp.second) {
      // Second markers in this story agree within tolerance (design.md §4.5) except on the one
      // planned discrepancy: draw the second examiner's marking again until that holds.
      const wantFlag = sp.pupil === sp.sitting.s.discrepancy;
      const firstScore = scoreSheet(firstSheet.cells, result.requests, list);
      let chosen: PlannedSheet | null = null;
      for (let attempt = 0; attempt < 50 && !chosen; attempt++) {
        const candidate = makeSheet(sp.second, 'second', attempt);
        const cmp = compareSheets(firstScore, scoreSheet(candidate.cells, result.requests, list));
        if (cmp.flagged === wantFlag) chosen = candidate;
      }
      if (!chosen) throw new Error(`Demo year: no second marking of ${sp.key} fits the story`);
      sheets.push(chosen);
    }
  }
  await bulkInsert(
    em,
    'slot_draws',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'slot_id', type: 'uuid' },
      { name: 'student_id', type: 'uuid' },
      { name: 'seed', type: 'text' },
      { name: 'algorithm', type: 'text' },
      { name: 'drawn', type: 'jsonb' },
      { name: 'requests', type: 'jsonb' },
      { name: 'repeats_of_previous', type: 'integer' },
      { name: 'drawn_at', type: 'timestamptz' },
    ],
    draws,
  );
  for (const sh of sheets) {
    const pick = (prefix: string) => Object.fromEntries(Object.entries(sh.cells).filter(([k]) => k.startsWith(prefix)));
    await writeSubmittedSheet(em, {
      slot: sh.slotId,
      examinerMembershipId: sh.examinerMembershipId,
      role: sh.role,
      marks: pick('mark:') as Record<string, number>,
      flags: pick('flag:') as Record<string, number>,
      comments: Object.fromEntries(Object.entries(pick('comment:')).map(([k, v]) => [k.slice('comment:'.length), String(v)])),
      submittedAt: sh.submittedAt,
    });
  }

  // Results as marking closed them, and released to students and guardians a week after each
  // published sitting; the latest sitting's stay unreleased until moderation is done.
  const results = new ResultsService(em.connection);
  for (const p of todo) await results.computeForSitting(sittingId.get(p.title)!, em);
  // As if computed when each sitting's marking closed, the day after it (progress orders by this).
  await em.query(
    `UPDATE results r SET computed_at = s.ends_at + interval '1 day' FROM sittings s WHERE s.id = r.sitting_id AND r.sitting_id = ANY($1::uuid[])`,
    [todo.map((p) => sittingId.get(p.title))],
  );
  // computed_at moved: the latest result per lineage may be another one now.
  const moved = (await em.query(
    `SELECT DISTINCT organisation_id, student_id FROM results WHERE sitting_id = ANY($1::uuid[])`,
    [todo.map((p) => sittingId.get(p.title))],
  )) as { organisation_id: string; student_id: string }[];
  for (const org of new Set(moved.map((m) => m.organisation_id)))
    await refreshLatest(em, org, moved.filter((m) => m.organisation_id === org).map((m) => m.student_id));
  const releaser = people.find((x) => x.email === 'teacher@demo.example');
  const published = todo.filter((p) => p.s.status === 'published').map((p) => sittingId.get(p.title));
  await em.query(
    `UPDATE results r SET released_at = (s.date + 7)::timestamp AT TIME ZONE s.time_zone + interval '17 hours',
            released_by_person_id = (SELECT person_id FROM memberships WHERE id = $2)
       FROM sittings s WHERE s.id = r.sitting_id AND r.sitting_id = ANY($1::uuid[])`,
    [published, releaser!.id],
  );
  return todo.length;
}

function scoreSheet(cells: Record<string, CellValue>, requests: Request[], list: LoadedList): SheetScore {
  return scoreMarkSheet({
    outcome: 'completed',
    totalMarks: list.totalMarks,
    requests: requests.map((r) => ({
      key: String(r.index),
      asked: cells[`asked:${r.index}`] !== false,
      difficultyWeight: r.difficultyWeight,
      criteria: list.criteria.get(r.rubricVersionId) ?? [],
      marks: Object.fromEntries((list.criteria.get(r.rubricVersionId) ?? []).map((c) => [c.key, cells[`mark:${r.index}:${c.key}`] as number])),
    })),
  });
}

function span(sittings: YearSitting[]): [number, number] {
  const days = sittings.map((s) => s.daysFromToday);
  return [Math.min(...days), Math.max(...days)];
}
