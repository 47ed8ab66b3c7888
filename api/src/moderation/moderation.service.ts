import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type EntityManager } from 'typeorm';
import {
  DEFAULT_TOLERANCE,
  MarkSheetError,
  type AgreeMarksInput,
  type BandPolicy,
  type CellValue,
  type ModerationPairView,
  type ModerationSheetView,
  type ModerationView,
  type Request,
  type ThirdMarkerInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { now } from '../common/clock.js';
import { conflict, DomainError, ErrorCode, invalid, notFound } from '../common/errors.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { MailService } from '../mail/mail.service.js';
import { MarkCell } from '../marking/entities/mark-cell.entity.js';
import { MarkSheet } from '../marking/entities/mark-sheet.entity.js';
import { SlotDraw } from '../marking/entities/slot-draw.entity.js';
import { Result } from '../results/entities/result.entity.js';
import { requestLabel } from '../results/request-label.js';
import { resultCaller, type ResultCaller } from '../results/result-access.js';
import { ReleaseService } from '../results/release.service.js';
import { ResultsService, scoreCells, type RubricFacts } from '../results/results.service.js';
import { BandPolicyVersion } from '../sittings/entities/band-policy.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { ModerationCase } from './entities/moderation-case.entity.js';

const TENSION = /tension|freedom/i;
const nameOf = (s: { givenName: string; familyName: string }) => `${s.givenName} ${s.familyName}`;

interface SittingFacts {
  sitting: Sitting;
  who: ResultCaller;
  /** Admin or the sitting's planner: every pair; otherwise only the pairs of students taught. */
  all: boolean;
}

/**
 * Moderation (issue 7 §2; design.md §4.5): double-marked pairs side by side once marking has
 * closed, flags where a pair is outside tolerance, and their resolution by agreed marks (who, why,
 * audited) or by a third marker's blind sheet. Admins and the sitting's planner moderate every
 * pair; a teacher the pairs of the students they teach; anybody else finds no sitting (404).
 */
@Injectable()
export class ModerationService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly results: ResultsService,
    private readonly release: ReleaseService,
    private readonly audit: AuditService,
    private readonly mail: MailService,
  ) {}

  private async sittingFor(
    em: EntityManager,
    sittingId: string,
    lock = false,
  ): Promise<SittingFacts> {
    const who = await resultCaller(em);
    const sittings = new ScopedRepository(em.getRepository(Sitting), 'sitting');
    const sitting = await sittings.getOne({
      where: { id: sittingId },
      ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
    });
    const all =
      who.admin ||
      (who.caller.roles.includes('teacher') &&
        sitting.plannedByMembershipId === who.caller.membershipId);
    if (!all) {
      const taught = who.teaches.size
        ? await em.count(Slot, { where: { sittingId, studentId: In([...who.teaches]) } })
        : 0;
      if (!taught) throw notFound('sitting');
    }
    return { sitting, who, all };
  }

  private mayModerate(f: SittingFacts, slot: Slot): boolean {
    return f.all || f.who.teaches.has(slot.studentId);
  }

  private static closedOnly(sitting: Sitting): void {
    if (sitting.status !== 'marking_closed' && sitting.status !== 'published')
      throw conflict(
        'Marking of this sitting is still open: pairs are compared once marking closes, so no examiner sees another’s marks before submitting.',
      );
  }

  // ---------- the moderation page ----------

  async view(sittingId: string): Promise<ModerationView> {
    return this.db.transaction(async (em) => {
      const f = await this.sittingFor(em, sittingId);
      ModerationService.closedOnly(f.sitting);
      return this.build(em, f);
    });
  }

  private async build(em: EntityManager, f: SittingFacts): Promise<ModerationView> {
    const { sitting } = f;
    const org = sitting.organisationId;
    const scoped = <
      T extends Slot | SlotDraw | MarkSheet | MarkCell | ModerationCase | Result | Membership,
    >(
      target: new () => T,
    ) => new ScopedRepository<T>(em.getRepository(target), 'record', () => org);
    const slots = (
      await scoped(Slot).find({
        where: { sittingId: sitting.id },
        relations: { student: true, paper: { listVersion: true } },
        order: { position: 'ASC' },
      })
    ).filter(
      (s) => s.secondExaminerMembershipId && s.outcome === 'completed' && this.mayModerate(f, s),
    );
    const ids = slots.map((s) => s.id);
    const [draws, sheets, cases, results, examiners] = await Promise.all([
      ids.length ? scoped(SlotDraw).find({ where: { slotId: In(ids) } }) : [],
      ids.length
        ? scoped(MarkSheet).find({
            where: { slotId: In(ids) },
            relations: { examiner: { person: true } },
          })
        : [],
      ids.length
        ? scoped(ModerationCase).find({
            where: { slotId: In(ids) },
            relations: { agreedBy: true, thirdExaminer: { person: true } },
          })
        : [],
      scoped(Result).find({ where: { sittingId: sitting.id } }),
      scoped(Membership)
        .qb('m')
        .innerJoinAndSelect('m.person', 'p')
        .andWhere('m.active = true')
        .andWhere(`'examiner' = ANY(m.roles)`)
        .orderBy('p.displayName')
        .getMany(),
    ]);
    const submitted = sheets.filter((s) => s.status === 'submitted');
    const cells = submitted.length
      ? await scoped(MarkCell).find({ where: { sheetId: In(submitted.map((s) => s.id)) } })
      : [];
    const cellsOf = new Map<string, Map<string, CellValue>>();
    for (const c of cells) {
      const m = cellsOf.get(c.sheetId) ?? new Map<string, CellValue>();
      m.set(c.cell, c.value);
      cellsOf.set(c.sheetId, m);
    }
    const rubrics = await this.results.loadRubrics(
      em,
      draws.flatMap((d) => d.requests.map((r) => r.rubricVersionId)),
    );
    const policyRow = await em.findOneByOrFail(BandPolicyVersion, {
      id: sitting.bandPolicyId!,
      organisationId: org,
    });
    const policy: BandPolicy = { bands: policyRow.bands, below: policyRow.below };

    const pairs: ModerationPairView[] = slots.map((slot) => {
      const draw = draws.find((d) => d.slotId === slot.id);
      const requests = draw?.requests ?? [];
      const totalMarks = slot.paper!.listVersion!.totalMarks;
      const sheetView = (role: 'first' | 'second' | 'third'): ModerationSheetView | null => {
        // A sheet not yet submitted stays blind to everyone but its examiner.
        const s = submitted.find((x) => x.slotId === slot.id && x.role === role);
        if (!s) return null;
        const c = cellsOf.get(s.id) ?? new Map<string, CellValue>();
        let total: number | null = null;
        let bandLabel: string | null = null;
        let requestScores: (number | null)[] = requests.map(() => null);
        try {
          const sc = scoreCells(requests, c, rubrics, totalMarks, policy);
          total = sc.total;
          bandLabel = sc.band.label;
          const by = new Map(sc.requests.map((r) => [r.key, r.score]));
          requestScores = requests.map((r) => by.get(String(r.index)) ?? null);
        } catch (e) {
          if (!(e instanceof MarkSheetError)) throw e;
        }
        return {
          id: s.id,
          role,
          examiner: {
            id: s.examinerMembershipId,
            displayName: s.examiner?.person?.displayName ?? 'An examiner',
          },
          submittedAt: s.submittedAt?.toISOString() ?? null,
          total,
          bandLabel,
          requestScores,
          cells: [...c]
            .map(([cell, value]) => ({ cell, value }))
            .sort((a, b) => a.cell.localeCompare(b.cell)),
        };
      };
      const first = sheetView('first');
      const second = sheetView('second');
      const third = sheetView('third');
      const mc = cases.find((c) => c.slotId === slot.id) ?? null;
      const comparison = mc?.comparison ?? null;
      const byKey = new Map((comparison?.requests ?? []).map((r) => [r.key, r]));
      const reasons: string[] = [];
      if (comparison) {
        for (const r of comparison.requests) {
          const label = requestLabel(requests[Number(r.key)] ?? ({} as Request));
          if (r.reason === 'over_tolerance')
            reasons.push(
              `Request ${Number(r.key) + 1} (${label}): the two scores differ by ${Math.round((r.difference ?? 0) * 100)} % of its maximum (more than ${Math.round(DEFAULT_TOLERANCE.requestShare * 100)} %).`,
            );
          if (r.reason === 'asked_by_one_only')
            reasons.push(`Request ${Number(r.key) + 1} (${label}): asked by one examiner only.`);
        }
        if (comparison.total.flagged)
          reasons.push(
            `Totals ${comparison.total.a} and ${comparison.total.b} differ by ${comparison.total.difference} marks (more than ${Number(comparison.total.limit.toFixed(2))} marks, ${Math.round(DEFAULT_TOLERANCE.totalShare * 100)} % of ${totalMarks}).`,
          );
      }
      const result = results.find((r) => r.slotId === slot.id) ?? null;
      const diff =
        first?.total != null && second?.total != null ? Math.abs(first.total - second.total) : null;
      return {
        slotId: slot.id,
        candidate: {
          studentId: slot.studentId,
          name: nameOf(slot.student!),
          pupilNumber: slot.student!.pupilNumber,
        },
        status: mc ? mc.status : first && second ? 'within' : 'waiting',
        reasons,
        total: {
          first: first?.total ?? null,
          second: second?.total ?? null,
          difference: diff,
          limit: DEFAULT_TOLERANCE.totalShare * totalMarks,
        },
        requests: requests.map((r) => {
          const cmp = byKey.get(String(r.index));
          const fs = first?.requestScores[r.index] ?? null;
          const ss = second?.requestScores[r.index] ?? null;
          return {
            index: r.index,
            label: requestLabel(r),
            criteria: (rubrics.get(r.rubricVersionId)?.criteria ?? []).map((c) => ({
              key: c.key,
              label: c.label,
              maxMark: c.maxMark,
              tension: TENSION.test(c.key) || TENSION.test(c.label),
            })),
            difference: cmp
              ? cmp.difference
              : fs !== null && ss !== null
                ? Math.abs(fs - ss)
                : null,
            flagged: cmp?.flagged ?? false,
          };
        }),
        first,
        second,
        third,
        thirdExaminer: mc?.thirdExaminer
          ? {
              id: mc.thirdExaminer.id,
              displayName: mc.thirdExaminer.person?.displayName ?? 'An examiner',
            }
          : null,
        agreed:
          mc?.status === 'agreed' && mc.agreedMarks
            ? {
                by: mc.agreedBy?.displayName ?? 'Someone',
                at: mc.agreedAt!.toISOString(),
                reason: mc.agreedReason!,
                marks: mc.agreedMarks.marks,
                notAsked: mc.agreedMarks.notAsked,
              }
            : null,
        result: result
          ? {
              total: result.total,
              outOf: result.outOf,
              bandLabel: result.bandLabel,
              basis: result.basis,
              released: result.releasedAt !== null,
            }
          : null,
      };
    });
    const open = await this.release.openFlags(em, sitting.id);
    const releasable = results.filter((r) => f.who.admin || f.who.teaches.has(r.studentId));
    return {
      sitting: { id: sitting.id, title: sitting.title, date: sitting.date, status: sitting.status },
      tolerance: { ...DEFAULT_TOLERANCE },
      pairs,
      openFlags: open.length,
      examiners: examiners.map((m) => ({ id: m.id, displayName: m.person!.displayName })),
      release: {
        results: releasable.length,
        released: releasable.filter((r) => r.releasedAt).length,
        canRelease: releasable.length > 0 && open.length === 0,
        blockedBy: open.length ? ReleaseService.blockMessage(open) : null,
      },
    };
  }

  // ---------- resolving a flag ----------

  /** The slot, its sitting's facts and its case, for a change; 404 when the caller may not moderate it. */
  private async caseFor(em: EntityManager, slotId: string) {
    const slot = await new ScopedRepository(em.getRepository(Slot), 'slot').getOne({
      where: { id: slotId },
      relations: { student: true },
    });
    let f: SittingFacts;
    try {
      f = await this.sittingFor(em, slot.sittingId, true);
    } catch (e) {
      if (e instanceof DomainError && e.code === ErrorCode.NotFound) throw notFound('slot');
      throw e;
    }
    if (!this.mayModerate(f, slot)) throw notFound('slot');
    ModerationService.closedOnly(f.sitting);
    const mc = await new ScopedRepository(
      em.getRepository(ModerationCase),
      'moderation case',
    ).findOne({
      where: { slotId },
      lock: { mode: 'pessimistic_write' },
    });
    if (!mc)
      throw conflict(
        `${nameOf(slot.student!)}’s marks are not flagged: there is nothing to resolve.`,
      );
    const result = await em.findOne(Result, {
      where: { slotId, organisationId: slot.organisationId },
    });
    if (result?.releasedAt)
      throw conflict(
        `${nameOf(slot.student!)}’s result is already released; its marks can no longer change here.`,
      );
    return { slot, f, mc };
  }

  /** Agreed marks for a flagged pair: every criterion of every request asked, with the reason (audited). */
  async agree(slotId: string, input: AgreeMarksInput): Promise<ModerationView> {
    return this.db.transaction(async (em) => {
      const { slot, f, mc } = await this.caseFor(em, slotId);
      if (mc.status === 'third')
        throw conflict('The third marker’s sheet already settles this pair.');
      const draw = await em.findOneByOrFail(SlotDraw, {
        slotId,
        organisationId: slot.organisationId,
      });
      const rubrics = await this.results.loadRubrics(
        em,
        draw.requests.map((r) => r.rubricVersionId),
      );
      const problems = checkAgreedMarks(draw.requests, rubrics, input);
      if (problems.length)
        throw invalid(
          `The agreed marks are incomplete or out of range: ${problems[0]!.message}${problems.length > 1 ? ` (and ${problems.length - 1} more)` : ''}`,
          problems,
        );
      const before = {
        status: mc.status,
        thirdExaminerMembershipId: mc.thirdExaminerMembershipId,
        comparison: mc.comparison.total,
      };
      mc.status = 'agreed';
      mc.agreedMarks = {
        marks: input.marks,
        notAsked: [...new Set(input.notAsked)].sort((a, b) => a - b),
      };
      mc.agreedByPersonId = f.who.caller.personId;
      mc.agreedAt = now();
      mc.agreedReason = input.reason;
      mc.resolvedAt = now();
      await em.save(mc);
      await this.results.computeForSitting(slot.sittingId, em);
      const result = await em.findOne(Result, {
        where: { slotId, organisationId: slot.organisationId },
      });
      await this.audit.record(
        {
          action: 'moderation.agreed',
          entity: 'slot',
          entityId: slotId,
          before,
          after: {
            reason: input.reason,
            marks: input.marks,
            notAsked: mc.agreedMarks.notAsked,
            total: result?.total ?? null,
            band: result?.bandKey ?? null,
          },
        },
        em,
      );
      return this.build(em, f);
    });
  }

  /** Sends a flagged pair to a third examiner, who marks the slot blind on the desk. */
  async sendToThird(slotId: string, input: ThirdMarkerInput): Promise<ModerationView> {
    const view = await this.db.transaction(async (em) => {
      const { slot, f, mc } = await this.caseFor(em, slotId);
      if (mc.status === 'agreed' || mc.status === 'third')
        throw conflict('This pair is already resolved.');
      if (
        input.examinerId === slot.examinerMembershipId ||
        input.examinerId === slot.secondExaminerMembershipId
      )
        throw invalid('The third marker must be someone other than the two who marked the pair.', [
          { path: 'examinerId', message: 'marked this pair' },
        ]);
      const examiner = await new ScopedRepository(em.getRepository(Membership), 'examiner').findOne(
        {
          where: { id: input.examinerId, active: true },
          relations: { person: true },
        },
      );
      if (!examiner || !examiner.roles.includes('examiner'))
        throw invalid('Choose an examiner of this organisation.', [
          { path: 'examinerId', message: 'not an examiner' },
        ]);
      if (mc.thirdExaminerMembershipId && mc.thirdExaminerMembershipId !== examiner.id) {
        const started = await em.count(MarkSheet, {
          where: { slotId, role: 'third', organisationId: slot.organisationId },
        });
        if (started)
          throw conflict(
            'The third marker has started marking; the pair cannot be handed to someone else now.',
          );
      }
      const before = { status: mc.status, thirdExaminerMembershipId: mc.thirdExaminerMembershipId };
      mc.status = 'third_marking';
      mc.thirdExaminerMembershipId = examiner.id;
      mc.sentToThirdByPersonId = f.who.caller.personId;
      mc.sentToThirdAt = now();
      await em.save(mc);
      await this.audit.record(
        {
          action: 'moderation.sent_to_third',
          entity: 'slot',
          entityId: slotId,
          before,
          after: {
            status: mc.status,
            thirdExaminerMembershipId: examiner.id,
            note: input.note ?? null,
          },
        },
        em,
      );
      await this.mail.enqueue(em, [
        {
          organisationId: slot.organisationId,
          kind: 'third_marking',
          toAddress: examiner.person!.email,
          toName: examiner.person!.displayName,
          data: {
            displayName: examiner.person!.displayName,
            sittingTitle: f.sitting.title,
            sittingDate: f.sitting.date,
            candidate: nameOf(slot.student!),
            note: input.note ?? null,
          },
          accountTokenId: null,
        },
      ]);
      return this.build(em, f);
    });
    this.mail.afterCommit();
    return view;
  }
}

