import { randomBytes } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Not, Repository, type EntityManager } from 'typeorm';
import {
  DrawError,
  drawRequests,
  isCountedKind,
  normaliseKeyName,
  parseCell,
  type CellValue,
  type ChangeRequestInput,
  type CorrectCellInput,
  type DeskRequest,
  type DeskView,
  type MarkingSittingSummary,
  type Request,
  type SaveCellInput,
  type SaveResult,
  type SlotOutcome,
  type SubmitSheetInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { localDate, now } from '../common/clock.js';
import { conflict, DomainError, ErrorCode, invalid, notFound } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { StudentFingering } from '../fingerings/entities/student-fingering.entity.js';
import { toFingeringView } from '../fingerings/fingerings.mapper.js';
import { ModerationCase } from '../moderation/entities/moderation-case.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { toLineView } from '../requirement-lists/requirement-lists.mapper.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { toCriterion } from '../rubrics/rubrics.mapper.js';
import { AccessArrangement } from '../sittings/entities/access-arrangement.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SittingsService } from '../sittings/sittings.service.js';
import { ResultsService } from '../results/results.service.js';
import { Person } from '../users/entities/person.entity.js';
import { MarkCell } from './entities/mark-cell.entity.js';
import { MarkChange } from './entities/mark-change.entity.js';
import { MarkSheet } from './entities/mark-sheet.entity.js';
import { SlotDraw, type RequestChange } from './entities/slot-draw.entity.js';
import { toSheetView } from './marking.mapper.js';
import { preparedQuery } from '../common/prepared-query.js';

/** A conflict on one cell: answered 409 with both values, after the change is recorded. */
export class CellConflict extends DomainError {
  constructor(readonly result: Extract<SaveResult, { status: 'conflict' }>) {
    super(
      ErrorCode.Conflict,
      'This cell was changed elsewhere since you last saw it: choose which value to keep.',
      { kind: 'cell_conflict', ...result },
    );
  }
}

interface SlotFacts {
  slot: Slot;
  role: 'first' | 'second' | 'third';
}

const TENSION = /tension|freedom/i;

/**
 * The marking desk (issue 6; design.md §4.4, §7): the draw, the examiner's own mark sheet saved
 * cell by cell, submit and corrections, and blind second marking. Slots are reached only by
 * their examiners: any other caller finds no slot (404).
 */
@Injectable()
export class MarkingService {
  private readonly slots: ScopedRepository<Slot>;
  private readonly draws: ScopedRepository<SlotDraw>;
  private readonly sheets: ScopedRepository<MarkSheet>;
  private readonly cells: ScopedRepository<MarkCell>;
  private readonly arrangements: ScopedRepository<AccessArrangement>;
  private readonly fingerings: ScopedRepository<StudentFingering>;
  private readonly rubricVersions: ScopedRepository<RubricVersion>;

  constructor(
    @InjectRepository(Slot) slotRepo: Repository<Slot>,
    @InjectRepository(SlotDraw) drawRepo: Repository<SlotDraw>,
    @InjectRepository(MarkSheet) sheetRepo: Repository<MarkSheet>,
    @InjectRepository(MarkCell) cellRepo: Repository<MarkCell>,
    @InjectRepository(AccessArrangement) arrangementRepo: Repository<AccessArrangement>,
    @InjectRepository(StudentFingering) fingeringRepo: Repository<StudentFingering>,
    @InjectRepository(RubricVersion) rubricRepo: Repository<RubricVersion>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly sittings: SittingsService,
    private readonly results: ResultsService,
  ) {
    this.slots = new ScopedRepository(slotRepo, 'slot');
    this.draws = new ScopedRepository(drawRepo, 'draw');
    this.sheets = new ScopedRepository(sheetRepo, 'mark sheet');
    this.cells = new ScopedRepository(cellRepo, 'mark sheet cell');
    this.arrangements = new ScopedRepository(arrangementRepo, 'access arrangement');
    this.fingerings = new ScopedRepository(fingeringRepo, 'fingering');
    this.rubricVersions = new ScopedRepository(rubricRepo, 'rubric version');
  }

  // ---------- access ----------

  /** A slot the caller marks (first or second examiner) in a sitting past its draft, or 404. */
  private async markedSlot(em: EntityManager, slotId: string): Promise<SlotFacts> {
    const caller = RequestContext.requireCaller();
    const slot = await this.slots.withManager(em).getOne({
      where: { id: slotId },
      relations: {
        sitting: true,
        student: true,
        paper: { listVersion: { lines: { rubricVersion: true } } },
      },
    });
    const me = caller.membershipId;
    let role: SlotFacts['role'] | null =
      slot.examinerMembershipId === me
        ? 'first'
        : slot.secondExaminerMembershipId === me
          ? 'second'
          : null;
    // A third marker: a flagged pair moderation handed to the caller (design.md §4.5).
    if (!role) {
      const third = (await em.query(
        `SELECT 1 FROM moderation_cases WHERE slot_id = $1 AND organisation_id = $2 AND third_examiner_membership_id = $3 AND status IN ('third_marking', 'third')`,
        [slot.id, slot.organisationId, me],
      )) as unknown[];
      if (third.length) role = 'third';
    }
    if (!role || !caller.roles.includes('examiner') || slot.sitting!.status === 'draft')
      throw notFound('slot');
    return { slot, role };
  }

  /** The caller's own sheet, locked for share (saves run side by side; submit takes it exclusively). */
  private async ownSheet(
    em: EntityManager,
    sheetId: string,
    lock: 'pessimistic_read' | 'pessimistic_write',
  ): Promise<MarkSheet> {
    const caller = RequestContext.requireCaller();
    const sheet = await this.sheets
      .withManager(em)
      .getOne({ where: { id: sheetId }, lock: { mode: lock } });
    if (sheet.examinerMembershipId !== caller.membershipId || !caller.roles.includes('examiner'))
      throw notFound('mark sheet');
    return sheet;
  }

  // ---------- today's marking ----------

  async myMarking(): Promise<MarkingSittingSummary[]> {
    const caller = RequestContext.requireCaller();
    const org = await this.db
      .getRepository(Organisation)
      .findOneByOrFail({ id: caller.organisationId });
    const today = localDate(now(), org.timeZone);
    const slots = await this.slots
      .qb('x')
      .innerJoinAndSelect('x.sitting', 's')
      .innerJoinAndSelect('x.student', 'st')
      .innerJoinAndSelect('x.paper', 'p')
      .innerJoinAndSelect('p.listVersion', 'lv')
      .andWhere('s.date = :today', { today })
      .andWhere(`s.status IN ('scheduled', 'in_progress', 'marking_closed')`)
      .andWhere('(x.examinerMembershipId = :me OR x.secondExaminerMembershipId = :me)', {
        me: caller.membershipId,
      })
      .orderBy('s.startsAt', 'ASC')
      .addOrderBy('x.position', 'ASC')
      .getMany();
    // Third marking waits on any day until it is submitted (a flagged pair handed to the caller).
    const third = await this.slots
      .qb('x')
      .innerJoinAndSelect('x.sitting', 's')
      .innerJoinAndSelect('x.student', 'st')
      .innerJoinAndSelect('x.paper', 'p')
      .innerJoinAndSelect('p.listVersion', 'lv')
      .innerJoin(
        ModerationCase,
        'mc',
        `mc.slotId = x.id AND mc.thirdExaminerMembershipId = :me AND mc.status = 'third_marking'`,
        { me: caller.membershipId },
      )
      .andWhere(`s.status = 'marking_closed'`)
      .orderBy('s.startsAt', 'ASC')
      .addOrderBy('x.position', 'ASC')
      .getMany();
    for (const x of third) if (!slots.some((y) => y.id === x.id)) slots.push(x);
    const sheets = slots.length
      ? await this.sheets.find({
          where: { slotId: In(slots.map((s) => s.id)), examinerMembershipId: caller.membershipId },
        })
      : [];
    const sheetOf = new Map(sheets.map((s) => [s.slotId, s]));
    const out = new Map<string, MarkingSittingSummary>();
    for (const x of slots) {
      const s = x.sitting!;
      const entry = out.get(s.id) ?? {
        id: s.id,
        title: s.title,
        date: s.date,
        room: s.room,
        status: s.status,
        slots: [],
      };
      entry.slots.push({
        id: x.id,
        position: x.position,
        startTime: clock(x.startsAt, s.timeZone),
        endTime: clock(x.endsAt, s.timeZone),
        candidate: `${x.student!.givenName} ${x.student!.familyName}`,
        listName: x.paper!.listVersion!.name,
        role:
          x.examinerMembershipId === caller.membershipId
            ? 'first'
            : x.secondExaminerMembershipId === caller.membershipId
              ? 'second'
              : 'third',
        outcome: x.outcome,
        sheetStatus: sheetOf.get(x.id)?.status ?? null,
      });
      out.set(s.id, entry);
    }
    return [...out.values()];
  }

  // ---------- the draw and the desk ----------

  desk(slotId: string): Promise<DeskView> {
    return this.db.transaction(async (em) => this.deskView(em, await this.markedSlot(em, slotId)));
  }

  /** Starts the slot for the caller: draws once per slot (seeded, audited) and opens their sheet. */
  async start(slotId: string): Promise<DeskView> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const facts = await this.markedSlot(em, slotId);
      const { slot } = facts;
      // A third marker marks after marking closed; everyone else while the sitting runs.
      if (facts.role === 'third') {
        if (slot.sitting!.status !== 'marking_closed')
          throw conflict('Third marking happens while the sitting is in moderation (marking closed).');
      } else if (slot.sitting!.status !== 'in_progress') {
        throw conflict(
          slot.sitting!.status === 'scheduled'
            ? 'Start the sitting first: it is still scheduled.'
            : 'Marking of this sitting is closed.',
        );
      }
      // One draw per slot even when both examiners press start at once.
      await em.query(`SELECT id FROM slots WHERE id = $1 FOR UPDATE`, [slot.id]);
      let draw = await this.draws.withManager(em).findOne({ where: { slotId } });
      if (!draw) draw = await this.makeDraw(em, slot);
      const sheets = this.sheets.withManager(em);
      if (
        !(await sheets.findOne({ where: { slotId, examinerMembershipId: caller.membershipId } }))
      ) {
        const sheet = await sheets.save(
          sheets.create({
            slotId,
            examinerMembershipId: caller.membershipId,
            role: facts.role,
            status: 'draft',
            submittedAt: null,
          }),
        );
        await this.audit.record(
          {
            action: 'mark_sheet.started',
            entity: 'mark_sheet',
            entityId: sheet.id,
            after: { slotId, role: facts.role },
          },
          em,
        );
      }
      return this.deskView(em, facts);
    });
  }

  private async makeDraw(em: EntityManager, slot: Slot): Promise<SlotDraw> {
    const caller = RequestContext.requireCaller();
    const version = slot.paper!.listVersion!;
    const lines = [...(version.lines ?? [])]
      .sort((a, b) => a.position - b.position)
      .map(toLineView);
    const arrangement = await this.arrangements
      .withManager(em)
      .findOne({ where: { studentId: slot.studentId } });
    const last = await this.draws.withManager(em).findOne({
      where: { studentId: slot.studentId, slotId: Not(slot.id) },
      order: { drawnAt: 'DESC' },
    });
    const seed = randomBytes(8).toString('hex');
    let result;
    try {
      result = drawRequests({ lines }, version.selectionRule, seed, {
        previous: last?.requests ?? [],
        substitutions: arrangement?.substitutions ?? [],
      });
    } catch (e) {
      if (e instanceof DrawError) throw invalid(`The draw could not be made: ${e.message}`);
      throw e;
    }
    const repo = this.draws.withManager(em);
    const draw = await repo.save(
      repo.create({
        slotId: slot.id,
        studentId: slot.studentId,
        seed,
        algorithm: result.algorithm,
        drawn: result.requests,
        requests: result.requests,
        changes: [],
        repeatsOfPrevious: result.repeatsOfPrevious,
        drawnByPersonId: caller.personId,
      }),
    );
    await this.audit.record(
      {
        action: 'slot.drawn',
        entity: 'slot',
        entityId: slot.id,
        after: {
          seed,
          algorithm: result.algorithm,
          listVersionId: version.id,
          previousSlotId: last?.slotId ?? null,
          substitutions: arrangement?.substitutions ?? [],
          requests: result.requests.length,
        },
      },
      em,
    );
    return draw;
  }

  /** The examiner changes a drawn request (a key, the hands…); the change and reason are kept. */
  async changeRequest(slotId: string, input: ChangeRequestInput): Promise<DeskView> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const facts = await this.markedSlot(em, slotId);
      const repo = this.draws.withManager(em);
      const draw = await repo.getOne({ where: { slotId }, lock: { mode: 'pessimistic_write' } });
      const submitted = await this.sheets
        .withManager(em)
        .count({ where: { slotId, status: 'submitted' } });
      if (submitted > 0)
        throw conflict('A sheet of this slot is submitted: its requests can no longer change.');
      const current = draw.requests[input.index];
      if (!current)
        throw invalid(`There is no request ${input.index + 1} in this draw.`, [
          { path: 'index', message: 'not in the draw' },
        ]);
      const { index: _i, reason, ...fields } = input;
      const patch: Partial<Request> = {};
      for (const [k, v] of Object.entries(fields) as [keyof typeof fields, unknown][])
        if (v !== undefined) (patch as Record<string, unknown>)[k] = v;
      if (Object.keys(patch).length === 0) throw invalid('Nothing to change.');
      if (patch.key !== undefined && !isCountedKind(current.kind))
        throw invalid('A passage has no key to change.', [
          { path: 'key', message: 'not for this kind' },
        ]);
      if (patch.hands !== undefined && patch.hands !== 'HT') patch.motion = null;
      if (patch.hands === 'HT' && current.motion === null && patch.motion === undefined)
        patch.motion = 'similar';
      const before = Object.fromEntries(
        Object.keys(patch).map((k) => [k, current[k as keyof Request]]),
      ) as Partial<Request>;
      const person = await em.getRepository(Person).findOneByOrFail({ id: caller.personId });
      const change: RequestChange = {
        index: input.index,
        reason,
        byPersonId: caller.personId,
        byName: person.displayName,
        at: now().toISOString(),
        before,
        after: patch,
      };
      draw.requests = draw.requests.map((r, i) => (i === input.index ? { ...r, ...patch } : r));
      draw.changes = [...draw.changes, change];
      await repo.save(draw);
      await this.audit.record(
        {
          action: 'slot.request_changed',
          entity: 'slot',
          entityId: slotId,
          before: { index: input.index, ...before },
          after: { index: input.index, ...patch, reason },
        },
        em,
      );
      return this.deskView(em, facts);
    });
  }

  private async deskView(em: EntityManager, { slot, role }: SlotFacts): Promise<DeskView> {
    const caller = RequestContext.requireCaller();
    const sitting = slot.sitting!;
    const [draw, person, arrangement, sheets] = await Promise.all([
      this.draws.withManager(em).findOne({ where: { slotId: slot.id } }),
      em.getRepository(Person).findOneByOrFail({ id: caller.personId }),
      this.arrangements.withManager(em).findOne({ where: { studentId: slot.studentId } }),
      this.sheets
        .withManager(em)
        .find({ where: { slotId: slot.id }, relations: { examiner: { person: true } } }),
    ]);
    const mine = sheets.find((s) => s.examinerMembershipId === caller.membershipId) ?? null;
    // The desk is open: this examiner's saves come next, so the facts they check are kept now
    // rather than read by the first save (measured: 200 examiners' first saves in one second
    // queued for seconds behind one another).
    if (mine) this.rememberSheet(mine);
    if (draw) this.rememberDraw(slot.id, draw.requests.map((r) => r.rubricVersionId));
    // The pair sees each other's sheet once both are in; a third marker sees neither (blind).
    const pair = sheets.filter((s) => s.role !== 'third');
    const allSubmitted =
      role !== 'third' &&
      pair.length > 0 &&
      pair.every((s) => s.status === 'submitted') &&
      (!slot.secondExaminerMembershipId || pair.length === 2);
    const other = allSubmitted ? (pair.find((s) => s !== mine) ?? null) : null;
    const cellsOf = async (s: MarkSheet | null) =>
      s
        ? this.cells.withManager(em).find({ where: { sheetId: s.id }, order: { cell: 'ASC' } })
        : [];
    return {
      slot: {
        id: slot.id,
        sittingId: sitting.id,
        sittingTitle: sitting.title,
        sittingStatus: sitting.status,
        room: sitting.room,
        startsAt: slot.startsAt.toISOString(),
        endsAt: slot.endsAt.toISOString(),
        minutes: slot.minutes,
        writeUpGapMinutes: sitting.writeUpGapMinutes,
        outcome: slot.outcome,
        candidate: {
          name: `${slot.student!.givenName} ${slot.student!.familyName}`,
          pupilNumber: slot.student!.pupilNumber,
          grade: slot.student!.grade,
        },
        listName: slot.paper!.listVersion!.name,
        extraTimePercent: arrangement?.extraTimePercent ?? 0,
      },
      role,
      noteNames: person.noteNames,
      draw: draw
        ? {
            seed: draw.seed,
            algorithm: draw.algorithm,
            drawnAt: draw.drawnAt.toISOString(),
            repeatsOfPrevious: draw.repeatsOfPrevious,
          }
        : null,
      requests: draw ? await this.deskRequests(em, slot, draw) : [],
      sheet: mine ? toSheetView(mine, await cellsOf(mine)) : null,
      otherSheet: other ? toSheetView(other, await cellsOf(other)) : null,
    };
  }

  private async deskRequests(
    em: EntityManager,
    slot: Slot,
    draw: SlotDraw,
  ): Promise<DeskRequest[]> {
    const rubricIds = [...new Set(draw.requests.map((r) => r.rubricVersionId))];
    const rubrics = await this.rubricVersions
      .withManager(em)
      .find({ where: { id: In(rubricIds) }, relations: { criteria: true } });
    const rubricOf = new Map(rubrics.map((r) => [r.id, r]));
    const fingerings = await this.fingerings
      .withManager(em)
      .find({ where: { studentId: slot.studentId }, relations: { setBy: true } });
    return draw.requests.map((r) => {
      const rubric = rubricOf.get(r.rubricVersionId);
      const criteria = [...(rubric?.criteria ?? [])]
        .sort((a, b) => a.position - b.position)
        .map((c) => ({ ...toCriterion(c), tension: TENSION.test(c.key) || TENSION.test(c.label) }));
      const hands = r.hands === 'HT' ? ['RH', 'LH'] : [r.hands];
      const key = r.key === null ? null : normaliseKeyName(r.key);
      const mine = fingerings.filter(
        (f) =>
          f.kind === r.kind &&
          f.key === key &&
          (f.mode ?? null) === (r.mode ?? null) &&
          (f.inversion ?? null) === (r.inversion ?? null) &&
          hands.includes(f.hand),
      );
      // The current one per hand: the highest revision.
      const current = hands
        .map((h) => mine.filter((f) => f.hand === h).sort((a, b) => b.revision - a.revision)[0])
        .filter((f): f is StudentFingering => f !== undefined)
        .map(toFingeringView);
      const change = [...draw.changes].reverse().find((c) => c.index === r.index) ?? null;
      return {
        ...r,
        criteria,
        rubricName: rubric?.name ?? 'Rubric',
        fingerings: current,
        change: change
          ? { reason: change.reason, by: change.byName, at: change.at, before: change.before }
          : null,
      };
    });
  }

  // ---------- saving cells ----------

  /**
   * One cell, once per change id (design.md §7). The change id is claimed first (INSERT … ON
   * CONFLICT DO NOTHING), so a retry that races the original waits for it and then replays its
   * result instead of applying the change twice. The cell row is locked, so two changes to the
   * same cell are ordered; a save based on an older version of that cell is a conflict, unless
   * it asks for the value the cell already holds.
   */
  async saveCell(sheetId: string, input: SaveCellInput): Promise<SaveResult> {
    const caller = RequestContext.requireCaller();
    if (!caller.roles.includes('examiner')) throw notFound('mark sheet');
    // A sheet the caller saved to before: the usual save is one statement (see saveAtOnce).
    const known = this.sheetFacts.get(sheetId);
    if (
      known &&
      known.organisationId === caller.organisationId &&
      known.examinerMembershipId === caller.membershipId
    ) {
      await this.checkCell(this.db.manager, known as MarkSheet, input.cell, input.value);
      const saved = await this.saveAtOnce(known, caller, input);
      if (saved) return saved;
    }
    const result = await this.db.transaction(async (em) => {
      // The first save to a sheet, and any save saveAtOnce left alone (a duplicate, a conflict, a
      // submitted sheet). Hand-written statements, as the save is CPU-bound in the API: the sheet
      // FOR SHARE (submit takes it exclusively), the change id claimed first, the cell row locked.
      const [sheet] = (await em.query(
        `WITH sheet AS (
           SELECT id, organisation_id, slot_id, examiner_membership_id, status FROM mark_sheets
            WHERE id = $1 AND organisation_id = $2 FOR SHARE),
         claim AS (
           INSERT INTO mark_changes (change_id, sheet_id, cell, value, base_version, result, version)
           SELECT $3, id, $4, $5::jsonb, $6, 'applied', 0 FROM sheet
            WHERE examiner_membership_id = $7 AND status <> 'submitted'
           ON CONFLICT (change_id) DO NOTHING RETURNING change_id)
         SELECT id, organisation_id, slot_id, examiner_membership_id, status,
                EXISTS (SELECT 1 FROM claim) AS claimed FROM sheet`,
        [
          sheetId,
          caller.organisationId,
          input.changeId,
          input.cell,
          JSON.stringify(input.value),
          input.baseVersion,
          caller.membershipId,
        ],
      )) as {
        id: string;
        organisation_id: string;
        slot_id: string;
        examiner_membership_id: string;
        status: MarkSheet['status'];
        claimed: boolean;
      }[];
      if (!sheet || sheet.examiner_membership_id !== caller.membershipId)
        throw notFound('mark sheet');
      const facts = {
        id: sheet.id,
        organisationId: sheet.organisation_id,
        slotId: sheet.slot_id,
      } as MarkSheet;
      this.rememberSheet({
        id: sheet.id,
        organisationId: sheet.organisation_id,
        slotId: sheet.slot_id,
        examinerMembershipId: sheet.examiner_membership_id,
      });
      if (!sheet.claimed) {
        // Either the change id was seen before (its first result stands) or the sheet is submitted.
        const seen = await em.getRepository(MarkChange).existsBy({ changeId: input.changeId });
        if (seen) return this.replay(em, facts, input.changeId);
        throw new DomainError(
          ErrorCode.Conflict,
          'This sheet is submitted: change it with a correction and a reason.',
          { kind: 'submitted' },
        );
      }
      await this.checkCell(em, facts, input.cell, input.value);
      return (
        (await this.applyFast(em, facts, input)) ??
        this.apply(
          em,
          facts,
          input.changeId,
          input.cell,
          input.value,
          input.baseVersion,
          'applied',
        )
      );
    });
    if (result.status === 'conflict') throw new CellConflict(result);
    return result;
  }

  // Which slot, organisation and examiner a sheet belongs to never changes once it exists, so it is
  // kept per process after the first save reads it. It only chooses the path and the checks to
  // run first: saveAtOnce asks the database again for the sheet, its examiner and its status.
  private readonly sheetFacts = new Map<
    string,
    { id: string; organisationId: string; slotId: string; examinerMembershipId: string }
  >();

  private rememberSheet(s: { id: string; organisationId: string; slotId: string; examinerMembershipId: string }): void {
    if (this.sheetFacts.size > 5000) this.sheetFacts.clear();
    this.sheetFacts.set(s.id, { id: s.id, organisationId: s.organisationId, slotId: s.slotId, examinerMembershipId: s.examinerMembershipId });
  }

  /**
   * The usual save as one statement on its own (measured with api/bench/marking-saves.mjs: a save
   * is CPU-bound in the API, and each round trip, BEGIN and COMMIT included, costs). It writes only
   * when everything is plain: the caller's sheet, not submitted (held FOR SHARE, so a submit waits
   * or is waited for), a change id never seen, and the cell at the base version (or already
   * holding the value, or new from base 0). The change is recorded in the same statement, with
   * the version it produced, so cell and change commit together or not at all; a retry racing the
   * original fails on the change id's key and rolls the whole statement back. Anything else
   * answers null and goes the careful way (saveCell's transaction), which decides and explains.
   */
  private async saveAtOnce(
    sheet: { id: string; organisationId: string },
    caller: Caller,
    input: SaveCellInput,
  ): Promise<SaveResult | null> {
    let rows: { version: number }[];
    try {
      rows = await preparedQuery<{ version: number }>(
        this.db,
        'marking-save-at-once',
        `WITH sheet AS (
           SELECT id FROM mark_sheets
            WHERE id = $1 AND organisation_id = $6 AND examiner_membership_id = $7 AND status <> 'submitted'
              AND NOT EXISTS (SELECT 1 FROM mark_changes WHERE change_id = $5)
            FOR SHARE),
         updated AS (
           UPDATE mark_cells c SET
                  version = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.version ELSE c.version + 1 END,
                  last_change_id = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.last_change_id ELSE $5 END,
                  updated_at = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.updated_at ELSE now() END,
                  value = $3::jsonb
            WHERE c.sheet_id = (SELECT id FROM sheet) AND c.cell = $2 AND (c.version = $4 OR c.value = $3::jsonb)
            RETURNING c.version),
         inserted AS (
           INSERT INTO mark_cells (organisation_id, sheet_id, cell, value, version, last_change_id)
           SELECT $6, id, $2, $3::jsonb, 1, $5 FROM sheet
            WHERE $4 = 0 AND NOT EXISTS (SELECT 1 FROM mark_cells WHERE sheet_id = $1 AND cell = $2)
           ON CONFLICT (sheet_id, cell) DO NOTHING RETURNING version)
         INSERT INTO mark_changes (change_id, sheet_id, cell, value, base_version, result, version)
         SELECT $5, $1, $2, $3::jsonb, $4, 'applied', r.version
           FROM (SELECT version FROM updated UNION ALL SELECT version FROM inserted) r
         RETURNING version`,
        [
          sheet.id,
          input.cell,
          JSON.stringify(input.value),
          input.baseVersion,
          input.changeId,
          sheet.organisationId,
          caller.membershipId,
        ],
      );
    } catch (err) {
      // The same change id committed meanwhile (a racing retry): nothing of this statement stays.
      // (pg's own error: the statement goes to the pool, not through TypeORM.)
      const e = err as { code?: string; table?: string };
      if (e?.code === '23505' && e.table === 'mark_changes') return null;
      throw err;
    }
    return appliedAt(input, rows[0]?.version);
  }

  /**
   * The usual save in one statement: the cell is written when it is at the base version the
   * client saw (or already holds the value), or created when new and based on version 0, and the
   * change records the result. Anything else (a conflict, a cell created at the same moment by
   * someone else) answers null and goes through `apply`, which locks the cell and decides.
   */
  private async applyFast(
    em: EntityManager,
    sheet: MarkSheet,
    input: SaveCellInput,
  ): Promise<SaveResult | null> {
    const rows = (await em.query(
      `WITH updated AS (
         UPDATE mark_cells c SET
                version = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.version ELSE c.version + 1 END,
                last_change_id = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.last_change_id ELSE $5 END,
                updated_at = CASE WHEN c.version > 0 AND c.value = $3::jsonb THEN c.updated_at ELSE now() END,
                value = $3::jsonb
          WHERE c.sheet_id = $1 AND c.cell = $2 AND (c.version = $4 OR c.value = $3::jsonb)
          RETURNING c.version),
       inserted AS (
         INSERT INTO mark_cells (organisation_id, sheet_id, cell, value, version, last_change_id)
         SELECT $6, $1, $2, $3::jsonb, 1, $5
          WHERE $4 = 0 AND NOT EXISTS (SELECT 1 FROM mark_cells WHERE sheet_id = $1 AND cell = $2)
         ON CONFLICT (sheet_id, cell) DO NOTHING RETURNING version),
       result AS (SELECT version FROM updated UNION ALL SELECT version FROM inserted),
       recorded AS (
         UPDATE mark_changes m SET version = r.version FROM result r WHERE m.change_id = $5
         RETURNING m.version)
       SELECT version FROM recorded`,
      [
        sheet.id,
        input.cell,
        JSON.stringify(input.value),
        input.baseVersion,
        input.changeId,
        sheet.organisationId,
      ],
    )) as { version: number }[];
    return appliedAt(input, rows[0]?.version);
  }

  /** A later change to a submitted sheet: audited with the old and new values and the reason. */
  async correct(sheetId: string, input: CorrectCellInput): Promise<SaveResult> {
    return this.db.transaction(async (em) => {
      const sheet = await this.ownSheet(em, sheetId, 'pessimistic_read');
      if (sheet.status !== 'submitted')
        throw conflict('This sheet is not submitted yet: save the cell as usual.');
      const claimed = await this.claim(em, sheet, input.changeId, input.cell, input.value, -1);
      if (!claimed) {
        const replayed = await this.replay(em, sheet, input.changeId);
        if (replayed.status === 'conflict') throw new CellConflict(replayed);
        return replayed;
      }
      await this.checkCell(em, sheet, input.cell, input.value);
      const before = await this.lockCell(em, sheet, input.cell, input.changeId);
      const res = await this.apply(
        em,
        sheet,
        input.changeId,
        input.cell,
        input.value,
        before.version,
        'correction',
      );
      await this.audit.record(
        {
          action: 'mark_sheet.corrected',
          entity: 'mark_sheet',
          entityId: sheet.id,
          before: { cell: input.cell, value: before.value, version: before.version },
          after: {
            cell: input.cell,
            value: input.value,
            version: res.status === 'conflict' ? before.version : res.version,
            reason: input.reason,
          },
        },
        em,
      );
      // A correction after marking closed changes the result (and may raise or clear a flag).
      const [closed] = (await em.query(
        `SELECT s.id FROM sittings s JOIN slots x ON x.sitting_id = s.id WHERE x.id = $1 AND s.status = 'marking_closed'`,
        [sheet.slotId],
      )) as { id: string }[];
      if (closed && res.status !== 'conflict') await this.results.computeForSitting(closed.id, em);
      return res;
    });
  }

  /** Claims the change id; false when it was seen before (then its first result stands). */
  private async claim(
    em: EntityManager,
    sheet: MarkSheet,
    changeId: string,
    cell: string,
    value: CellValue,
    baseVersion: number,
  ): Promise<boolean> {
    const rows = (await em.query(
      `INSERT INTO mark_changes (change_id, sheet_id, cell, value, base_version, result, version)
       VALUES ($1, $2, $3, $4::jsonb, $5, 'applied', 0) ON CONFLICT (change_id) DO NOTHING RETURNING change_id`,
      [changeId, sheet.id, cell, JSON.stringify(value), baseVersion],
    )) as unknown[];
    return rows.length === 1;
  }

  private async replay(em: EntityManager, sheet: MarkSheet, changeId: string): Promise<SaveResult> {
    const prior = await em.getRepository(MarkChange).findOneByOrFail({ changeId });
    // A change id belongs to one sheet; reusing it elsewhere is a client bug, not a duplicate.
    if (prior.sheetId !== sheet.id)
      throw conflict('This change id was already used for another mark sheet.');
    if (prior.result === 'conflict') {
      return {
        status: 'conflict',
        cell: prior.cell,
        changeId,
        yours: prior.value,
        theirs: prior.theirs,
        version: prior.version,
      };
    }
    return {
      status: 'duplicate',
      cell: prior.cell,
      value: prior.value,
      version: prior.version,
      changeId,
    };
  }

  /** Marks within the criterion's maximum, requests in the draw, criteria of the request's rubric. */
  private async checkCell(
    em: EntityManager,
    sheet: MarkSheet,
    cell: string,
    value: CellValue,
  ): Promise<void> {
    const parsed = parseCell(cell)!;
    if (parsed.request === null) return;
    const rubricIds = await this.drawnRubrics(em, sheet.slotId);
    const rubricId = rubricIds[parsed.request];
    if (rubricId === undefined)
      throw invalid(`There is no request ${parsed.request + 1} on this sheet.`, [
        { path: 'cell', message: 'request not in the draw' },
      ]);
    if (parsed.kind !== 'mark') return;
    const rubric = await this.rubricCriteria(em, rubricId);
    const criterion = rubric.criteria.get(parsed.part!);
    if (!criterion)
      throw invalid(`“${parsed.part}” is not a criterion of ${rubric.name}.`, [
        { path: 'cell', message: 'unknown criterion' },
      ]);
    if (typeof value === 'number' && value > criterion.maxMark) {
      throw invalid(`${criterion.label} is marked out of ${criterion.maxMark}.`, [
        { path: 'value', message: `at most ${criterion.maxMark}` },
      ]);
    }
  }

  // A slot's draw keeps its requests' rubric versions (a changed request keeps its rubric), and a
  // published rubric version never changes, so both are read once per process, not on every save.
  private readonly rubricIdsBySlot = new Map<string, string[]>();
  private readonly criteriaByRubric = new Map<
    string,
    { name: string; criteria: Map<string, { label: string; maxMark: number }> }
  >();

  private async drawnRubrics(em: EntityManager, slotId: string): Promise<string[]> {
    const cached = this.rubricIdsBySlot.get(slotId);
    if (cached) return cached;
    const draw = await this.draws.withManager(em).getOne({ where: { slotId } });
    const ids = draw.requests.map((r) => r.rubricVersionId);
    this.rememberDraw(slotId, ids);
    return ids;
  }

  private rememberDraw(slotId: string, rubricVersionIds: string[]): void {
    if (this.rubricIdsBySlot.size > 5000) this.rubricIdsBySlot.clear();
    this.rubricIdsBySlot.set(slotId, rubricVersionIds);
  }

  private async rubricCriteria(em: EntityManager, rubricVersionId: string) {
    const cached = this.criteriaByRubric.get(rubricVersionId);
    if (cached) return cached;
    const rubric = await this.rubricVersions
      .withManager(em)
      .getOne({ where: { id: rubricVersionId }, relations: { criteria: true } });
    const entry = {
      name: rubric.name,
      criteria: new Map(
        rubric.criteria!.map((c) => [c.key, { label: c.label, maxMark: c.maxMark }]),
      ),
    };
    if (rubric.status === 'published') this.criteriaByRubric.set(rubricVersionId, entry);
    return entry;
  }

  /** The cell's row, created empty (version 0) when new, and locked until the transaction ends. */
  private async lockCell(
    em: EntityManager,
    sheet: MarkSheet,
    cell: string,
    changeId: string,
  ): Promise<{ version: number; value: CellValue }> {
    // DO UPDATE (to the same value) rather than DO NOTHING, so the row comes back locked either way.
    const [row] = (await em.query(
      `INSERT INTO mark_cells (organisation_id, sheet_id, cell, value, version, last_change_id)
       VALUES ($1, $2, $3, 'null'::jsonb, 0, $4)
       ON CONFLICT (sheet_id, cell) DO UPDATE SET cell = EXCLUDED.cell RETURNING version, value`,
      [sheet.organisationId, sheet.id, cell, changeId],
    )) as { version: number; value: CellValue }[];
    return row!;
  }

  private async apply(
    em: EntityManager,
    sheet: MarkSheet,
    changeId: string,
    cell: string,
    value: CellValue,
    baseVersion: number,
    kind: 'applied' | 'correction',
  ): Promise<SaveResult> {
    const current = await this.lockCell(em, sheet, cell, changeId);
    if (current.version !== baseVersion && !isDeepStrictEqual(current.value, value)) {
      await em.query(
        `UPDATE mark_changes SET result = 'conflict', version = $2, theirs = $3::jsonb WHERE change_id = $1`,
        [changeId, current.version, JSON.stringify(current.value)],
      );
      return {
        status: 'conflict',
        cell,
        changeId,
        yours: value,
        theirs: current.value,
        version: current.version,
      };
    }
    const changes = !isDeepStrictEqual(current.value, value) || current.version === 0;
    const version = changes ? current.version + 1 : current.version;
    // The cell and the change's record in one statement (one round trip on the hot path).
    await em.query(
      `WITH cell AS (
         UPDATE mark_cells SET value = $3::jsonb, version = $4, last_change_id = $5, updated_at = now()
         WHERE sheet_id = $1 AND cell = $2 AND $7::boolean)
       UPDATE mark_changes SET result = $6, version = $4 WHERE change_id = $5`,
      [sheet.id, cell, JSON.stringify(value), version, changeId, kind, changes],
    );
    return { status: 'applied', cell, value, version, changeId };
  }

  // ---------- submit and reading sheets ----------

  /**
   * Submits the caller's sheet. The client sends its last change id: if that change has not
   * reached the server, some saves are still on their way and the submit is refused. Marks are
   * needed for every criterion of every request asked, unless the candidate was absent or withdrew.
   */
  async submit(sheetId: string, input: SubmitSheetInput): Promise<DeskView> {
    const caller = RequestContext.requireCaller();
    const prepared = await this.db.transaction(async (em) => {
      const sheet = await this.ownSheet(em, sheetId, 'pessimistic_write');
      if (sheet.status === 'submitted') return { sheet, outcome: null };
      if (input.lastChangeId) {
        const arrived = await em
          .getRepository(MarkChange)
          .findOneBy({ changeId: input.lastChangeId, sheetId: sheet.id });
        if (!arrived)
          throw new DomainError(
            ErrorCode.Conflict,
            'Some changes have not reached the server yet: wait until every change is saved.',
            { kind: 'queue_not_empty' },
          );
      }
      const cells = await this.cells.withManager(em).find({ where: { sheetId: sheet.id } });
      const value = new Map(cells.map((c) => [c.cell, c.value]));
      const outcome = value.get('outcome') as SlotOutcome | null | undefined;
      if (!outcome)
        throw invalid('Record the slot’s outcome before submitting.', [
          { path: 'outcome', message: 'missing' },
        ]);
      const missing: { path: string; message: string }[] = [];
      if (outcome === 'completed' || outcome === 'incomplete') {
        const draw = await this.draws.withManager(em).getOne({ where: { slotId: sheet.slotId } });
        const rubrics = await this.rubricVersions.withManager(em).find({
          where: { id: In([...new Set(draw.requests.map((r) => r.rubricVersionId))]) },
          relations: { criteria: true },
        });
        for (const r of draw.requests) {
          if (value.get(`asked:${r.index}`) === false) continue;
          const rubric = rubrics.find((x) => x.id === r.rubricVersionId);
          for (const c of rubric?.criteria ?? []) {
            const v = value.get(`mark:${r.index}:${c.key}`);
            if (typeof v !== 'number')
              missing.push({
                path: `mark:${r.index}:${c.key}`,
                message: `Request ${r.index + 1}: ${c.label} has no mark.`,
              });
          }
        }
      }
      if (missing.length)
        throw invalid(
          `${missing.length} mark(s) missing: mark them, or mark the request “not asked”.`,
          missing,
        );
      return { sheet, outcome };
    });
    // The first examiner's outcome is the slot's; recorded before the sheet is locked, so a refusal loses nothing.
    if (prepared.outcome && prepared.sheet.role === 'first') {
      const slot = await this.slots.getById(prepared.sheet.slotId);
      if (slot.outcome !== prepared.outcome)
        await this.sittings.recordOutcome(slot.id, { outcome: prepared.outcome });
    }
    return this.db.transaction(async (em) => {
      const sheet = await this.ownSheet(em, sheetId, 'pessimistic_write');
      if (sheet.status !== 'submitted') {
        sheet.status = 'submitted';
        sheet.submittedAt = now();
        await this.sheets.withManager(em).save(sheet);
        await this.audit.record(
          {
            action: 'mark_sheet.submitted',
            entity: 'mark_sheet',
            entityId: sheet.id,
            after: { slotId: sheet.slotId, by: caller.personId },
          },
          em,
        );
      }
      const facts = await this.markedSlot(em, sheet.slotId);
      // After marking closed (a third marker, a late sheet) the results follow at once.
      if (facts.slot.sitting!.status === 'marking_closed')
        await this.results.computeForSitting(facts.slot.sittingId, em);
      return this.deskView(em, facts);
    });
  }

  /**
   * A sheet: the caller's own; the other examiner's of the same slot only once every sheet of the
   * slot is submitted (blind second marking); an admin's view of submitted sheets. Else 404.
   */
  async getSheet(sheetId: string): Promise<ReturnType<typeof toSheetView>> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const sheet = await this.sheets
        .withManager(em)
        .getOne({ where: { id: sheetId }, relations: { examiner: { person: true }, slot: true } });
      if (!(await this.maySee(em, caller, sheet))) throw notFound('mark sheet');
      return toSheetView(
        sheet,
        await this.cells.withManager(em).find({ where: { sheetId }, order: { cell: 'ASC' } }),
      );
    });
  }

  private async maySee(em: EntityManager, caller: Caller, sheet: MarkSheet): Promise<boolean> {
    if (caller.roles.includes('examiner') && sheet.examinerMembershipId === caller.membershipId)
      return true;
    const slot = sheet.slot!;
    const all = await this.sheets.withManager(em).find({ where: { slotId: slot.id } });
    const expected = slot.secondExaminerMembershipId ? 2 : 1;
    const allIn = all.length >= expected && all.every((s) => s.status === 'submitted');
    if (!allIn) return false;
    if (caller.roles.includes('admin')) return true;
    const me = caller.membershipId;
    return (
      caller.roles.includes('examiner') &&
      (slot.examinerMembershipId === me || slot.secondExaminerMembershipId === me)
    );
  }
}

function clock(instant: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(instant);
}

/** The answer to a save that the one-statement paths wrote at `version`; null when they did not. */
function appliedAt(input: SaveCellInput, version: number | undefined): SaveResult | null {
  if (version === undefined) return null;
  return { status: 'applied', cell: input.cell, value: input.value, version, changeId: input.changeId };
}
