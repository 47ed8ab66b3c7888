// Seed and test helper: writes a submitted mark sheet straight into the tables the marking desk
// fills, so a demo year of marks (or a test fixture) goes through the same scoring as real marking.
import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { Not } from 'typeorm';
import { drawRequests, type CellValue, type Request, type SlotOutcome } from '@stavemark/shared';
import { bulkInsert } from '../common/bulk-sql.js';
import { toLineView } from '../requirement-lists/requirement-lists.mapper.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { AccessArrangement } from '../sittings/entities/access-arrangement.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { MarkSheet } from './entities/mark-sheet.entity.js';
import { SlotDraw } from './entities/slot-draw.entity.js';

export interface SeedCriterion {
  key: string;
  label: string;
  maxMark: number;
}

export interface WriteSubmittedSheetInput {
  /** The slot (or its id); its sitting must be scheduled or later. */
  slot: Slot | string;
  examinerMembershipId: string;
  /** first / second must match the slot's examiners; third is any other examiner. */
  role: 'first' | 'second' | 'third';
  /**
   * A mark per request × criterion: a function of the drawn request and the criterion (return
   * null to leave a mark out), or cells by name ("mark:0:accuracy": 4).
   */
  marks: ((request: Request, criterion: SeedCriterion) => number | null) | Record<string, number>;
  /** Quick flag counts by cell name ("flag:0:slip": 2). */
  flags?: Record<string, number>;
  /** Comments by request index or "overall". */
  comments?: Record<string, string>;
  /** Requests not asked, by index. */
  notAsked?: number[];
  /** Default completed; the first examiner's outcome becomes the slot's when it has none. */
  outcome?: SlotOutcome;
  submittedAt: Date;
  /** Seed of the slot's draw when the slot has none yet (default: derived from the slot id). */
  drawSeed?: string;
}

/**
 * Writes one examiner's submitted sheet for a slot, drawing the slot's requests first when it has
 * no draw (seeded, replayable like the desk's draw). Writing the same examiner's sheet again
 * replaces its cells, so a seed can run twice. Returns the sheet and the draw's requests.
 * Marks are checked against each criterion's maximum; a bad mark throws before anything is written.
 */