/** Every criterion of every request asked needs a whole mark within its maximum; nothing else. */
export function checkAgreedMarks(
  requests: readonly Request[],
  rubrics: ReadonlyMap<string, RubricFacts>,
  input: Pick<AgreeMarksInput, 'marks' | 'notAsked'>,
): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  const notAsked = new Set(input.notAsked);
  const expected = new Set<string>();
  for (const i of notAsked)
    if (!requests.some((r) => r.index === i))
      problems.push({ path: `notAsked`, message: `There is no request ${i + 1} in this draw.` });
  if (notAsked.size >= requests.length)
    problems.push({ path: 'notAsked', message: 'At least one request must be asked.' });
  for (const r of requests) {
    if (notAsked.has(r.index)) continue;
    for (const c of rubrics.get(r.rubricVersionId)?.criteria ?? []) {
      const cell = `mark:${r.index}:${c.key}`;
      expected.add(cell);
      const v = input.marks[cell];
      if (v === undefined)
        problems.push({
          path: `marks.${cell}`,
          message: `Request ${r.index + 1}: ${c.label} has no agreed mark.`,
        });
      else if (v > c.maxMark)
        problems.push({
          path: `marks.${cell}`,
          message: `Request ${r.index + 1}: ${c.label} is marked out of ${c.maxMark}.`,
        });
    }
  }
  for (const cell of Object.keys(input.marks))
    if (!expected.has(cell))
      problems.push({
        path: `marks.${cell}`,
        message: `${cell} is not a mark of a request asked on this sheet.`,
      });
  return problems;
}
