import { isDeepStrictEqual } from 'node:util';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type EntityManager } from 'typeorm';
import {
  compareSheets,
  isCountedKind,
  MarkSheetError,
  notesPlayed,
  RESULT_RULE_VERSION,
  scoreMarkSheet,
  type BandPolicy,
  type CellValue,
  type Request,
  type ResultBasis,
  type ResultProfile,
  type ScoringCriterion,
  type SheetRequestInput,
  type SheetScore,
} from '@stavemark/shared';
import { now } from '../common/clock.js';
import { conflict, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { MarkCell } from '../marking/entities/mark-cell.entity.js';
import { ModerationCase } from '../moderation/entities/moderation-case.entity.js';
import { MarkSheet } from '../marking/entities/mark-sheet.entity.js';
import { SlotDraw } from '../marking/entities/slot-draw.entity.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { BandPolicyVersion } from '../sittings/entities/band-policy.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { Result } from './entities/result.entity.js';
import { refreshLatest } from './latest-results.js';
import { requestLabel } from './request-label.js';

/** The cells of one sheet by name, as the desk saved them. */
export type SheetCells = ReadonlyMap<string, CellValue>;

/** Marks to score a slot from, and what they are (design.md §4.5: single, first, agreed or third). */
export interface MarksSource {
  basis: ResultBasis;
  cells: SheetCells;
}

/** Why a completed slot has no result after computing (shown to whoever closed marking). */
export interface SkippedSlot {
  slotId: string;
  reason: string;
}

export interface ComputeSummary {
  sittingId: string;
  computed: number;
  unchanged: number;
  removed: number;
  skipped: SkippedSlot[];
}

export interface RubricFacts {
  criteria: (ScoringCriterion & { position: number })[];
}

/**
 * Results (issue 7 §1): one per completed slot, computed with the shared scoring functions from
 * the sitting's pinned list and band-policy versions and stored with the rule version, so a
 * stored result can always be recomputed from the marks.
 */
@Injectable()
export class ResultsService {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  /**
   * (Re)computes every completed slot's result of a sitting from its submitted sheets; absent,
   * withdrawn and incomplete slots (and completed ones without a submitted sheet to score) get
   * none, and a result they had is removed. Idempotent: a result whose figures did not change keeps
   * its computed_at. Runs in the caller's transaction when `em` is given. Called with a signed-in
   * caller, the sitting must be of their organisation; without one (seed, jobs), any sitting.
   */
  async computeForSitting(sittingId: string, em?: EntityManager): Promise<ComputeSummary> {
    if (!em) return this.db.transaction((tx) => this.computeForSitting(sittingId, tx));
    const org = RequestContext.caller()?.organisationId;
    const sitting = await em.findOne(Sitting, {
      where: org ? { id: sittingId, organisationId: org } : { id: sittingId },
    });
    if (!sitting) throw notFound('sitting');
    if (!sitting.bandPolicyId)
      throw conflict('This sitting is a draft: it has no pinned versions and no results.');
    const scope = <
      T extends
        Result | Slot | MarkSheet | MarkCell | SlotDraw | BandPolicyVersion | ModerationCase,
    >(
      target: new () => T,
      what: string,
    ) => new ScopedRepository<T>(em.getRepository(target), what, () => sitting.organisationId);

    const policyRow = await scope(BandPolicyVersion, 'band policy').getById(sitting.bandPolicyId);
    const policy: BandPolicy = {
      version: policyRow.version,
      bands: policyRow.bands,
      below: policyRow.below,
    };
    const slots = await scope(Slot, 'slot').find({
      where: { sittingId },
      relations: { paper: { listVersion: true } },
      order: { position: 'ASC' },
    });
    const slotIds = slots.map((s) => s.id);
    const [draws, sheets, existing] = slotIds.length
      ? await Promise.all([
          scope(SlotDraw, 'draw').find({ where: { slotId: In(slotIds) } }),
          scope(MarkSheet, 'mark sheet').find({
            where: { slotId: In(slotIds), status: 'submitted' },
          }),
          scope(Result, 'result').find({ where: { sittingId } }),
        ])
      : [[], [], await scope(Result, 'result').find({ where: { sittingId } })];
    const cells = sheets.length
      ? await scope(MarkCell, 'mark sheet cell').find({
          where: { sheetId: In(sheets.map((s) => s.id)) },
        })
      : [];
    const cellsOf = new Map<string, Map<string, CellValue>>();
    for (const c of cells) {
      const m = cellsOf.get(c.sheetId) ?? new Map<string, CellValue>();
      m.set(c.cell, c.value);
      cellsOf.set(c.sheetId, m);
    }
    const drawOf = new Map(draws.map((d) => [d.slotId, d]));
    const rubrics = await this.loadRubrics(
      em,
      draws.flatMap((d) => d.requests.map((r) => r.rubricVersionId)),
    );
    const existingOf = new Map(existing.map((r) => [r.slotId, r]));
    const cases = scope(ModerationCase, 'moderation case');
    const caseOf = new Map((await cases.find({ where: { sittingId } })).map((c) => [c.slotId, c]));
    const summary: ComputeSummary = {
      sittingId,
      computed: 0,
      unchanged: 0,
      removed: 0,
      skipped: [],
    };
    const keep = new Set<string>();
    const repo = scope(Result, 'result');
    const touched: string[] = [];

    for (const slot of slots) {
      if (slot.outcome !== 'completed') continue;
      const draw = drawOf.get(slot.id);
      const submitted = sheets.filter((s) => s.slotId === slot.id);
      if (!draw) {
        summary.skipped.push({ slotId: slot.id, reason: 'No draw: the slot was never started.' });
        continue;
      }
      const totalMarks = slot.paper!.listVersion!.totalMarks;
      const moderation = await this.moderate(em, cases, slot, submitted, caseOf.get(slot.id), {
        requests: draw.requests,
        cellsOf,
        rubrics,
        totalMarks,
        policy,
      });
      const source = moderation ?? defaultSource(slot, submitted, cellsOf);
      if (!source) {
        summary.skipped.push({ slotId: slot.id, reason: 'The first examiner has not submitted.' });
        continue;
      }
      let figures: Omit<ResultFigures, 'basis'>;
      try {
        figures = score(draw.requests, source.cells, rubrics, totalMarks, policy);
      } catch (e) {
        if (!(e instanceof MarkSheetError)) throw e;
        summary.skipped.push({ slotId: slot.id, reason: e.message });
        continue;
      }
      keep.add(slot.id);
      const values = {
        sittingId,
        slotId: slot.id,
        studentId: slot.studentId,
        listVersionId: slot.paper!.listVersionId,
        bandPolicyVersionId: policyRow.id,
        ruleVersion: RESULT_RULE_VERSION,
        basis: source.basis,
        ...figures,
      };
      const prior = existingOf.get(slot.id);
      if (prior && sameFigures(prior, values)) {
        summary.unchanged++;
        continue;
      }
      const row =
        prior ?? repo.create({ releasedAt: null, releasedByPersonId: null, teacherNote: null });
      // A result moved to another student (slot reassigned) leaves the former one's row to rebuild.
      if (prior && prior.studentId !== values.studentId) touched.push(prior.studentId);
      Object.assign(row, values, { computedAt: now() });
      await repo.save(row);
      summary.computed++;
      touched.push(row.studentId);
    }
    const stale = existing.filter((r) => !keep.has(r.slotId));
    if (stale.length) {
      await em.delete(Result, {
        id: In(stale.map((r) => r.id)),
        organisationId: sitting.organisationId,
      });
      summary.removed = stale.length;
      touched.push(...stale.map((r) => r.studentId));
    }
    // The progress percentile's table of latest results, in this same transaction.
    await refreshLatest(em, sitting.organisationId, touched);
    return summary;
  }

  /**
   * Flags for a double-marked pair (design.md §4.5) and the marks its result comes from: agreed
   * marks, or the third marker's sheet once submitted; null to use the first examiner's sheet. A
   * pair outside tolerance opens a case; an open case whose pair is now within tolerance (after a
   * correction) closes again. A submitted third sheet resolves a case waiting for it.
   */
  private async moderate(
    em: EntityManager,
    cases: ScopedRepository<ModerationCase>,
    slot: Slot,
    submitted: MarkSheet[],
    existing: ModerationCase | undefined,
    facts: {
      requests: Request[];
      cellsOf: Map<string, Map<string, CellValue>>;
      rubrics: Map<string, RubricFacts>;
      totalMarks: number;
      policy: BandPolicy;
    },
  ): Promise<MarksSource | null> {
    const first = submitted.find((s) => s.role === 'first');
    const second = submitted.find((s) => s.role === 'second');
    const third = submitted.find((s) => s.role === 'third');
    let c = existing ?? null;
    if (slot.secondExaminerMembershipId && first && second && (!c || c.status === 'open')) {
      const sheetOf = (s: MarkSheet) =>
        scoreCells(
          facts.requests,
          facts.cellsOf.get(s.id) ?? new Map(),
          facts.rubrics,
          facts.totalMarks,
          facts.policy,
        );
      let comparison = null;
      try {
        comparison = compareSheets(sheetOf(first), sheetOf(second));
      } catch (e) {
        if (!(e instanceof MarkSheetError)) throw e;
      }
      if (comparison?.flagged) {
        c ??= cases.create({
          sittingId: slot.sittingId,
          slotId: slot.id,
          status: 'open',
          agreedMarks: null,
          agreedByPersonId: null,
          agreedAt: null,
          agreedReason: null,
          thirdExaminerMembershipId: null,
          sentToThirdByPersonId: null,
          sentToThirdAt: null,
          resolvedAt: null,
        });
        c.comparison = comparison;
        c = await cases.save(c);
      } else if (comparison && c) {
        await em.delete(ModerationCase, { id: c.id, organisationId: c.organisationId });
        c = null;
      }
    }
    if (!c) return null;
    if (c.status === 'third_marking' && third) {
      c.status = 'third';
      c.resolvedAt = now();
      await cases.save(c);
    }
    if (c.status === 'agreed' && c.agreedMarks) {
      const cells = new Map<string, CellValue>(Object.entries(c.agreedMarks.marks));
      for (const i of c.agreedMarks.notAsked) cells.set(`asked:${i}`, false);
      // Flags and comments stay the first examiner's: agreement is about marks.
      for (const [k, v] of facts.cellsOf.get(first?.id ?? '') ?? [])
        if (!k.startsWith('mark:') && !k.startsWith('asked:')) cells.set(k, v);
      return { basis: 'agreed', cells };
    }
    if (c.status === 'third' && third)
      return { basis: 'third', cells: facts.cellsOf.get(third.id) ?? new Map() };
    return null;
  }

  /** Criteria of the given rubric versions (pinned and immutable once published). */
  async loadRubrics(em: EntityManager, ids: string[]): Promise<Map<string, RubricFacts>> {
    const unique = [...new Set(ids)];
    if (!unique.length) return new Map();
    // Rubric versions are pinned and immutable once published; read by id (already scoped via the draw).
    const rows = await em
      .getRepository(RubricVersion)
      .find({ where: { id: In(unique) }, relations: { criteria: true } });
    return new Map(
      rows.map((r) => [
        r.id,
        {
          criteria: [...(r.criteria ?? [])]
            .sort((a, b) => a.position - b.position)
            .map((c) => ({
              key: c.key,
              label: c.label,
              weight: Number(c.weight),
              maxMark: c.maxMark,
              position: c.position,
            })),
        },
      ]),
    );
  }
}

/** The first examiner's submitted sheet: 'single' when the slot is not double-marked. */
function defaultSource(
  slot: Slot,
  submitted: MarkSheet[],
  cellsOf: Map<string, Map<string, CellValue>>,
): MarksSource | null {
  const first = submitted.find((s) => s.role === 'first');
  if (!first) return null;
  return {
    basis: slot.secondExaminerMembershipId ? 'first' : 'single',
    cells: cellsOf.get(first.id) ?? new Map(),
  };
}

export interface ResultFigures {
  basis: ResultBasis;
  total: number;
  outOf: number;
  percentage: number;
  bandKey: string;
  bandLabel: string;
  profile: ResultProfile;
  slips: number;
  notesPlayed: number | null;
}

/** The sheet's cells as the shared scorer's input: one entry per drawn request. */
export function sheetInput(
  requests: readonly Request[],
  cells: SheetCells,
  rubrics: ReadonlyMap<string, RubricFacts>,
): SheetRequestInput[] {
  return requests.map((r) => {
    const criteria = rubrics.get(r.rubricVersionId)?.criteria ?? [];
    const marks: Record<string, number | null> = {};
    for (const c of criteria) {
      const v = cells.get(`mark:${r.index}:${c.key}`);
      marks[c.key] = typeof v === 'number' ? v : null;
    }
    return {
      key: String(r.index),
      asked: cells.get(`asked:${r.index}`) !== false,
      difficultyWeight: r.difficultyWeight,
      criteria,
      marks,
    };
  });
}

/** The shared scorer's full answer for one set of marks (design.md §4.1). Throws MarkSheetError. */
export function scoreCells(
  requests: readonly Request[],
  cells: SheetCells,
  rubrics: ReadonlyMap<string, RubricFacts>,
  totalMarks: number,
  policy: BandPolicy,
): Extract<SheetScore, { status: 'scored' }> {
  const s = scoreMarkSheet({
    outcome: 'completed',
    totalMarks,
    requests: sheetInput(requests, cells, rubrics),
    policy,
  });
  if (s.status !== 'scored') throw new Error('A completed slot always scores.');
  return s;
}

/** Scores one set of marks with the shared functions (design.md §4.1). Throws MarkSheetError. */
export function score(
  requests: readonly Request[],
  cells: SheetCells,
  rubrics: ReadonlyMap<string, RubricFacts>,
  totalMarks: number,
  policy: BandPolicy,
): Omit<ResultFigures, 'basis'> {
  const input = sheetInput(requests, cells, rubrics);
  const s = scoreCells(requests, cells, rubrics, totalMarks, policy);
  const scoreOf = new Map(s.requests.map((r) => [r.key, r.score]));
  let slips = 0;
  let notes = 0;
  let counted = false;
  const requestsProfile = requests.map((r, i) => {
    const asked = input[i]!.asked;
    const flag = cells.get(`flag:${r.index}:slip`);
    const reqSlips = asked && typeof flag === 'number' ? flag : 0;
    const reqNotes = asked && isCountedKind(r.kind) ? notesPlayed(r) : null;
    slips += reqSlips;
    if (reqNotes !== null) {
      notes += reqNotes;
      counted = true;
    }
    return {
      index: r.index,
      label: requestLabel(r),
      asked,
      score: asked ? (scoreOf.get(String(r.index)) ?? null) : null,
      slips: reqSlips,
      notesPlayed: reqNotes,
    };
  });
  return {
    total: s.total,
    outOf: totalMarks,
    percentage: s.percentage,
    bandKey: s.band.key,
    bandLabel: s.band.label,
    profile: {
      requests: requestsProfile,
      criteria: s.profile.map((p) => ({
        key: p.key,
        label: p.label,
        fraction: p.fraction,
        marks: p.marks,
        maximum: p.maximum,
      })),
    },
    slips,
    notesPlayed: counted ? notes : null,
  };
}

function sameFigures(
  a: Result,
  b: ResultFigures &
    Pick<Result, 'studentId' | 'listVersionId' | 'bandPolicyVersionId' | 'ruleVersion'>,
): boolean {
  return (
    a.basis === b.basis &&
    a.total === b.total &&
    a.outOf === b.outOf &&
    a.percentage === b.percentage &&
    a.bandKey === b.bandKey &&
    a.bandLabel === b.bandLabel &&
    a.slips === b.slips &&
    a.notesPlayed === b.notesPlayed &&
    a.studentId === b.studentId &&
    a.listVersionId === b.listVersionId &&
    a.bandPolicyVersionId === b.bandPolicyVersionId &&
    a.ruleVersion === b.ruleVersion &&
    // jsonb keeps its own key order, so compare by value, not by text.
    isDeepStrictEqual(a.profile, b.profile)
  );
}