export async function writeSubmittedSheet(
  em: EntityManager,
  input: WriteSubmittedSheetInput,
): Promise<{ sheet: MarkSheet; requests: Request[] }> {
  const slotId = typeof input.slot === 'string' ? input.slot : input.slot.id;
  const slot = await em.findOneOrFail(Slot, { where: { id: slotId }, relations: { paper: true } });
  const me = input.examinerMembershipId;
  if (input.role === 'first' && slot.examinerMembershipId !== me)
    throw new Error(`writeSubmittedSheet: ${me} is not the first examiner of slot ${slot.id}.`);
  if (input.role === 'second' && slot.secondExaminerMembershipId !== me)
    throw new Error(`writeSubmittedSheet: ${me} is not the second examiner of slot ${slot.id}.`);
  if (
    input.role === 'third' &&
    (slot.examinerMembershipId === me || slot.secondExaminerMembershipId === me)
  )
    throw new Error('writeSubmittedSheet: a third marker is neither of the slot’s own examiners.');

  const draw =
    (await em.findOne(SlotDraw, { where: { slotId } })) ??
    (await drawFor(em, slot, input.drawSeed));
  const rubricIds = [...new Set(draw.requests.map((r) => r.rubricVersionId))];
  const rubrics = await em.find(RubricVersion, {
    where: rubricIds.map((id) => ({ id })),
    relations: { criteria: true },
  });
  const criteriaOf = new Map(
    rubrics.map((r) => [r.id, [...(r.criteria ?? [])].sort((a, b) => a.position - b.position)]),
  );

  const cells = new Map<string, CellValue>();
  const outcome = input.outcome ?? 'completed';
  const notAsked = new Set(input.notAsked ?? []);
  for (const r of draw.requests) {
    if (notAsked.has(r.index)) {
      cells.set(`asked:${r.index}`, false);
      continue;
    }
    if (outcome === 'absent' || outcome === 'withdrawn') continue;
    for (const c of criteriaOf.get(r.rubricVersionId) ?? []) {
      const cell = `mark:${r.index}:${c.key}`;
      const v =
        typeof input.marks === 'function'
          ? input.marks(r, { key: c.key, label: c.label, maxMark: c.maxMark })
          : input.marks[cell];
      if (v === null || v === undefined) continue;
      if (!Number.isInteger(v) || v < 0 || v > c.maxMark)
        throw new Error(
          `writeSubmittedSheet: ${cell} = ${v} is not a whole number from 0 to ${c.maxMark}.`,
        );
      cells.set(cell, v);
    }
  }
  for (const [cell, v] of Object.entries(input.flags ?? {})) {
    if (
      !/^flag:\d{1,2}:(slip|restart|stopped|prompted)$/.test(cell) ||
      !Number.isInteger(v) ||
      v < 0
    )
      throw new Error(`writeSubmittedSheet: bad flag ${cell} = ${v}.`);
    cells.set(cell, v);
  }
  for (const [where, text] of Object.entries(input.comments ?? {}))
    cells.set(`comment:${where}`, text);
  cells.set('outcome', outcome);

  let sheet = await em.findOne(MarkSheet, { where: { slotId, examinerMembershipId: me } });
  if (sheet) {
    sheet.role = input.role;
    sheet.status = 'submitted';
    sheet.submittedAt = input.submittedAt;
    await em.save(sheet);
    await em.query(`DELETE FROM mark_cells WHERE sheet_id = $1`, [sheet.id]);
  } else {
    sheet = await em.save(
      em.create(MarkSheet, {
        organisationId: slot.organisationId,
        slotId,
        examinerMembershipId: me,
        role: input.role,
        status: 'submitted',
        startedAt: slot.startsAt,
        submittedAt: input.submittedAt,
      }),
    );
  }
  await bulkInsert(
    em,
    'mark_cells',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'sheet_id', type: 'uuid' },
      { name: 'cell', type: 'text' },
      { name: 'value', type: 'jsonb' },
      { name: 'version', type: 'integer' },
      { name: 'last_change_id', type: 'uuid' },
      { name: 'updated_at', type: 'timestamptz' },
    ],
    [...cells].map(([cell, value]) => [
      slot.organisationId,
      sheet.id,
      cell,
      value,
      1,
      randomUUID(),
      input.submittedAt,
    ]),
  );
  if (input.role === 'first' && !slot.outcome) {
    await em.update(Slot, { id: slot.id }, { outcome, outcomeRecordedAt: input.submittedAt });
  }
  return { sheet, requests: draw.requests };
}

async function drawFor(em: EntityManager, slot: Slot, seed?: string): Promise<SlotDraw> {
  const version = await em.findOneOrFail(RequirementListVersion, {
    where: { id: slot.paper!.listVersionId },
    relations: { lines: { rubricVersion: true } },
  });
  const lines = [...(version.lines ?? [])].sort((a, b) => a.position - b.position).map(toLineView);
  const arrangement = await em.findOne(AccessArrangement, { where: { studentId: slot.studentId } });
  const last = await em.findOne(SlotDraw, {
    where: { studentId: slot.studentId, slotId: Not(slot.id) },
    order: { drawnAt: 'DESC' },
  });
  const s = seed ?? slot.id.replace(/-/g, '').slice(0, 16);
  const result = drawRequests({ lines }, version.selectionRule, s, {
    previous: last?.requests ?? [],
    substitutions: arrangement?.substitutions ?? [],
  });
  return em.save(
    em.create(SlotDraw, {
      organisationId: slot.organisationId,
      slotId: slot.id,
      studentId: slot.studentId,
      seed: s,
      algorithm: result.algorithm,
      drawn: result.requests,
      requests: result.requests,
      changes: [],
      repeatsOfPrevious: result.repeatsOfPrevious,
      drawnByPersonId: null,
      drawnAt: slot.startsAt,
    }),
  );
}
