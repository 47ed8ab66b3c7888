import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  compareSheets,
  entrenchedIssues,
  noteCount,
  scoreMarkSheet,
  splitComparable,
  trend,
  type Request,
  type SheetScore,
} from '@stavemark/shared';
import { dataSourceOptions } from '../database/data-source-options.js';
import { createTestDatabase } from '../../test/support/test-app.js';
import { dropDatabase } from '../../test/support/test-db.js';
import { readDemoSchool, seedDemo } from './demo-school.js';
import { DEMO_YEAR } from './demo-year.js';
import { DEMO_FILE } from './seed.js';

// The demo year is an invented scenario; these checks hold it to the story it is meant to tell,
// scoring its sheets with the project's own scoreMarkSheet / compareSheets / trend (themselves
// checked against published sources in shared/).
const TODAY = '2026-12-01';

interface SheetRow {
  sitting_id: string;
  title: string;
  date: string;
  status: string;
  list_id: string;
  grade: string;
  total_marks: number;
  pupil: string;
  slot_id: string;
  role: 'first' | 'second';
  examiner: string;
  requests: Request[];
  cells: Record<string, number | string | boolean | null>;
}

describe('the demo year of marks', () => {
  let ds: DataSource;
  let name: string;
  let sheets: SheetRow[];
  const scores = new Map<SheetRow, SheetScore>();

  beforeAll(async () => {
    const db = await createTestDatabase();
    name = db.name;
    ds = new DataSource(dataSourceOptions(db.url));
    await ds.initialize();
    await ds.transaction((em) => seedDemo(em, readDemoSchool(DEMO_FILE), TODAY));
    sheets = (await ds.query(`
      SELECT st.id AS sitting_id, st.title, st.date::text AS date, st.status, v.list_id, v.grade, v.total_marks,
             s.pupil_number AS pupil, sl.id AS slot_id, ms.role, p.email AS examiner, d.requests,
             jsonb_object_agg(c.cell, c.value) AS cells
        FROM mark_sheets ms JOIN slots sl ON sl.id = ms.slot_id JOIN sittings st ON st.id = sl.sitting_id
        JOIN sitting_papers sp ON sp.id = sl.paper_id JOIN requirement_list_versions v ON v.id = sp.list_version_id
        JOIN students s ON s.id = sl.student_id JOIN slot_draws d ON d.slot_id = sl.id
        JOIN memberships m ON m.id = ms.examiner_membership_id JOIN people p ON p.id = m.person_id
        JOIN mark_cells c ON c.sheet_id = ms.id
       WHERE ms.status = 'submitted'
       GROUP BY st.id, v.id, s.id, sl.id, ms.id, p.id, d.id`)) as SheetRow[];
    const criteria = (await ds.query(`SELECT rubric_version_id, key, label, weight, max_mark FROM rubric_criteria`)) as {
      rubric_version_id: string;
      key: string;
      label: string;
      weight: number;
      max_mark: number;
    }[];
    for (const sh of sheets) {
      scores.set(
        sh,
        scoreMarkSheet({
          outcome: 'completed',
          totalMarks: sh.total_marks,
          requests: sh.requests.map((r) => ({
            key: String(r.index),
            asked: sh.cells[`asked:${r.index}`] !== false,
            difficultyWeight: r.difficultyWeight,
            criteria: criteria
              .filter((c) => c.rubric_version_id === r.rubricVersionId)
              .map((c) => ({ key: c.key, label: c.label, weight: c.weight, maxMark: c.max_mark })),
            marks: Object.fromEntries(
              Object.entries(sh.cells)
                .filter(([k]) => k.startsWith(`mark:${r.index}:`))
                .map(([k, v]) => [k.split(':')[2], v as number]),
            ),
          })),
        }),
      );
    }
  });
  afterAll(async () => {
    await ds.destroy();
    await dropDatabase(name);
  });

  const first = (pupil: string) =>
    sheets.filter((s) => s.pupil === pupil && s.role === 'first').sort((a, b) => a.date.localeCompare(b.date));
  const pct = (s: SheetRow) => {
    const sc = scores.get(s)!;
    if (sc.status !== 'scored') throw new Error('unscored');
    return sc.percentage;
  };

  it('a second run of the seed adds nothing', async () => {
    const count = async () =>
      (await ds.query(
        `SELECT (SELECT count(*) FROM sittings)::int AS sittings, (SELECT count(*) FROM slots)::int AS slots,
                (SELECT count(*) FROM mark_sheets)::int AS sheets, (SELECT count(*) FROM mark_cells)::int AS cells,
                (SELECT count(*) FROM slot_draws)::int AS draws, (SELECT count(*) FROM students)::int AS students`,
      ))[0];
    const before = await count();
    await ds.transaction((em) => seedDemo(em, readDemoSchool(DEMO_FILE), TODAY));
    expect(await count()).toEqual(before);
  });

  it('spans eleven months: every sitting but the latest published, the latest closed for marking', async () => {
    const rows = (await ds.query(
      `SELECT title, date::text AS date, status FROM sittings WHERE status IN ('published', 'marking_closed') ORDER BY date`,
    )) as { title: string; date: string; status: string }[];
    expect(rows).toHaveLength(DEMO_YEAR.length);
    expect(rows[0]!.date).toBe('2026-01-13'); // 322 days before 1 December
    expect(rows.at(-1)).toMatchObject({ date: '2026-11-11', status: 'marking_closed' });
    expect(rows.slice(0, -1).every((r) => r.status === 'published')).toBe(true);
  });

  it('marks every completed slot, and only those; absent and withdrawn slots have no sheet', async () => {
    const rows = (await ds.query(`
      SELECT sl.outcome, (sl.second_examiner_membership_id IS NOT NULL) AS doubled, count(ms.id)::int AS sheets
        FROM slots sl JOIN sittings st ON st.id = sl.sitting_id LEFT JOIN mark_sheets ms ON ms.slot_id = sl.id
       WHERE st.status IN ('published', 'marking_closed') GROUP BY sl.id`)) as { outcome: string; doubled: boolean; sheets: number }[];
    for (const r of rows) expect(r.sheets).toBe(r.outcome === 'completed' ? (r.doubled ? 2 : 1) : 0);
    expect(rows.filter((r) => r.outcome === 'absent').length).toBeGreaterThanOrEqual(5);
    expect(rows.filter((r) => r.outcome === 'withdrawn')).toHaveLength(1);
  });

  it('has a result for every completed slot, released for the published sittings only', async () => {
    const rows = (await ds.query(`
      SELECT st.status, count(sl.id)::int AS completed, count(r.id)::int AS results, count(r.released_at)::int AS released
        FROM slots sl JOIN sittings st ON st.id = sl.sitting_id LEFT JOIN results r ON r.slot_id = sl.id
       WHERE st.status IN ('published', 'marking_closed') AND sl.outcome = 'completed' GROUP BY st.status`)) as {
      status: string;
      completed: number;
      results: number;
      released: number;
    }[];
    const by = Object.fromEntries(rows.map((r) => [r.status, r]));
    expect(by['published']!.results).toBe(by['published']!.completed);
    expect(by['published']!.released).toBe(by['published']!.completed);
    expect(by['marking_closed']).toMatchObject({ results: by['marking_closed']!.completed, released: 0 });
  });

  it('holds at least 30 double-marked candidates in the current term (enough to judge agreement)', async () => {
    const [row] = (await ds.query(`
      SELECT count(*)::int AS n FROM slots sl JOIN sittings st ON st.id = sl.sitting_id
        JOIN terms t ON t.organisation_id = st.organisation_id AND $1::date BETWEEN t.starts_on AND t.ends_on
       WHERE st.date BETWEEN t.starts_on AND t.ends_on AND sl.outcome = 'completed'
         AND (SELECT count(*) FROM mark_sheets ms WHERE ms.slot_id = sl.id AND ms.status = 'submitted') = 2`, [TODAY])) as { n: number }[];
    expect(row!.n).toBeGreaterThanOrEqual(30);
  });

  it('puts one pair outside tolerance in the closed sitting, and none in the published ones', () => {
    const bySlot = new Map<string, SheetRow[]>();
    for (const s of sheets) bySlot.set(s.slot_id, [...(bySlot.get(s.slot_id) ?? []), s]);
    const flagged = [...bySlot.values()]
      .filter((p) => p.length === 2)
      .filter(([a, b]) => {
        const c = compareSheets(scores.get(a!)!, scores.get(b!)!);
        return c.flagged;
      })
      .map(([a]) => ({ pupil: a!.pupil, status: a!.status }));
    expect(flagged).toEqual([{ pupil: 'KL1043', status: 'marking_closed' }]);
  });

  it('shows Ellis improving over the year, absent once', async () => {
    const ellis = first('KL1021');
    expect(ellis).toHaveLength(8);
    const tr = trend(ellis.map((s) => ({ date: s.date, percent: pct(s) })));
    expect(tr.slopePer30Days!).toBeGreaterThan(1.5);
    expect(tr.firstToLatest!.change).toBeGreaterThan(15);
    const [absent] = (await ds.query(
      `SELECT count(*)::int AS n FROM slots sl JOIN students s ON s.id = sl.student_id WHERE s.pupil_number = 'KL1021' AND sl.outcome = 'absent'`,
    )) as { n: number }[];
    expect(absent!.n).toBe(1);
  });

  it('gives Wren (evenness) and Yara (freedom from tension) an entrenched issue across two examiners, Ellis none', () => {
    const evidence = (pupil: string) =>
      first(pupil).map((s) => {
        const sc = scores.get(s)!;
        const examiners = sheets.filter((x) => x.slot_id === s.slot_id).map((x) => x.examiner);
        return {
          sittingId: s.sitting_id,
          date: s.date,
          outcome: 'completed' as const,
          examinerIds: examiners,
          criteria: sc.status === 'scored' ? sc.profile : [],
        };
      });
    expect(entrenchedIssues(evidence('KL1023')).map((i) => i.criterionKey)).toEqual(['evenness']);
    expect(entrenchedIssues(evidence('KL1025')).map((i) => i.criterionKey)).toContain('freedom_from_tension');
    expect(entrenchedIssues(evidence('KL1021'))).toEqual([]);
  });

  it('gives Anouk a rising slip rate in the autumn', () => {
    const rates = first('KL1027').map((s) => {
      let slips = 0;
      let notes = 0;
      for (const r of s.requests) {
        const n = noteCount({ kind: r.kind, octaves: r.octaves, direction: r.direction });
        if (n === null) continue;
        notes += n * (r.hands === 'HT' ? 2 : 1);
        slips += Number(s.cells[`flag:${r.index}:slip`] ?? 0);
      }
      return (100 * slips) / notes;
    });
    const spring = rates.slice(0, 5);
    const autumn = rates.slice(-4);
    expect(Math.min(...autumn)).toBeGreaterThan(Math.max(...spring));
    const dates = first('KL1027').slice(-4).map((s) => s.date);
    expect(trend(autumn.map((percent, i) => ({ date: dates[i]!, percent }))).slopePer30Days!).toBeGreaterThan(1);
  });

  it('gives Cosima two comparable lines: Grade 3 in the spring, Grade 5 from September', () => {
    const lines = splitComparable(
      first('KL1029').map((s) => ({ date: s.date, percent: pct(s), lineageId: s.list_id, grade: s.grade })),
    );
    expect(lines.map((l) => [l[0]!.grade, l.length])).toEqual([
      ['3', 3],
      ['5', 4],
    ]);
  });
});
