import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  drawRequests,
  type DeskView,
  type MarkingSittingSummary,
  type RequirementLine,
  type SelectionRule,
} from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

describe('the marking desk', () => {
  let t: TestApp;
  let examiner: string;
  let second: string;
  let teacher: string;
  let otherOrgAdmin: string;
  let sitting: MarkingSittingSummary;

  const start = async (slotId: string, token = examiner) => {
    const res = await t.http().post(`/api/slots/${slotId}/start`).set(auth(token));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as DeskView;
  };
  const save = (
    sheetId: string,
    cell: string,
    value: unknown,
    baseVersion: number,
    changeId: string = randomUUID(),
    token = examiner,
  ) =>
    t
      .http()
      .post(`/api/mark-sheets/${sheetId}/cells`)
      .set(auth(token))
      .send({ changeId, cell, value, baseVersion });

  /** Marks every criterion of every request and records the outcome; returns the last change id. */
  const markAll = async (desk: DeskView, token = examiner, mark = 7): Promise<string> => {
    let last = '';
    for (const r of desk.requests)
      for (const c of r.criteria) {
        last = randomUUID();
        const res = await save(
          desk.sheet!.id,
          `mark:${r.index}:${c.key}`,
          Math.min(mark, c.maxMark),
          0,
          last,
          token,
        );
        expect(res.status, JSON.stringify(res.body)).toBe(200);
      }
    last = randomUUID();
    expect((await save(desk.sheet!.id, 'outcome', 'completed', 0, last, token)).status).toBe(200);
    return last;
  };

  beforeAll(async () => {
    // Today's demo sitting runs 09:30–12:30 in Europe/London; 13:00 UTC is after every slot began.
    t = await createTestApp({
      today: '2026-12-01',
      env: { STAVEMARK_NOW: '2026-12-01T13:00:00Z' },
    });
    examiner = await signIn(t, 'examiner@demo.example');
    second = await signIn(t, 'ottilie.brandt@demo.example');
    teacher = await signIn(t, 'teacher@demo.example');
    otherOrgAdmin = await signIn(t, 'admin@fernhill.example');
    const today = await t.http().get('/api/marking/today').set(auth(examiner));
    expect(today.status).toBe(200);
    sitting = (today.body as MarkingSittingSummary[]).find((s) =>
      s.title.startsWith('Grade 5 mock'),
    )!;
    expect(sitting.slots).toHaveLength(5);
    // Refused while the sitting is only scheduled; the examiner opens it on the day.
    expect(
      (await t.http().post(`/api/slots/${sitting.slots[0]!.id}/start`).set(auth(examiner))).status,
    ).toBe(409);
    const opened = await t
      .http()
      .post(`/api/sittings/${sitting.id}/status`)
      .set(auth(examiner))
      .send({ status: 'in_progress' });
    expect(opened.status, JSON.stringify(opened.body)).toBe(200);
  });
  afterAll(() => t.close());

  it('draws once per slot, replayably from the stored seed, honouring the selection rule', async () => {
    const slot = sitting.slots[0]!;
    const desk = await start(slot.id);
    expect(desk.draw?.algorithm).toBe('mulberry32/fnv1a32 v1');
    const again = await start(slot.id);
    expect(again.draw?.seed).toBe(desk.draw?.seed);
    expect(again.sheet?.id).toBe(desk.sheet?.id);

    // Replay: the same list, rule, seed and previous draw give the same requests.
    const [row] = (await t.db.query(
      `SELECT lv.selection_rule AS rule, lv.id AS lv FROM slots s JOIN sitting_papers p ON p.id = s.paper_id JOIN requirement_list_versions lv ON lv.id = p.list_version_id WHERE s.id = $1`,
      [slot.id],
    )) as { rule: SelectionRule; lv: string }[];
    const lines = (await t.db.query(
      `SELECT * FROM requirement_lines WHERE list_version_id = $1 ORDER BY position`,
      [row!.lv],
    )) as unknown[];
    expect(lines.length).toBeGreaterThan(0);
    const stored = (await t.db.query(`SELECT drawn FROM slot_draws WHERE slot_id = $1`, [
      slot.id,
    ])) as { drawn: { lineId: string; kind: string }[] }[];
    const requests = stored[0]!.drawn;
    expect(requests).toHaveLength(row!.rule.count);
    for (const [kind, min] of Object.entries(row!.rule.minPerKind))
      expect(requests.filter((r) => r.kind === kind).length).toBeGreaterThanOrEqual(min);
    const { toLineView } = await import('../requirement-lists/requirement-lists.mapper.js');
    const { RequirementLineRow } =
      await import('../requirement-lists/entities/requirement-line.entity.js');
    const lineRows = await t.db.getRepository(RequirementLineRow).find({
      where: { listVersionId: row!.lv },
      relations: { rubricVersion: true },
      order: { position: 'ASC' },
    });
    // The pupil's previous draw (the demo year's latest) is avoided, as the desk does.
    const [prev] = (await t.db.query(
      `SELECT d.requests FROM slot_draws d JOIN slots s ON s.id = $1 WHERE d.student_id = s.student_id AND d.slot_id <> s.id ORDER BY d.drawn_at DESC LIMIT 1`,
      [slot.id],
    )) as { requests: NonNullable<Parameters<typeof drawRequests>[3]>['previous'] }[];
    const replay = drawRequests(
      { lines: lineRows.map(toLineView) as RequirementLine[] },
      row!.rule,
      desk.draw!.seed,
      { previous: prev?.requests ?? [], substitutions: [] },
    );
    expect(replay.requests).toEqual(requests);

    // Every request carries its rubric's criteria, with level descriptors.
    expect(
      desk.requests.every(
        (r) => r.criteria.length > 0 && r.criteria.every((c) => c.descriptors.length > 0),
      ),
    ).toBe(true);
    const audit = (await t.db.query(
      `SELECT after FROM audit_events WHERE action = 'slot.drawn' AND entity_id = $1`,
      [slot.id],
    )) as { after: { seed: string } }[];
    expect(audit.map((a) => a.after.seed)).toEqual([desk.draw!.seed]);
  });

  it('applies the same change once, conflicts only on the same cell, and keeps other cells apart', async () => {
    const desk = await start(sitting.slots[0]!.id);
    const sheet = desk.sheet!.id;
    const r0 = desk.requests[0]!;
    const [c1, c2] = r0.criteria;
    const cell = `mark:0:${c1!.key}`;
    const changeId = randomUUID();

    const first = await save(sheet, cell, 3, 0, changeId);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ status: 'applied', version: 1, value: 3 });
    const twice = await save(sheet, cell, 3, 0, changeId);
    expect(twice.body).toMatchObject({ status: 'duplicate', version: 1 });
    // Both sent at once (a retry racing the original): still applied once.
    const racing = randomUUID();
    const both = await Promise.all([
      save(sheet, cell, 4, 1, racing),
      save(sheet, cell, 4, 1, racing),
    ]);
    expect(both.map((b) => b.body.status).sort()).toEqual(['applied', 'duplicate']);
    const [row] = (await t.db.query(
      `SELECT version, value FROM mark_cells WHERE sheet_id = $1 AND cell = $2`,
      [sheet, cell],
    )) as { version: number; value: number }[];
    expect(row).toEqual({ version: 2, value: 4 });

    // The same for a cell never saved (base 0): one change id racing itself makes one cell, once.
    const fresh = randomUUID();
    const bothNew = await Promise.all([
      save(sheet, 'comment:overall', 'Even tone.', 0, fresh),
      save(sheet, 'comment:overall', 'Even tone.', 0, fresh),
    ]);
    expect(bothNew.map((b) => b.body.status).sort()).toEqual(['applied', 'duplicate']);
    expect(bothNew.map((b) => b.body.version)).toEqual([1, 1]);
    expect(
      await t.db.query(
        `SELECT c.version, c.last_change_id, (SELECT count(*)::int FROM mark_changes m WHERE m.change_id = $3) AS n
           FROM mark_cells c WHERE c.sheet_id = $1 AND c.cell = $2`,
        [sheet, 'comment:overall', fresh],
      ),
    ).toEqual([{ version: 1, last_change_id: fresh, n: 1 }]);

    // Another tab, still on version 1, writes a different mark: a conflict with both values.
    const stale = await save(sheet, cell, 6, 1);
    expect(stale.status).toBe(409);
    expect(stale.body.details).toMatchObject({
      kind: 'cell_conflict',
      yours: 6,
      theirs: 4,
      version: 2,
    });
    // The same value from a stale base is no conflict: nothing to choose between.
    expect((await save(sheet, cell, 4, 1)).body).toMatchObject({ status: 'applied', version: 2 });
    // A different cell from base 0 never conflicts.
    expect((await save(sheet, `mark:0:${c2!.key}`, 2, 0)).body).toMatchObject({
      status: 'applied',
      version: 1,
    });
    expect((await save(sheet, 'flag:0:slip', 1, 0)).body).toMatchObject({
      status: 'applied',
      version: 1,
    });

    // A save based on a version of a cell that does not exist yet (a client bug or a lost
    // database): a conflict against the empty cell, never a silent write.
    const ghost = await save(sheet, 'comment:0', 'Late', 3);
    expect(ghost.status).toBe(409);
    expect(ghost.body.details).toMatchObject({ kind: 'cell_conflict', theirs: null, version: 0 });
    // …after which the empty cell (version 0) takes a save from base 0 as version 1.
    expect((await save(sheet, 'comment:0', 'Late', 0)).body).toMatchObject({
      status: 'applied',
      version: 1,
    });
    // Many new cells at once from base 0 and several changes to one cell at once: each change is
    // recorded with the version it produced, and the versions of the one cell are 1..n in order.
    const many = await Promise.all(
      ['restart', 'stopped', 'prompted'].map((f) => save(sheet, `flag:0:${f}`, 2, 0)),
    );
    expect(many.map((m) => m.body)).toMatchObject([
      { status: 'applied', version: 1 },
      { status: 'applied', version: 1 },
      { status: 'applied', version: 1 },
    ]);
    const count = 'flag:1:slip';
    const ids = [randomUUID(), randomUUID(), randomUUID()];
    const same = await Promise.all(ids.map((id, i) => save(sheet, count, i + 1, 0, id)));
    // One is applied from base 0; the others meet a changed cell: conflicts with both values.
    expect(same.filter((s) => s.status === 200)).toHaveLength(1);
    expect(same.filter((s) => s.status === 409)).toHaveLength(2);
    const recorded = (await t.db.query(
      `SELECT c.result, c.version, cell.version AS cell_version FROM mark_changes c
         JOIN mark_cells cell ON cell.sheet_id = c.sheet_id AND cell.cell = c.cell
        WHERE c.change_id = ANY($1) ORDER BY c.result`,
      [ids],
    )) as { result: string; version: number; cell_version: number }[];
    expect(recorded.map((r) => [r.result, r.version, r.cell_version])).toEqual([
      ['applied', 1, 1],
      ['conflict', 1, 1],
      ['conflict', 1, 1],
    ]);

    // Bad input: a mark above the criterion's maximum, an unknown criterion, a request not drawn.
    expect((await save(sheet, cell, c1!.maxMark + 1, 2)).status).toBe(400);
    expect((await save(sheet, 'mark:0:nonsense', 1, 0)).status).toBe(400);
    expect((await save(sheet, 'mark:40:' + c1!.key, 1, 0)).status).toBe(400);
    expect((await save(sheet, 'flag:0:sneezed', 1, 0)).status).toBe(400);
  });

  it('submits only when the queue has drained and every asked request is marked; then corrections are audited', async () => {
    const slot = sitting.slots.find((s) => s.position === 2)!;
    const desk = await start(slot.id);
    const sheet = desk.sheet!.id;
    const submit = (lastChangeId: string | null) =>
      t
        .http()
        .post(`/api/mark-sheets/${sheet}/submit`)
        .set(auth(examiner))
        .send({ lastChangeId, confirm: true });

    expect((await submit(null)).status).toBe(400); // no outcome yet
    // The last request was not asked: its marks are not needed.
    const last = desk.requests.at(-1)!;
    expect((await save(sheet, `asked:${last.index}`, false, 0)).status).toBe(200);
    const partial = { ...desk, requests: desk.requests.slice(0, -1) };
    const lastChange = await markAll(partial);
    expect((await submit(randomUUID())).body.details).toMatchObject({ kind: 'queue_not_empty' });
    const done = await submit(lastChange);
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    expect(done.body.sheet.status).toBe('submitted');
    // The first examiner's outcome is the slot's.
    expect(done.body.slot.outcome).toBe('completed');

    // Read-only now: a save is refused; a correction with a reason is kept with old and new values.
    const cell = `mark:0:${desk.requests[0]!.criteria[0]!.key}`;
    const late = await save(sheet, cell, 1, 1);
    expect(late.status).toBe(409);
    expect(late.body.details).toMatchObject({ kind: 'submitted' });
    const fix = await t
      .http()
      .post(`/api/mark-sheets/${sheet}/corrections`)
      .set(auth(examiner))
      .send({ changeId: randomUUID(), cell, value: 5, reason: 'Typed 7 for 5 by mistake' });
    expect(fix.status, JSON.stringify(fix.body)).toBe(200);
    expect(fix.body).toMatchObject({ status: 'applied', value: 5, version: 2 });
    const [event] = (await t.db.query(
      `SELECT before, after FROM audit_events WHERE action = 'mark_sheet.corrected' AND entity_id = $1`,
      [sheet],
    )) as { before: object; after: object }[];
    expect(event).toEqual({
      before: { cell, value: 7, version: 1 },
      after: { cell, value: 5, version: 2, reason: 'Typed 7 for 5 by mistake' },
    });
  });

  it('keeps second marking blind until both sheets are in', async () => {
    const double = (await t.db.query(
      `SELECT id FROM slots WHERE sitting_id = $1 AND second_examiner_membership_id IS NOT NULL ORDER BY position LIMIT 1`,
      [sitting.id],
    )) as { id: string }[];
    const slotId = double[0]!.id;
    const mine = await start(slotId);
    const theirs = await start(slotId, second);
    expect(theirs.role).toBe('second');
    expect(theirs.draw!.seed).toBe(mine.draw!.seed); // one performance, one draw
    const lastMine = await markAll(mine, examiner, 8);
    // Neither sees the other's sheet.
    expect(
      (await t.http().get(`/api/mark-sheets/${mine.sheet!.id}`).set(auth(second))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/mark-sheets/${theirs.sheet!.id}`).set(auth(examiner))).status,
    ).toBe(404);
    expect(
      (
        await t
          .http()
          .post(`/api/mark-sheets/${mine.sheet!.id}/submit`)
          .set(auth(examiner))
          .send({ lastChangeId: lastMine, confirm: true })
      ).status,
    ).toBe(200);
    // One submitted is not enough.
    expect(
      (await t.http().get(`/api/mark-sheets/${mine.sheet!.id}`).set(auth(second))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/slots/${slotId}/desk`).set(auth(second))).body.otherSheet,
    ).toBeNull();
    // The second examiner cannot write into the first's sheet either.
    expect((await save(mine.sheet!.id, 'flag:0:slip', 1, 0, randomUUID(), second)).status).toBe(
      404,
    );
    const lastTheirs = await markAll(theirs, second, 6);
    expect(
      (
        await t
          .http()
          .post(`/api/mark-sheets/${theirs.sheet!.id}/submit`)
          .set(auth(second))
          .send({ lastChangeId: lastTheirs, confirm: true })
      ).status,
    ).toBe(200);
    const seen = await t.http().get(`/api/mark-sheets/${mine.sheet!.id}`).set(auth(second));
    expect(seen.status).toBe(200);
    expect(seen.body.status).toBe('submitted');
    expect(
      (await t.http().get(`/api/slots/${slotId}/desk`).set(auth(examiner))).body.otherSheet.id,
    ).toBe(theirs.sheet!.id);
  });

  it('answers 404 to anyone who does not mark the slot, and 403 to other roles', async () => {
    const single = (await t.db.query(
      `SELECT id FROM slots WHERE sitting_id = $1 AND second_examiner_membership_id IS NULL ORDER BY position LIMIT 1`,
      [sitting.id],
    )) as { id: string }[];
    const slotId = single[0]!.id;
    const desk = await start(slotId);
    expect((await t.http().get(`/api/slots/${slotId}/desk`).set(auth(second))).status).toBe(404);
    expect((await t.http().post(`/api/slots/${slotId}/start`).set(auth(second))).status).toBe(404);
    expect((await t.http().get(`/api/slots/${slotId}/desk`).set(auth(teacher))).status).toBe(403);
    expect(
      (await t.http().get(`/api/mark-sheets/${desk.sheet!.id}`).set(auth(otherOrgAdmin))).status,
    ).toBe(404);
    expect((await save(desk.sheet!.id, 'flag:0:slip', 1, 0, randomUUID(), second)).status).toBe(
      404,
    );
  });

  it('applies the candidate’s approved substitutions to the draw (hands separately)', async () => {
    const [free] = (await t.db.query(
      `SELECT s.id, s.student_id FROM slots s LEFT JOIN slot_draws d ON d.slot_id = s.id WHERE s.sitting_id = $1 AND d.id IS NULL ORDER BY s.position LIMIT 1`,
      [sitting.id],
    )) as { id: string; student_id: string }[];
    const put = await t
      .http()
      .put(`/api/students/${free!.student_id}/access-arrangement`)
      .set(auth(await signIn(t, 'admin@demo.example')))
      .send({
        extraTimePercent: 0,
        restBreakMinutes: 0,
        substitutions: [{ type: 'hands_separately' }],
      });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    const desk = await start(free!.id);
    expect(desk.requests.some((r) => r.hands === 'HT')).toBe(false);
    const split = desk.requests.filter((r) => r.substitution?.types.includes('hands_separately'));
    expect(split.length).toBeGreaterThan(0);
    expect(split.every((r) => r.substitution!.original.hands === 'HT')).toBe(true);
  });

  it('records a changed request with its reason', async () => {
    const slotId = sitting.slots.find((s) => s.position === 4)!.id;
    const desk = await start(slotId);
    const target = desk.requests.find((r) => r.key !== null)!;
    const res = await t
      .http()
      .post(`/api/slots/${slotId}/request-changes`)
      .set(auth(examiner))
      .send({
        index: target.index,
        hands: 'RH',
        reason: 'Candidate asked to start with the right hand',
      });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const changed = (res.body as DeskView).requests[target.index]!;
    expect(changed).toMatchObject({
      hands: 'RH',
      motion: null,
      change: {
        reason: 'Candidate asked to start with the right hand',
        before: { hands: target.hands },
      },
    });
    expect(
      (
        await t
          .http()
          .post(`/api/slots/${slotId}/request-changes`)
          .set(auth(examiner))
          .send({ index: 0, reason: 'nothing' })
      ).status,
    ).toBe(400);
  });

  it('a candidate taken early: once started on the desk, the slot can be completed before its planned time', async () => {
    const previous = process.env.STAVEMARK_NOW;
    process.env.STAVEMARK_NOW = '2026-12-01T07:00:00Z'; // before the sitting's 09:30 start
    try {
      const started = sitting.slots.find((s) => s.position === 4)!.id; // opened on the desk above
      const ok = await t.http().post(`/api/slots/${started}/outcome`).set(auth(examiner)).send({ outcome: 'completed' });
      expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    } finally {
      process.env.STAVEMARK_NOW = previous;
    }
  });
});
