// Loads the double-marked slots of some sittings and scores both sheets with the shared scoring
// functions (design.md §4.1), so the report compares what results would show. Only completed slots
// whose two sheets are submitted (and record the candidate as completed) take part.
import { In, type EntityManager, type ObjectLiteral } from 'typeorm';
import { bandOrder, DEFAULT_BAND_POLICY, MarkSheetError, scoreMarkSheet, type BandPolicy, type CellValue } from '@stavemark/shared';
import type { OrgOwned } from '../common/org-owned.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { MarkCell } from '../marking/entities/mark-cell.entity.js';
import { MarkSheet } from '../marking/entities/mark-sheet.entity.js';
import { SlotDraw } from '../marking/entities/slot-draw.entity.js';
import { sheetInput } from '../results/results.service.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import type { ScoredPair } from './agreement-report.js';

export interface LoadedPairs {
  pairs: ScoredPair[];
  doubleMarkedSlots: number;
  notCompleted: number;
  notSubmitted: number;
  bandLevels: number;
}

// Scoped to the caller's organisation like every other read (common/scoped-repository.ts).
const repo = <T extends OrgOwned & ObjectLiteral>(em: EntityManager, entity: new () => T, what: string) =>
  new ScopedRepository<T>(em.getRepository(entity), what);

export async function loadScoredPairs(em: EntityManager, sittings: readonly Sitting[]): Promise<LoadedPairs> {
  const empty: LoadedPairs = { pairs: [], doubleMarkedSlots: 0, notCompleted: 0, notSubmitted: 0, bandLevels: 4 };
  if (sittings.length === 0) return empty;
  const slots = (
    await repo(em, Slot, 'slot').find({
      where: { sittingId: In(sittings.map((s) => s.id)) },
      relations: { paper: { listVersion: true } },
      order: { startsAt: 'ASC' },
    })
  ).filter((s) => s.secondExaminerMembershipId !== null);
  if (slots.length === 0) return empty;
  const slotIds = slots.map((s) => s.id);
  // One after the other: queries on one transaction's connection cannot overlap.
  const sheets = await repo(em, MarkSheet, 'mark sheet').find({
    where: { slotId: In(slotIds) },
    relations: { examiner: { person: true } },
  });
  const draws = await repo(em, SlotDraw, 'draw').find({ where: { slotId: In(slotIds) } });
  const submitted = sheets.filter((s) => s.status === 'submitted');
  const cells = submitted.length
    ? await repo(em, MarkCell, 'mark cell').find({ where: { sheetId: In(submitted.map((s) => s.id)) } })
    : [];
  const rubricIds = [...new Set(draws.flatMap((d) => d.requests.map((r) => r.rubricVersionId)))];
  const rubrics = rubricIds.length
    ? await repo(em, RubricVersion, 'rubric version').find({ where: { id: In(rubricIds) }, relations: { criteria: true } })
    : [];
  const rubricFacts = new Map(
    rubrics.map((r) => [
      r.id,
      {
        criteria: [...(r.criteria ?? [])]
          .sort((a, b) => a.position - b.position)
          .map((c) => ({ key: c.key, label: c.label, weight: Number(c.weight), maxMark: c.maxMark, position: c.position })),
      },
    ]),
  );
  const policyIds = [...new Set(sittings.map((s) => s.bandPolicyId).filter((id): id is string => id !== null))];
  const policies = policyIds.length
    ? ((await em.query(`SELECT id, bands, below FROM band_policies WHERE id = ANY($1::uuid[])`, [policyIds])) as {
        id: string;
        bands: BandPolicy['bands'];
        below: BandPolicy['below'];
      }[])
    : [];
  const policyOf = new Map(policies.map((p) => [p.id, { bands: p.bands, below: p.below } as BandPolicy]));
  const sittingOf = new Map(sittings.map((s) => [s.id, s]));
  const cellsOf = new Map<string, Map<string, CellValue>>();
  for (const c of cells) {
    const m = cellsOf.get(c.sheetId) ?? new Map<string, CellValue>();
    m.set(c.cell, c.value);
    cellsOf.set(c.sheetId, m);
  }

  const out: LoadedPairs = { ...empty, doubleMarkedSlots: slots.length, bandLevels: 0 };
  for (const slot of slots) {
    if (slot.outcome !== null && slot.outcome !== 'completed') {
      out.notCompleted++;
      continue;
    }
    const first = sheets.find((s) => s.slotId === slot.id && s.examinerMembershipId === slot.examinerMembershipId);
    const second = sheets.find((s) => s.slotId === slot.id && s.examinerMembershipId === slot.secondExaminerMembershipId);
    const draw = draws.find((d) => d.slotId === slot.id);
    if (!first || !second || first.status !== 'submitted' || second.status !== 'submitted' || !draw) {
      out.notSubmitted++;
      continue;
    }
    const v1 = cellsOf.get(first.id) ?? new Map();
    const v2 = cellsOf.get(second.id) ?? new Map();
    // Either examiner recording the candidate as not completed keeps the slot out (design.md §4.1).
    if (v1.get('outcome') !== 'completed' || v2.get('outcome') !== 'completed') {
      out.notCompleted++;
      continue;
    }
    const sitting = sittingOf.get(slot.sittingId)!;
    const policy = (sitting.bandPolicyId && policyOf.get(sitting.bandPolicyId)) || undefined;
    const order = policy ? bandOrder(policy) : null;
    out.bandLevels = Math.max(out.bandLevels, order?.length ?? 4);
    // The same sheet reading as results (results.service.ts sheetInput) and the shared scorer, so
    // the report compares the totals results show.
    const totalMarks = slot.paper!.listVersion!.totalMarks;
    const scoreOf = (values: Map<string, CellValue>) => {
      const s = scoreMarkSheet({ outcome: 'completed', totalMarks, requests: sheetInput(draw.requests, values, rubricFacts), policy: policy ?? DEFAULT_BAND_POLICY });
      if (s.status !== 'scored') throw new Error('A completed slot always scores.');
      return { percentage: s.percentage, bandKey: s.band.key };
    };
    let s1: ReturnType<typeof scoreOf>;
    let s2: ReturnType<typeof scoreOf>;
    try {
      s1 = scoreOf(v1);
      s2 = scoreOf(v2);
    } catch (e) {
      // A submitted sheet that cannot be scored (a mark cleared by a correction) counts as not in.
      if (e instanceof MarkSheetError) {
        out.notSubmitted++;
        continue;
      }
      throw e;
    }
    const rank = (key: string) => (order ?? bandOrder(DEFAULT_BAND_POLICY)).indexOf(key);
    const ref = (s: MarkSheet) => ({ id: s.examinerMembershipId, name: s.examiner?.person?.displayName ?? 'Examiner' });
    out.pairs.push({
      slotId: slot.id,
      first: { examiner: ref(first), percent: s1.percentage, bandRank: rank(s1.bandKey) },
      second: { examiner: ref(second), percent: s2.percentage, bandRank: rank(s2.bandKey) },
    });
  }
  if (out.bandLevels === 0) out.bandLevels = 4;
  return out;
}
