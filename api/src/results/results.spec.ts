import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RESULT_RULE_VERSION, type Request } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { writeSubmittedSheet, type SeedCriterion } from '../marking/seed-sheets.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { Result } from './entities/result.entity.js';
import { ResultsService } from './results.service.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

// The starter rubrics (scales, arpeggios, broken chords) share seven criteria:
// note_accuracy w3 /10, fingering_consistency w2 /5, grouping w2 /5, motion_economy w1 /5,
// freedom_from_tension w2 /5, evenness w2 /10, tempo_control w1 /5 (weights sum to 13).
const MIXED: Record<string, number> = {
  note_accuracy: 7,
  fingering_consistency: 3,
  grouping: 4,
  motion_economy: 5,
  freedom_from_tension: 2,
  evenness: 6,
  tempo_control: 4,
};
const mixed = (_r: Request, c: SeedCriterion) => MIXED[c.key]!;
const full = (_r: Request, c: SeedCriterion) => c.maxMark;
const eightTenths = (_r: Request, c: SeedCriterion) => (c.maxMark * 8) / 10;

describe('results: computed as marking closes (issue 7 §1)', () => {
  let t: TestApp;
  let teacher: string;
  let sittingId: string;
  let slots: Slot[];
  const byPupil = (p: string) => slots.find((s) => s.student!.pupilNumber === p)!;

  beforeAll(async () => {
    t = await createTestApp({
      today: '2026-12-01',
      env: { STAVEMARK_NOW: '2026-12-01T13:00:00Z' },
    });
    teacher = await signIn(t, 'teacher@demo.example');
    const [row] = (await t.db.query(
      `SELECT id FROM sittings WHERE title = 'Grade 3 mock — Wednesday Intermediates'`,
    )) as { id: string }[];
    sittingId = row!.id;
    slots = await t.db.getRepository(Slot).find({
      where: { sittingId },
      relations: { student: true },
      order: { position: 'ASC' },
    });
    // Demo: KL1011–KL1017 completed, KL1019 absent; 40 % double-marked.
    expect(slots.map((s) => s.outcome)).toEqual([
      'completed',
      'completed',
      'completed',
      'completed',
      'absent',
    ]);
  });
  afterAll(() => t.close());

  it('stores total, percentage, band and profile from the submitted sheets, with the rule and pinned versions', async () => {
    const at = new Date('2026-11-17T17:00:00Z');
    const single = slots.find((s) => !s.secondExaminerMembershipId && s.outcome === 'completed')!;
    const doubled = slots.find((s) => s.secondExaminerMembershipId && s.outcome === 'completed')!;
    const others = slots.filter((s) => s !== single && s !== doubled && s.outcome === 'completed');
    const notAskedSlot = others[0]!;
    const unmarked = others[1]!; // completed, but nobody submitted: no result
    const absent = byPupil('KL1019');

    await t.db.transaction(async (em) => {
      await writeSubmittedSheet(em, {
        slot: single,
        examinerMembershipId: single.examinerMembershipId!,
        role: 'first',
        marks: mixed,
        flags: { 'flag:0:slip': 2, 'flag:1:slip': 1, 'flag:1:restart': 1 },
        comments: { overall: 'Steady work.' },
        submittedAt: at,
      });
      // The pair: the first examiner's sheet is the basis while the two agree within tolerance.
      await writeSubmittedSheet(em, {
        slot: doubled,
        examinerMembershipId: doubled.examinerMembershipId!,
        role: 'first',
        marks: eightTenths,
        submittedAt: at,
      });
      await writeSubmittedSheet(em, {
        slot: doubled,
        examinerMembershipId: doubled.secondExaminerMembershipId!,
        role: 'second',
        marks: full,
        submittedAt: at,
      });
      await writeSubmittedSheet(em, {
        slot: notAskedSlot,
        examinerMembershipId: notAskedSlot.examinerMembershipId!,
        role: 'first',
        marks: (r, c) => (r.index === 2 ? null : c.maxMark),
        notAsked: [2],
        submittedAt: at,
      });
      // An absent candidate's sheet gives no result, whatever it holds.
      await writeSubmittedSheet(em, {
        slot: absent,
        examinerMembershipId: absent.examinerMembershipId!,
        role: 'first',
        marks: full,
        outcome: 'absent',
        submittedAt: at,
      });
    });

    const closed = await t
      .http()
      .post(`/api/sittings/${sittingId}/status`)
      .set(auth(teacher))
      .send({ status: 'marking_closed' });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);

    const results = await t.db.getRepository(Result).find({ where: { sittingId } });
    expect(results.map((r) => r.slotId).sort()).toEqual(
      [single.id, doubled.id, notAskedSlot.id].sort(),
    );
    expect(results.some((r) => r.slotId === unmarked.id || r.slotId === absent.id)).toBe(false);
    const of = (s: Slot) => results.find((r) => r.slotId === s.id)!;

    // Hand-worked (ours, on paper): every request marked 7/10, 3/5, 4/5, 5/5, 2/5, 6/10, 4/5 scores
    // (3·0.7 + 2·0.6 + 2·0.8 + 1·1 + 2·0.4 + 2·0.6 + 1·0.8)/13 = 8.7/13 = 0.66923…; with every
    // request the same score the difficulty weights cancel: 0.66923 × 30 = 20.08 → 20 of 30
    // = 66.7 % → Pass (55 % ≤ p < 70 %, design.md §4.1 default policy).
    const r1 = of(single);
    expect([r1.total, r1.outOf, r1.bandKey, r1.bandLabel, r1.basis]).toEqual([
      20,
      30,
      'pass',
      'Pass',
      'single',
    ]);
    expect(r1.percentage).toBeCloseTo(66.6667, 3);
    expect(r1.ruleVersion).toBe(RESULT_RULE_VERSION);
    const [pinned] = (await t.db.query(
      `SELECT s.band_policy_id AS policy, p.list_version_id AS list FROM sittings s JOIN sitting_papers p ON p.sitting_id = s.id WHERE s.id = $1`,
      [sittingId],
    )) as { policy: string; list: string }[];
    expect([r1.bandPolicyVersionId, r1.listVersionId]).toEqual([pinned!.policy, pinned!.list]);
    expect(r1.profile.requests).toHaveLength(5);
    r1.profile.requests.forEach((q) => expect(q.score).toBeCloseTo(8.7 / 13, 12));
    // Criterion profile over 5 requests: marks out of maxima (hand-worked: 5 × 7 of 5 × 10, …).
    expect(r1.profile.criteria.map((c) => [c.key, c.marks, c.maximum])).toEqual([
      ['note_accuracy', 35, 50],
      ['fingering_consistency', 15, 25],
      ['grouping', 20, 25],
      ['motion_economy', 25, 25],
      ['freedom_from_tension', 10, 25],
      ['evenness', 30, 50],
      ['tempo_control', 20, 25],
    ]);
    expect(r1.profile.criteria.find((c) => c.key === 'freedom_from_tension')!.fraction).toBeCloseTo(
      0.4,
      12,
    );
    // Slips: 2 + 1 fingering-slip flags; the restart flag is not a slip.
    expect(r1.slips).toBe(3);
    expect(r1.profile.requests.slice(0, 2).map((q) => q.slips)).toEqual([2, 1]);
    // Notes played, by design.md §4.2 written out here: one way scale 7·o+1, chromatic 12·o+1,
    // triad arpeggio 3·o+1 (broken chords are counted by the shared table); up and down
    // 2·(one way) − 1; both hands together count twice.
    const [draw] = (await t.db.query(`SELECT requests FROM slot_draws WHERE slot_id = $1`, [
      single.id,
    ])) as {
      requests: Request[];
    }[];
    const perOctave: Partial<Record<Request['kind'], number>> = {
      scale: 7,
      chromatic: 12,
      arpeggio: 3,
    };
    for (const [i, q] of draw!.requests.entries()) {
      const k = perOctave[q.kind];
      if (k === undefined) continue;
      const oneWay = k * q.octaves + 1;
      const dir = q.direction === 'up_down' ? 2 * oneWay - 1 : oneWay;
      expect(
        r1.profile.requests[i]!.notesPlayed,
        `${q.kind} ${q.octaves} ${q.direction} ${q.hands}`,
      ).toBe(q.hands === 'HT' ? 2 * dir : dir);
    }
    expect(r1.notesPlayed).toBe(r1.profile.requests.reduce((s, q) => s + (q.notesPlayed ?? 0), 0));

    // Hand-worked: 8/10 and 4/5 on every criterion → 0.8 per request → 24 of 30 = exactly 80 %,
    // the Distinction threshold (inclusive, design.md §4.1); basis: the first of the pair.
    const r2 = of(doubled);
    expect([r2.total, r2.bandKey, r2.basis]).toEqual([24, 'distinction', 'first']);

    // A request not asked is left out: the four asked, all full marks → 30 of 30.
    const r3 = of(notAskedSlot);
    expect([r3.total, r3.bandKey]).toEqual([30, 'distinction']);
    expect(r3.profile.requests[2]).toMatchObject({ index: 2, asked: false, score: null });
    expect(r3.profile.criteria[0]).toMatchObject({ key: 'note_accuracy', marks: 40, maximum: 40 });
  });

  it('is idempotent: computing again changes nothing and keeps computed_at', async () => {
    const before = await t.db
      .getRepository(Result)
      .find({ where: { sittingId }, order: { slotId: 'ASC' } });
    const summary = await t.app.get(ResultsService).computeForSitting(sittingId);
    expect(summary).toMatchObject({ computed: 0, unchanged: 3, removed: 0 });
    expect(summary.skipped).toHaveLength(1);
    expect(summary.skipped[0]!.reason).toMatch(/never started|not submitted/);
    const after = await t.db
      .getRepository(Result)
      .find({ where: { sittingId }, order: { slotId: 'ASC' } });
    expect(after.map((r) => [r.id, r.computedAt.toISOString()])).toEqual(
      before.map((r) => [r.id, r.computedAt.toISOString()]),
    );
  });

  it('a slot recorded as withdrawn after closing loses its result', async () => {
    const single = slots.find((s) => !s.secondExaminerMembershipId && s.outcome === 'completed')!;
    const res = await t
      .http()
      .post(`/api/slots/${single.id}/outcome`)
      .set(auth(teacher))
      .send({ outcome: 'withdrawn', note: 'Withdrew on the day; entered in error.' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await t.db.getRepository(Result).countBy({ slotId: single.id })).toBe(0);
    expect(await t.db.getRepository(Result).countBy({ sittingId })).toBe(2);
  });

  it('writeSubmittedSheet refuses a mark over the maximum and the wrong examiner, writing nothing', async () => {
    const s = byPupil('KL1017');
    await expect(
      t.db.transaction((em) =>
        writeSubmittedSheet(em, {
          slot: s,
          examinerMembershipId: s.examinerMembershipId!,
          role: 'first',
          marks: (_r, c) => c.maxMark + 1,
          submittedAt: new Date(),
        }),
      ),
    ).rejects.toThrow(/not a whole number from 0 to/);
    await expect(
      t.db.transaction((em) =>
        writeSubmittedSheet(em, {
          slot: s,
          examinerMembershipId: s.examinerMembershipId!,
          role: 'second',
          marks: full,
          submittedAt: new Date(),
        }),
      ),
    ).rejects.toThrow(/not the second examiner/);
    expect(
      ((await t.db.query(`SELECT 1 FROM mark_sheets WHERE slot_id = $1`, [s.id])) as unknown[])
        .length,
    ).toBe(0);
  });
});
