import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Not, Repository, type EntityManager } from 'typeorm';
import {
  ADULT_AGE,
  DEFAULT_BAND_POLICY,
  formatClock,
  parseClock,
  type AddCandidatesInput,
  type ChangeSittingStatusInput,
  type CreateResitInput,
  type CreateSittingInput,
  type DaySchedule,
  type DoubleMarkingInput,
  type ExaminerOption,
  type ListSittingsQuery,
  type MoveSlotInput,
  type RecordOutcomeInput,
  type RequirementLine,
  type ScheduleEntry,
  type SittingSummary,
  type SittingView,
  type SwapSlotsInput,
  type UpdateSittingInput,
  type UpdateSlotInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { ClassesService } from '../classes/classes.service.js';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { localDate, now } from '../common/clock.js';
import { conflict, DomainError, ErrorCode, invalid, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { toLineView } from '../requirement-lists/requirement-lists.mapper.js';
import { RequirementListsService } from '../requirement-lists/requirement-lists.service.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { candidateMinutes, paperMinutes, planDay, type DayPlanProblemKind } from './day-plan.js';
import { allocateSecondMarkers, pairKey, spreadIndices } from './double-marking.js';
import { AccessArrangement } from './entities/access-arrangement.entity.js';
import { BandPolicyVersion } from './entities/band-policy.entity.js';
import { SittingExaminer } from './entities/sitting-examiner.entity.js';
import { SittingPaper } from './entities/sitting-paper.entity.js';
import { Sitting } from './entities/sitting.entity.js';
import { Slot } from './entities/slot.entity.js';
import {
  accessTo,
  canRecordOutcome,
  canSeeArrangement,
  canSeeSitting,
  canSeeSlot,
  nextStatusFor,
  seesAsStudentOnly,
  type CallerFacts,
  type SittingAccess,
} from './sitting-access.js';
import { MailService } from '../mail/mail.service.js';
import { asOutboundMail, invitationsFor, sittingCalendar, type InviteSnapshot, type Recipient } from './sitting-invitations.js';
import { ResultsService } from '../results/results.service.js';
import { ReleaseService } from '../results/release.service.js';
import { toSittingSummary, toSittingView, type PaperFacts } from './sittings.mapper.js';
import { clockOf, instantToLocal, localToInstant, NonexistentLocalTime, zoneOffsetMinutes } from './zoned-time.js';

/** Everything one sitting's plan needs, loaded once per change. */
export interface Plan {
  sitting: Sitting;
  papers: PaperFacts[];
  panel: SittingExaminer[];
  /** In the order of the day. */
  slots: Slot[];
  arrangements: Map<string, AccessArrangement>;
}

export type ConflictKind = 'room' | 'candidate' | 'examiner' | DayPlanProblemKind;
export interface PlanConflict {
  kind: ConflictKind;
  slotId?: string;
  message: string;
}

const EDITABLE: Sitting['status'][] = ['draft', 'scheduled'];
const OUTCOME_STATUSES: Sitting['status'][] = ['scheduled', 'in_progress', 'marking_closed'];

const nameOf = (s: Pick<Student, 'givenName' | 'familyName'>) => `${s.givenName} ${s.familyName}`;
const examinerName = (e: SittingExaminer) => e.membership?.person?.displayName ?? 'An examiner';

/** Age in whole years on a date, both YYYY-MM-DD. */
function ageOn(dateOfBirth: string, date: string): number {
  const years = Number(date.slice(0, 4)) - Number(dateOfBirth.slice(0, 4));
  return date.slice(5) >= dateOfBirth.slice(5) ? years : years - 1;
}

/** The number in a list's grade ("3", "Grade 3") for matching a student's grade. */
function gradeNumber(grade: string): number | null {
  const m = /(\d+)/.exec(grade);
  return m ? Number(m[1]) : null;
}

function summarise(items: { message: string }[]): string {
  const first = items[0]!.message;
  return items.length > 1 ? `${first} (and ${items.length - 1} more)` : first;
}

/**
 * Sittings (issue 5): planning a timed mock-exam day, its slots and examiners, conflicts across
 * sittings, access arrangements in the slot lengths, double marking, outcomes, re-sits and
 * invitations. Every change loads the plan under a lock on the sitting, lays the day out again,
 * and refuses the change when anything conflicts.
 */
@Injectable()
export class SittingsService {
  private readonly sittings: ScopedRepository<Sitting>;
  private readonly papers: ScopedRepository<SittingPaper>;
  private readonly panels: ScopedRepository<SittingExaminer>;
  private readonly slots: ScopedRepository<Slot>;
  private readonly arrangements: ScopedRepository<AccessArrangement>;
  private readonly bandPolicies: ScopedRepository<BandPolicyVersion>;
  private readonly listVersions: ScopedRepository<RequirementListVersion>;
  private readonly students: ScopedRepository<Student>;
  private readonly classes: ScopedRepository<ClassGroup>;
  private readonly memberships: ScopedRepository<Membership>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Sitting) sittingRepo: Repository<Sitting>,
    @InjectRepository(SittingPaper) paperRepo: Repository<SittingPaper>,
    @InjectRepository(SittingExaminer) panelRepo: Repository<SittingExaminer>,
    @InjectRepository(Slot) slotRepo: Repository<Slot>,
    @InjectRepository(AccessArrangement) arrangementRepo: Repository<AccessArrangement>,
    @InjectRepository(BandPolicyVersion) bandRepo: Repository<BandPolicyVersion>,
    @InjectRepository(RequirementListVersion) listVersionRepo: Repository<RequirementListVersion>,
    @InjectRepository(Student) studentRepo: Repository<Student>,
    @InjectRepository(ClassGroup) classRepo: Repository<ClassGroup>,
    @InjectRepository(Membership) membershipRepo: Repository<Membership>,
    @InjectRepository(Organisation) private readonly organisations: Repository<Organisation>,
    private readonly audit: AuditService,
    private readonly lists: RequirementListsService,
    private readonly classService: ClassesService,
    private readonly mail: MailService,
    private readonly results: ResultsService,
    private readonly release: ReleaseService,
  ) {
    this.sittings = new ScopedRepository(sittingRepo, 'sitting');
    this.papers = new ScopedRepository(paperRepo, 'requirement list of this sitting');
    this.panels = new ScopedRepository(panelRepo, 'examiner of this sitting');
    this.slots = new ScopedRepository(slotRepo, 'slot');
    this.arrangements = new ScopedRepository(arrangementRepo, 'access arrangement');
    this.bandPolicies = new ScopedRepository(bandRepo, 'band policy');
    this.listVersions = new ScopedRepository(listVersionRepo, 'requirement list version');
    this.students = new ScopedRepository(studentRepo, 'student');
    this.classes = new ScopedRepository(classRepo, 'class');
    this.memberships = new ScopedRepository(membershipRepo, 'examiner');
  }

  // ---------- who is calling ----------

  /**
   * Who the caller is towards sittings. With `sittingId`, `teaches` holds only that sitting's
   * candidates the caller teaches (enough for checks on its slots; a teacher of a large school
   * need not load every pupil on each request).
   */
  async callerFacts(em: EntityManager = this.db.manager, sittingId?: string): Promise<CallerFacts> {
    const caller = RequestContext.requireCaller();
    let teaches = new Set<string>();
    if (caller.roles.includes('teacher')) {
      let q = this.classes
        .withManager(em)
        .qb('c')
        .innerJoin('c.teachers', 't', 't.id = :me', { me: caller.membershipId })
        .innerJoin('c.students', 'st')
        .select('st.id', 'id');
      if (sittingId) q = q.andWhere('st.id IN (SELECT sl.student_id FROM slots sl WHERE sl.sitting_id = :sittingId)', { sittingId });
      const rows = await q.getRawMany<{ id: string }>();
      teaches = new Set(rows.map((r) => r.id));
    }
    const me = caller.roles.includes('student') ? await this.students.withManager(em).findOne({ where: { membershipId: caller.membershipId } }) : null;
    return { caller, teaches, studentId: me?.id ?? null };
  }

  /** Examiner memberships per student, from the classes they teach (own-pupil warnings). */
  private async teachersOf(em: EntityManager, studentIds: string[]): Promise<Map<string, Map<string, string>>> {
    const out = new Map<string, Map<string, string>>();
    if (studentIds.length === 0) return out;
    const rows = await this.classes
      .withManager(em)
      .qb('c')
      .innerJoin('c.teachers', 't')
      .innerJoin('c.students', 'st')
      .andWhere('st.id IN (:...ids)', { ids: [...new Set(studentIds)] })
      .select(['st.id AS "studentId"', 't.id AS "membershipId"', 'c.name AS "className"'])
      .getRawMany<{ studentId: string; membershipId: string; className: string }>();
    for (const r of rows) {
      const m = out.get(r.studentId) ?? new Map<string, string>();
      m.set(r.membershipId, r.className);
      out.set(r.studentId, m);
    }
    return out;
  }

  // ---------- loading ----------

  private async loadPlan(em: EntityManager, id: string, lock: boolean): Promise<Plan> {
    // PostgreSQL cannot lock the nullable side of an outer join: a locked load takes no relations.
    const sitting = await this.sittings
      .withManager(em)
      .getOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : { relations: { plannedBy: { person: true }, bandPolicy: true } }) });
    const [paperRows, panel, slots] = await Promise.all([
      this.papers.withManager(em).find({ where: { sittingId: id }, relations: { listVersion: { lines: { rubricVersion: true } } }, order: { position: 'ASC' } }),
      this.panels.withManager(em).find({ where: { sittingId: id }, relations: { membership: { person: true } }, order: { position: 'ASC' } }),
      this.slots.withManager(em).find({
        where: { sittingId: id },
        relations: { student: { guardians: true, membership: { person: true } }, ownPupilAckBy: true },
        order: { position: 'ASC' },
      }),
    ]);
    const arrangements = await this.arrangementsFor(em, slots.map((s) => s.studentId));
    return { sitting, papers: paperRows.map(toPaperFacts), panel, slots, arrangements };
  }

  private async arrangementsFor(em: EntityManager, studentIds: string[]): Promise<Map<string, AccessArrangement>> {
    if (studentIds.length === 0) return new Map();
    const rows = await this.arrangements.withManager(em).find({ where: { studentId: In([...new Set(studentIds)]) }, relations: { updatedBy: true } });
    return new Map(rows.map((a) => [a.studentId, a]));
  }

  /** A sitting the caller may see, or 404 (another organisation's, or not theirs to see). */
  private async visiblePlan(em: EntityManager, id: string, lock = false): Promise<{ plan: Plan; access: SittingAccess }> {
    const plan = await this.loadPlan(em, id, lock);
    const access = accessTo(await this.callerFacts(em), plan.sitting, plan.panel.map((e) => e.membershipId));
    if (!canSeeSitting(access, plan.sitting, plan.slots)) throw notFound('sitting');
    return { plan, access };
  }

  /** For changes: visible, and the caller planned it (or is an admin); else 404 or 403. */
  private async editablePlan(em: EntityManager, id: string, statuses: Sitting['status'][] = EDITABLE): Promise<{ plan: Plan; access: SittingAccess }> {
    const r = await this.visiblePlan(em, id, true);
    if (!r.access.editor) throw new DomainError(ErrorCode.Forbidden, 'Only the teacher who planned this sitting, or an admin, can change it.');
    if (!statuses.includes(r.plan.sitting.status)) {
      throw conflict(
        r.plan.sitting.status === 'draft'
          ? 'This sitting is still a draft: schedule it first.'
          : `This sitting is ${r.plan.sitting.status.replace('_', ' ')}; its plan can no longer change.`,
      );
    }
    return r;
  }

  private async slotPlan(em: EntityManager, slotId: string): Promise<{ plan: Plan; access: SittingAccess; slot: Slot }> {
    const row = await this.slots.withManager(em).getById(slotId);
    const r = await this.visiblePlan(em, row.sittingId, true);
    const slot = r.plan.slots.find((s) => s.id === slotId)!;
    if (!canSeeSlot(r.access, slot)) throw notFound('slot');
    return { ...r, slot };
  }

  private view(plan: Plan, access: SittingAccess, teachersOf?: Map<string, Map<string, string>>): SittingView {
    return toSittingView(plan, access, {
      canSeeSlot: (s) => canSeeSlot(access, s),
      canSeeArrangement: (s) => canSeeArrangement(access, plan.sitting, s),
      studentOnly: seesAsStudentOnly(access, plan.slots),
      nextStatuses: nextStatusFor(access, plan.sitting.status),
      recordOutcomes: OUTCOME_STATUSES.includes(plan.sitting.status) && plan.slots.some((s) => canRecordOutcome(access, s)),
      ownPupils: teachersOf,
    });
  }

  private async reload(id: string): Promise<SittingView> {
    return this.db.transaction(async (em) => {
      const { plan, access } = await this.visiblePlan(em, id);
      return this.view(plan, access, await this.teachersOf(em, plan.slots.map((s) => s.studentId)));
    });
  }

  // ---------- reading ----------

  async list(q: ListSittingsQuery): Promise<SittingSummary[]> {
    const em = this.db.manager;
    const facts = await this.callerFacts(em);
    const c = facts.caller;
    const qb = this.sittings.qb('s').orderBy('s.date', 'DESC').addOrderBy('s.startsAt', 'ASC').take(200);
    if (q.from) qb.andWhere('s.date >= :from', { from: q.from });
    if (q.to) qb.andWhere('s.date <= :to', { to: q.to });
    if (q.status) qb.andWhere('s.status = :status', { status: q.status });
    if (!c.roles.includes('admin')) {
      const ors: string[] = [];
      if (c.roles.includes('teacher')) {
        ors.push('s.plannedByMembershipId = :me');
        if (facts.teaches.size) ors.push('EXISTS (SELECT 1 FROM slots x WHERE x.sitting_id = s.id AND x.student_id = ANY(:taught))');
      }
      if (c.roles.includes('examiner')) ors.push(`(s.status <> 'draft' AND EXISTS (SELECT 1 FROM sitting_examiners e WHERE e.sitting_id = s.id AND e.membership_id = :me))`);
      if (facts.studentId) ors.push(`(s.status <> 'draft' AND EXISTS (SELECT 1 FROM slots y WHERE y.sitting_id = s.id AND y.student_id = :sid))`);
      if (ors.length === 0) return [];
      qb.andWhere(`(${ors.join(' OR ')})`, { me: c.membershipId, taught: [...facts.teaches], sid: facts.studentId });
    }
    const rows = await qb.getMany();
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.id);
    const [panel, slots, planners] = await Promise.all([
      this.panels.find({ where: { sittingId: In(ids) }, relations: { membership: { person: true } }, order: { position: 'ASC' } }),
      this.slots.find({ where: { sittingId: In(ids) }, order: { position: 'ASC' } }),
      this.memberships.find({ where: { id: In(rows.map((r) => r.plannedByMembershipId).filter((x): x is string => !!x)) }, relations: { person: true } }),
    ]);
    return rows.map((s) => {
      const mine = panel.filter((p) => p.sittingId === s.id);
      const its = slots.filter((x) => x.sittingId === s.id);
      const access = accessTo(facts, s, mine.map((p) => p.membershipId));
      return toSittingSummary(s, mine, its, access, planners.find((m) => m.id === s.plannedByMembershipId) ?? null);
    });
  }

  get(id: string): Promise<SittingView> {
    return this.reload(id);
  }

  /** Members who may examine (the panel is chosen from these). */
  async examinerOptions(): Promise<ExaminerOption[]> {
    const rows = await this.memberships.qb('m').innerJoinAndSelect('m.person', 'p').andWhere('m.active = true').andWhere(`'examiner' = ANY(m.roles)`).orderBy('p.displayName').getMany();
    return rows.map((m) => ({ id: m.id, displayName: m.person!.displayName, email: m.person!.email }));
  }

  // ---------- planning ----------

  async create(input: CreateSittingInput): Promise<SittingView> {
    const caller = RequestContext.requireCaller();
    const org = await this.organisations.findOneByOrFail({ id: caller.organisationId });
    const id = await this.db.transaction(async (em) => {
      const sittings = this.sittings.withManager(em);
      const sitting = sittings.create({
        title: input.title,
        date: input.date,
        room: input.room,
        timeZone: org.timeZone,
        breaks: input.breaks,
        writeUpGapMinutes: input.writeUpGapMinutes,
        changeoverMinutes: input.changeoverMinutes,
        status: 'draft',
        plannedByMembershipId: caller.roles.includes('teacher') ? caller.membershipId : null,
        scheduledAt: null,
        bandPolicyId: null,
        pinnedRubricVersionIds: null,
        revision: 0,
      });
      this.setWindow(sitting, input.date, input.dayStart, input.dayEnd);
      await sittings.save(sitting);
      const plan: Plan = { sitting, papers: [], panel: [], slots: [], arrangements: new Map() };
      await this.setPapers(em, plan, input.papers);
      await this.setPanel(em, plan, input.examinerIds);
      await this.finish(em, plan, { acknowledgeOwnPupil: input.acknowledgeOwnPupil });
      await this.audit.record({ action: 'sitting.created', entity: 'sitting', entityId: sitting.id, after: { ...input } }, em);
      return sitting.id;
    });
    return this.reload(id);
  }

  async update(id: string, input: UpdateSittingInput): Promise<SittingView> {
    await this.change(id, async (em, plan) => {
      const s = plan.sitting;
      const scheduled = s.status !== 'draft';
      if (scheduled && (input.papers !== undefined || input.writeUpGapMinutes !== undefined)) {
        throw new DomainError(
          ErrorCode.Immutable,
          'This sitting is scheduled: its requirement lists and write-up gap are pinned. Plan a new sitting to use other lists.',
          [{ path: input.papers !== undefined ? 'papers' : 'writeUpGapMinutes', message: 'pinned when the sitting was scheduled' }],
        );
      }
      const before = { title: s.title, date: s.date, room: s.room, dayStart: clockOf(s.startsAt, s.timeZone), dayEnd: clockOf(s.endsAt, s.timeZone), breaks: s.breaks };
      if (input.title !== undefined) s.title = input.title;
      if (input.room !== undefined) s.room = input.room;
      if (input.breaks !== undefined) s.breaks = input.breaks;
      if (input.changeoverMinutes !== undefined) s.changeoverMinutes = input.changeoverMinutes;
      if (input.writeUpGapMinutes !== undefined) s.writeUpGapMinutes = input.writeUpGapMinutes;
      if (input.date !== undefined || input.dayStart !== undefined || input.dayEnd !== undefined) {
        const dayStart = input.dayStart ?? before.dayStart;
        const dayEnd = input.dayEnd ?? before.dayEnd;
        if (parseClock(dayEnd) <= parseClock(dayStart)) throw invalid('dayEnd: The day ends after it starts.', [{ path: 'dayEnd', message: 'The day ends after it starts.' }]);
        this.setWindow(s, input.date ?? s.date, dayStart, dayEnd);
        s.date = input.date ?? s.date;
      }
      this.checkBreaksInDay(s);
      if (input.papers !== undefined) await this.setPapers(em, plan, input.papers);
      else if (input.writeUpGapMinutes !== undefined) this.refreshSuggestions(plan);
      if (input.examinerIds !== undefined) await this.setPanel(em, plan, input.examinerIds);
      await this.sittings.withManager(em).save(s);
      return { action: 'sitting.updated', before, after: { ...input } };
    }, { acknowledgeOwnPupil: input.acknowledgeOwnPupil });
    return this.reload(id);
  }

  async remove(id: string): Promise<void> {
    await this.db.transaction(async (em) => {
      const { plan } = await this.editablePlan(em, id, ['draft']);
      const ids = plan.slots.map((s) => s.id);
      if (ids.length) {
        const resits = await this.slots.withManager(em).find({ where: { resitOfSlotId: In(ids), sittingId: Not(id) } });
        if (resits.length) throw conflict('A re-sit in another sitting repeats an attempt in this one; remove that re-sit first.');
      }
      await em.delete(Slot, { sittingId: id, organisationId: plan.sitting.organisationId });
      await em.delete(Sitting, { id, organisationId: plan.sitting.organisationId });
      await this.audit.record({ action: 'sitting.deleted', entity: 'sitting', entityId: id, before: { title: plan.sitting.title, date: plan.sitting.date, room: plan.sitting.room } }, em);
    });
  }

  async addCandidates(id: string, input: AddCandidatesInput): Promise<SittingView & { added: number; skipped: { studentId: string; name: string; reason: string }[] }> {
    const skipped: { studentId: string; name: string; reason: string }[] = [];
    let added = 0;
    await this.change(id, async (em, plan) => {
      const found = new Map<string, Student>();
      if (input.classId) {
        const cls = await this.classService.ownedClass(input.classId, em);
        const members = await this.students.withManager(em).qb('s').innerJoin('s.classes', 'c', 'c.id = :cid', { cid: cls.id }).andWhere('s.active = true').orderBy('s.familyName').addOrderBy('s.givenName').getMany();
        for (const s of members) found.set(s.id, s);
      }
      for (const sid of input.studentIds ?? []) if (!found.has(sid)) found.set(sid, await this.classService.visibleStudent(em, sid));
      const fixedPaper = input.listVersionId ? plan.papers.find((p) => p.paper.listVersionId === input.listVersionId) : undefined;
      if (input.listVersionId && !fixedPaper) throw invalid('listVersionId: That requirement list is not one of this sitting’s lists.', [{ path: 'listVersionId', message: 'not in this sitting' }]);
      const teachers = await this.teachersOf(em, [...found.keys()]);
      let position = plan.slots.length;
      for (const student of found.values()) {
        const name = nameOf(student);
        if (!student.active) {
          skipped.push({ studentId: student.id, name, reason: 'no longer active' });
          continue;
        }
        if (plan.slots.some((s) => s.studentId === student.id && s.resitOfSlotId === null)) {
          skipped.push({ studentId: student.id, name, reason: 'already a candidate in this sitting' });
          continue;
        }
        const paper = fixedPaper ?? plan.papers.find((p) => student.grade !== null && gradeNumber(p.grade) === student.grade);
        if (!paper) {
          skipped.push({ studentId: student.id, name, reason: student.grade === null ? 'no grade recorded; choose a list for them' : `no grade ${student.grade} list in this sitting` });
          continue;
        }
        const slot = this.newSlot(plan, student, paper, position++, teachers.get(student.id));
        plan.slots.push(slot);
        added++;
      }
      plan.arrangements = await this.arrangementsFor(em, plan.slots.map((s) => s.studentId));
      return { action: 'sitting.candidates_added', after: { classId: input.classId ?? null, studentIds: plan.slots.slice(plan.slots.length - added).map((s) => s.studentId), skipped } };
    }, { acknowledgeOwnPupil: input.acknowledgeOwnPupil });
    return { ...(await this.reload(id)), added, skipped };
  }

  async updateSlot(slotId: string, input: UpdateSlotInput): Promise<SittingView> {
    const sittingId = await this.sittingOfSlot(slotId);
    await this.change(sittingId, async (_em, plan) => {
      const slot = this.findSlot(plan, slotId);
      const panel = new Set(plan.panel.map((p) => p.membershipId));
      const before = { examinerId: slot.examinerMembershipId, secondExaminerId: slot.secondExaminerMembershipId, notBefore: slot.notBefore, paperId: slot.paperId };
      if (input.examinerId !== undefined) {
        if (input.examinerId !== null && !panel.has(input.examinerId)) throw invalid('examinerId: Choose an examiner on this sitting’s panel.', [{ path: 'examinerId', message: 'not on the panel' }]);
        slot.examinerMembershipId = input.examinerId;
      }
      if (input.secondExaminerId !== undefined) {
        if (input.secondExaminerId !== null && !panel.has(input.secondExaminerId)) throw invalid('secondExaminerId: Choose an examiner on this sitting’s panel.', [{ path: 'secondExaminerId', message: 'not on the panel' }]);
        slot.secondExaminerMembershipId = input.secondExaminerId;
      }
      if (slot.secondExaminerMembershipId && slot.secondExaminerMembershipId === slot.examinerMembershipId) {
        throw invalid('secondExaminerId: The second examiner must be someone other than the first.', [{ path: 'secondExaminerId', message: 'same as the first examiner' }]);
      }
      if (input.notBefore !== undefined) slot.notBefore = input.notBefore === null ? null : parseClock(input.notBefore);
      if (input.paperId !== undefined) {
        if (!plan.papers.some((p) => p.paper.id === input.paperId)) throw invalid('paperId: Choose one of this sitting’s lists.', [{ path: 'paperId', message: 'not in this sitting' }]);
        slot.paperId = input.paperId;
      }
      if (before.examinerId !== slot.examinerMembershipId || before.secondExaminerId !== slot.secondExaminerMembershipId) this.clearAck(slot);
      return { action: 'slot.updated', entityId: slot.id, before, after: { ...input } };
    }, { acknowledgeOwnPupil: input.acknowledgeOwnPupil });
    return this.reload(sittingId);
  }

  async moveSlot(slotId: string, input: MoveSlotInput): Promise<SittingView> {
    const sittingId = await this.sittingOfSlot(slotId);
    await this.change(sittingId, async (_em, plan) => {
      const i = plan.slots.findIndex((s) => s.id === slotId);
      if (i < 0) throw notFound('slot');
      const j = input.direction === 'earlier' ? i - 1 : i + 1;
      if (j < 0 || j >= plan.slots.length) throw conflict(input.direction === 'earlier' ? 'This slot is already the first of the day.' : 'This slot is already the last of the day.');
      this.swapPositions(plan, i, j);
      return { action: 'slot.moved', entityId: slotId, after: { direction: input.direction } };
    });
    return this.reload(sittingId);
  }

  async swapSlots(slotId: string, input: SwapSlotsInput): Promise<SittingView> {
    const sittingId = await this.sittingOfSlot(slotId);
    await this.change(sittingId, async (_em, plan) => {
      const i = plan.slots.findIndex((s) => s.id === slotId);
      const j = plan.slots.findIndex((s) => s.id === input.withSlotId);
      if (j < 0) throw invalid('withSlotId: Choose another slot of the same sitting.', [{ path: 'withSlotId', message: 'not in this sitting' }]);
      if (i === j) throw invalid('withSlotId: A slot cannot swap with itself.', [{ path: 'withSlotId', message: 'same slot' }]);
      this.swapPositions(plan, i, j);
      return { action: 'slot.swapped', entityId: slotId, after: { withSlotId: input.withSlotId } };
    });
    return this.reload(sittingId);
  }

  async removeSlot(slotId: string): Promise<SittingView> {
    const sittingId = await this.sittingOfSlot(slotId);
    await this.change(sittingId, async (em, plan) => {
      const slot = this.findSlot(plan, slotId);
      if (slot.outcome) throw conflict('This slot has an outcome recorded; it stays on the record.');
      const repeats = await this.slots.withManager(em).count({ where: { resitOfSlotId: slotId } });
      if (repeats) throw conflict('A re-sit repeats this attempt; remove the re-sit first.');
      plan.slots = plan.slots.filter((s) => s.id !== slotId);
      plan.slots.forEach((s, i) => (s.position = i));
      await em.delete(Slot, { id: slotId, organisationId: plan.sitting.organisationId });
      return { action: 'slot.removed', entityId: slotId, before: { studentId: slot.studentId, startsAt: slot.startsAt.toISOString() } };
    });
    return this.reload(sittingId);
  }

  async doubleMarking(id: string, input: DoubleMarkingInput): Promise<SittingView & { notAssigned: { slotId: string; candidate: string; reason: string }[] }> {
    const notAssigned: { slotId: string; candidate: string; reason: string }[] = [];
    await this.change(id, async (em, plan) => {
      if (plan.panel.length < 2) throw conflict('Double marking needs at least two examiners on the panel.');
      const ordered = plan.slots.filter((s) => s.outcome !== 'withdrawn');
      let chosen: Slot[];
      if (input.slotIds) {
        const wanted = new Set(input.slotIds);
        chosen = ordered.filter((s) => wanted.has(s.id));
        if (chosen.length !== wanted.size) throw invalid('slotIds: Every slot must belong to this sitting.', [{ path: 'slotIds', message: 'not in this sitting' }]);
      } else {
        chosen = spreadIndices(ordered.length, input.share ?? 0).map((i) => ordered[i]!);
      }
      const chosenIds = new Set(chosen.map((s) => s.id));
      for (const s of plan.slots) {
        if (!chosenIds.has(s.id) && s.secondExaminerMembershipId) {
          s.secondExaminerMembershipId = null;
          this.clearAck(s);
        }
      }
      const panelIds = plan.panel.map((p) => p.membershipId);
      const teachers = await this.teachersOf(em, chosen.map((s) => s.studentId));
      const busy = await this.busyExaminers(em, plan, chosen, panelIds);
      const history = await this.pairHistory(em, plan.sitting);
      const result = allocateSecondMarkers(
        chosen.map((s) => ({
          id: s.id,
          primaryId: s.examinerMembershipId,
          teachers: new Set(teachers.get(s.studentId)?.keys() ?? []),
          busy: busy.get(s.id) ?? new Set(),
        })),
        panelIds,
        history,
      );
      for (const a of result) {
        const s = this.findSlot(plan, a.slotId);
        if (s.secondExaminerMembershipId !== a.secondId) {
          s.secondExaminerMembershipId = a.secondId;
          this.clearAck(s);
        }
        if (!a.secondId) {
          notAssigned.push({
            slotId: s.id,
            candidate: nameOf(s.student!),
            reason: a.reason === 'no_primary' ? 'the slot has no first examiner yet' : 'every other examiner is busy elsewhere at that time',
          });
        }
      }
      return { action: 'sitting.double_marking', after: { share: input.share ?? null, slotIds: chosen.map((s) => s.id), notAssigned } };
    }, { acknowledgeOwnPupil: input.acknowledgeOwnPupil });
    return { ...(await this.reload(id)), notAssigned };
  }

  async changeStatus(id: string, input: ChangeSittingStatusInput): Promise<SittingView> {
    await this.db.transaction(async (em) => {
      const { plan, access } = await this.visiblePlan(em, id, true);
      const s = plan.sitting;
      const allowed = nextStatusFor(access, s.status);
      if (!allowed.includes(input.status)) {
        const next = nextStatusFor({ ...access, editor: true }, s.status)[0];
        if (next === input.status) throw new DomainError(ErrorCode.Forbidden, 'Only the teacher who planned this sitting, or an admin, can do that.');
        throw conflict(
          next
            ? `A ${s.status.replace('_', ' ')} sitting moves next to ${next.replace('_', ' ')}, not ${input.status.replace('_', ' ')}.`
            : 'This sitting is published; its status is final.',
          [{ path: 'status', message: `from ${s.status}` }],
        );
      }
      const before = { status: s.status };
      const today = localDate(now(), s.timeZone);
      if (input.status === 'scheduled') {
        if (plan.slots.length === 0) throw conflict('Add candidates before scheduling: this sitting has none.');
        if (plan.panel.length === 0) throw conflict('Choose at least one examiner before scheduling.');
        const without = plan.slots.filter((x) => !x.examinerMembershipId);
        if (without.length) throw conflict(`${without.length} slot(s) have no examiner yet, starting with ${nameOf(without[0]!.student!)}.`);
        if (s.date < today) throw conflict(`This sitting is dated ${s.date}, which has passed: change its date first.`);
        await this.finish(em, plan, { acknowledgeOwnPupil: input.acknowledgeOwnPupil, skipInvitations: true });
        await this.pin(em, plan);
        s.status = 'scheduled';
        s.scheduledAt = now();
        s.revision += 1;
        await this.sittings.withManager(em).save(s);
        await this.sendInvitations(em, null, await this.snapshot(em, await this.loadPlan(em, id, false)));
      } else if (input.status === 'in_progress') {
        if (s.date > today) throw conflict(`This sitting is on ${s.date}; it can start on the day, not before (today is ${today}).`);
        s.status = 'in_progress';
        await this.sittings.withManager(em).save(s);
      } else if (input.status === 'marking_closed') {
        const open = plan.slots.filter((x) => !x.outcome);
        if (open.length) throw conflict(`${open.length} slot(s) have no outcome yet (first: ${nameOf(open[0]!.student!)}). Record completed, absent, withdrawn or incomplete for each before closing marking.`);
        s.status = 'marking_closed';
        await this.sittings.withManager(em).save(s);
        // Results are derived as marking closes, in the same transaction (issue 7 §1).
        await this.results.computeForSitting(s.id, em);
      } else {
        // Published means released: refused while a moderation flag is open or a result unreleased.
        const blocked = await this.release.publishBlocker(em, s.id);
        if (blocked) throw conflict(blocked);
        s.status = 'published';
        await this.sittings.withManager(em).save(s);
      }
      await this.audit.record({ action: `sitting.${input.status}`, entity: 'sitting', entityId: s.id, before, after: { status: s.status } }, em);
    });
    this.mail.afterCommit();
    return this.reload(id);
  }

  async recordOutcome(slotId: string, input: RecordOutcomeInput): Promise<SittingView> {
    const sittingId = await this.db.transaction(async (em) => {
      const { plan, access, slot } = await this.slotPlan(em, slotId);
      if (!canRecordOutcome(access, slot)) throw new DomainError(ErrorCode.Forbidden, 'Only the slot’s examiners, the candidate’s teachers, the planner or an admin can record its outcome.');
      const s = plan.sitting;
      if (!OUTCOME_STATUSES.includes(s.status)) {
        throw conflict(s.status === 'draft' ? 'Schedule the sitting before recording outcomes.' : 'Results are published; outcomes can no longer change.');
      }
      if (input.outcome !== 'withdrawn' && now() < slot.startsAt) {
        // A candidate may be taken early: once an examiner has started the slot on the marking
        // desk (a mark sheet exists), it has begun, whatever the planned time.
        const started = ((await em.query(`SELECT 1 FROM mark_sheets WHERE slot_id = $1 LIMIT 1`, [slot.id])) as unknown[]).length > 0;
        if (!started) {
          throw conflict(`${nameOf(slot.student!)}'s slot starts at ${clockOf(slot.startsAt, s.timeZone)} on ${s.date}; only a withdrawal can be recorded before then.`);
        }
      }
      const before = { outcome: slot.outcome, note: slot.outcomeNote };
      slot.outcome = input.outcome;
      slot.outcomeNote = input.note || null;
      slot.outcomeRecordedAt = now();
      slot.outcomeRecordedByPersonId = access.caller.personId;
      await this.slots.withManager(em).save(slot);
      await this.audit.record({ action: 'slot.outcome_recorded', entity: 'slot', entityId: slot.id, before, after: { outcome: slot.outcome, note: slot.outcomeNote } }, em);
      // After marking closed, results follow the outcome (a withdrawn slot loses its result).
      if (s.status === 'marking_closed') await this.results.computeForSitting(s.id, em);
      return s.id;
    });
    return this.reload(sittingId);
  }

  async createResit(slotId: string, input: CreateResitInput): Promise<SittingView> {
    const original = await this.db.transaction(async (em) => {
      const { plan, slot } = await this.slotPlan(em, slotId);
      if (!slot.outcome) throw conflict('Record the outcome of this attempt first; a re-sit repeats an attempt that took place or was missed.');
      const paper = plan.papers.find((p) => p.paper.id === slot.paperId)!;
      return { slot, paper, sittingId: plan.sitting.id };
    });
    const statuses: Sitting['status'][] = ['draft', 'scheduled', 'in_progress'];
    await this.change(input.sittingId, async (em, plan) => {
      const repeats = await this.slots.withManager(em).findOne({ where: { resitOfSlotId: slotId } });
      if (repeats) throw conflict('This attempt already has a re-sit.');
      const paper =
        plan.papers.find((p) => p.paper.listVersionId === original.paper.paper.listVersionId) ?? plan.papers.find((p) => p.listId === original.paper.listId);
      if (!paper) throw conflict(`The sitting for the re-sit has no ${original.paper.name} list: add one, or choose another sitting.`, [{ path: 'sittingId', message: 'no list of the same lineage' }]);
      // Later the same day in the same sitting is fine; another sitting must not have them already.
      if (plan.sitting.id !== original.sittingId && plan.slots.some((s) => s.studentId === original.slot.studentId)) {
        throw conflict(`${nameOf(original.slot.student!)} is already a candidate in that sitting.`);
      }
      const teachers = await this.teachersOf(em, [original.slot.studentId]);
      const slot = this.newSlot(plan, original.slot.student!, paper, plan.slots.length, teachers.get(original.slot.studentId));
      slot.resitOfSlotId = slotId;
      plan.slots.push(slot);
      plan.arrangements = await this.arrangementsFor(em, plan.slots.map((s) => s.studentId));
      return { action: 'slot.resit_created', after: { resitOfSlotId: slotId, studentId: original.slot.studentId } };
    }, { acknowledgeOwnPupil: input.acknowledgeOwnPupil, statuses });
    return this.reload(input.sittingId);
  }

  // ---------- outputs ----------

  async calendar(id: string): Promise<{ filename: string; ics: string }> {
    return this.db.transaction(async (em) => {
      const { plan, access } = await this.visiblePlan(em, id);
      const snap = await this.snapshot(em, plan);
      snap.slots = snap.slots.filter((x) => canSeeSlot(access, this.findSlot(plan, x.id)));
      const slug = plan.sitting.title.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'sitting';
      return { filename: `${plan.sitting.date}-${slug}.ics`, ics: sittingCalendar(snap, now()) };
    });
  }

  async daySchedule(date: string): Promise<DaySchedule> {
    const caller = RequestContext.requireCaller();
    const org = await this.organisations.findOneByOrFail({ id: caller.organisationId });
    return this.db.transaction(async (em) => {
      const rows = await this.sittings.withManager(em).find({ where: { date }, order: { startsAt: 'ASC' } });
      const rooms = new Map<string, ScheduleEntry[]>();
      const examiners = new Map<string, { examiner: { id: string; displayName: string }; entries: ScheduleEntry[] }>();
      const facts = await this.callerFacts(em);
      for (const row of rows) {
        const plan = await this.loadPlan(em, row.id, false);
        const access = accessTo(facts, plan.sitting, plan.panel.map((e) => e.membershipId));
        if (!canSeeSitting(access, plan.sitting, plan.slots) || seesAsStudentOnly(access, plan.slots)) continue;
        const name = new Map(plan.panel.map((p) => [p.membershipId, examinerName(p)]));
        for (const slot of plan.slots.filter((x) => canSeeSlot(access, x))) {
          const paper = plan.papers.find((p) => p.paper.id === slot.paperId)!;
          const entry: ScheduleEntry = {
            slotId: slot.id,
            sittingId: row.id,
            sittingTitle: row.title,
            room: row.room,
            startTime: clockOf(slot.startsAt, row.timeZone),
            endTime: clockOf(slot.endsAt, row.timeZone),
            startsAt: slot.startsAt.toISOString(),
            endsAt: slot.endsAt.toISOString(),
            candidate: nameOf(slot.student!),
            listName: paper.name,
            examiner: slot.examinerMembershipId ? (name.get(slot.examinerMembershipId) ?? null) : null,
            secondExaminer: slot.secondExaminerMembershipId ? (name.get(slot.secondExaminerMembershipId) ?? null) : null,
            outcome: slot.outcome,
          };
          const key = row.room.trim();
          rooms.set(key, [...(rooms.get(key) ?? []), entry]);
          for (const mid of [slot.examinerMembershipId, slot.secondExaminerMembershipId]) {
            if (!mid) continue;
            // An examiner sees only their own column of the day.
            if (!access.editor && !access.teaches.has(slot.studentId) && mid !== caller.membershipId) continue;
            const e = examiners.get(mid) ?? { examiner: { id: mid, displayName: name.get(mid) ?? 'An examiner' }, entries: [] };
            e.entries.push(entry);
            examiners.set(mid, e);
          }
        }
      }
      const byStart = (a: ScheduleEntry, b: ScheduleEntry) => a.startsAt.localeCompare(b.startsAt);
      return {
        date,
        timeZone: org.timeZone,
        rooms: [...rooms.entries()].sort(([a], [b]) => a.localeCompare(b, 'en')).map(([room, entries]) => ({ room, entries: entries.sort(byStart) })),
        examiners: [...examiners.values()].sort((a, b) => a.examiner.displayName.localeCompare(b.examiner.displayName, 'en')).map((e) => ({ ...e, entries: e.entries.sort(byStart) })),
      };
    });
  }

  // ---------- the machinery of a change ----------

  /**
   * One change to a sitting: lock and load the plan, apply `fn`, lay the day out again, refuse on
   * any conflict, record the audit event, and tell those whose times changed (once scheduled).
   */
  private async change(
    id: string,
    fn: (em: EntityManager, plan: Plan) => Promise<{ action: string; entityId?: string; before?: object; after?: object }>,
    opts: { acknowledgeOwnPupil?: boolean | undefined; statuses?: Sitting['status'][] } = {},
  ): Promise<void> {
    await this.db.transaction(async (em) => {
      const { plan } = await this.editablePlan(em, id, opts.statuses ?? EDITABLE);
      const before = plan.sitting.status === 'draft' ? null : await this.snapshot(em, plan);
      const event = await fn(em, plan);
      if (plan.sitting.status !== 'draft') plan.sitting.revision += 1;
      await this.finish(em, plan, { acknowledgeOwnPupil: opts.acknowledgeOwnPupil, skipInvitations: true });
      await this.sittings.withManager(em).save(plan.sitting);
      await this.audit.record({ action: event.action, entity: event.entityId ? 'slot' : 'sitting', entityId: event.entityId ?? id, before: event.before ?? null, after: event.after ?? null }, em);
      // Reloaded so new candidates come with their guardians and sign-in addresses.
      if (before) await this.sendInvitations(em, before, await this.snapshot(em, await this.loadPlan(em, id, false)));
    });
    this.mail.afterCommit();
  }

  /** Lays out, checks conflicts and own pupils, saves the slots. */
  private async finish(em: EntityManager, plan: Plan, opts: { acknowledgeOwnPupil?: boolean | undefined; skipInvitations?: boolean }): Promise<void> {
    const problems: PlanConflict[] = this.relayout(plan);
    problems.push(...(await this.conflicts(em, plan)));
    if (problems.length) throw conflict(summarise(problems), { kind: 'conflicts', conflicts: problems });
    const warnings = await this.ownPupilWarnings(em, plan);
    if (warnings.length && !opts.acknowledgeOwnPupil) {
      throw conflict(`${summarise(warnings)} Go ahead only if no other examiner can mark this candidate; your acknowledgement is recorded.`, { kind: 'own_pupil', warnings });
    }
    const caller = RequestContext.requireCaller();
    for (const w of warnings) {
      const slot = this.findSlot(plan, w.slotId);
      slot.ownPupilAckByPersonId = caller.personId;
      slot.ownPupilAckAt = now();
    }
    await this.slots.withManager(em).saveMany(plan.slots);
    for (const w of warnings) {
      await this.audit.record({ action: 'slot.own_pupil_acknowledged', entity: 'slot', entityId: w.slotId, after: { examinerIds: w.examinerIds, message: w.message } }, em);
    }
  }

  /** Lengths from the papers and access arrangements, then the day's layout; returns problems. */
  relayout(plan: Plan): PlanConflict[] {
    const s = plan.sitting;
    const tz = s.timeZone;
    const dayStart = instantToLocal(s.startsAt, tz).minutes;
    const dayEnd = instantToLocal(s.endsAt, tz).minutes;
    const paperById = new Map(plan.papers.map((p) => [p.paper.id, p]));
    const lengths = plan.slots.map((slot) => {
      const paper = paperById.get(slot.paperId);
      if (!paper) throw new Error(`slot ${slot.id} names a paper of another sitting`);
      const a = plan.arrangements.get(slot.studentId);
      return candidateMinutes({
        list: paper.list,
        writeUpGapMinutes: s.writeUpGapMinutes,
        fixedMinutes: paper.paper.slotMinutes,
        extraTimePercent: a?.extraTimePercent ?? 0,
        restBreakMinutes: a?.restBreakMinutes ?? 0,
        substitutions: a?.substitutions ?? [],
      });
    });
    const result = planDay({
      dayStart,
      dayEnd,
      changeoverMinutes: s.changeoverMinutes,
      breaks: s.breaks.map((b) => ({ start: parseClock(b.start), end: parseClock(b.end), ...(b.label ? { label: b.label } : {}) })),
      slots: plan.slots.map((slot, i) => ({ id: slot.id, name: nameOf(slot.student!), minutes: lengths[i]!, notBefore: slot.notBefore })),
    });
    plan.slots.forEach((slot, i) => {
      const p = result.placed[i]!;
      slot.position = i;
      slot.minutes = lengths[i]!;
      // Past the end of the day: keep a valid instant for the message; the change is refused anyway.
      slot.startsAt = localToInstant(s.date, Math.min(p.start, 1439), tz);
      slot.endsAt = new Date(slot.startsAt.getTime() + lengths[i]! * 60_000);
    });
    return result.problems.map((p) => ({ kind: p.kind, slotId: p.slotId, message: p.message }));
  }

  /** Room, candidates and examiners against every other sitting of the organisation. */
  private async conflicts(em: EntityManager, plan: Plan): Promise<PlanConflict[]> {
    const s = plan.sitting;
    const out: PlanConflict[] = [];
    const other = (x: Sitting) => `"${x.title}" (${x.room}, ${x.date})`;
    const rooms = await this.sittings
      .withManager(em)
      .qb('o')
      .andWhere('o.id <> :id', { id: s.id ?? '00000000-0000-0000-0000-000000000000' })
      .andWhere('lower(btrim(o.room)) = lower(btrim(:room))', { room: s.room })
      .andWhere('o.startsAt < :end AND o.endsAt > :start', { start: s.startsAt, end: s.endsAt })
      .getMany();
    for (const o of rooms) {
      out.push({
        kind: 'room',
        message: `${o.room} is already booked from ${clockOf(o.startsAt, o.timeZone)} to ${clockOf(o.endsAt, o.timeZone)} for ${other(o)}.`,
      });
    }
    const live = plan.slots.filter((x) => x.outcome !== 'withdrawn');
    if (live.length === 0) return out;
    const from = new Date(Math.min(...live.map((x) => x.startsAt.getTime())));
    const to = new Date(Math.max(...live.map((x) => x.endsAt.getTime())));
    const elsewhere = (extra: (qb: ReturnType<ScopedRepository<Slot>['qb']>) => void) => {
      const qb = this.slots
        .withManager(em)
        .qb('x')
        .innerJoinAndSelect('x.sitting', 'xs')
        .andWhere('x.sittingId <> :id', { id: s.id ?? '00000000-0000-0000-0000-000000000000' })
        .andWhere(`(x.outcome IS NULL OR x.outcome <> 'withdrawn')`)
        .andWhere('x.startsAt < :to AND x.endsAt > :from', { from, to });
      extra(qb);
      return qb.getMany();
    };
    const overlap = (a: Slot, b: Slot) => a.startsAt < b.endsAt && b.startsAt < a.endsAt;
    const here = (x: Slot) => `${clockOf(x.startsAt, s.timeZone)}–${clockOf(x.endsAt, s.timeZone)}`;
    const there = (x: Slot) => `${clockOf(x.startsAt, x.sitting!.timeZone)} to ${clockOf(x.endsAt, x.sitting!.timeZone)}`;

    const byStudent = await elsewhere((qb) => qb.andWhere('x.studentId IN (:...sids)', { sids: [...new Set(live.map((x) => x.studentId))] }));
    for (const mine of live) {
      for (const o of byStudent.filter((x) => x.studentId === mine.studentId && overlap(mine, x))) {
        out.push({
          kind: 'candidate',
          slotId: mine.id,
          message: `${nameOf(mine.student!)} is already a candidate in ${other(o.sitting!)} from ${there(o)}; here the slot would be ${here(mine)}.`,
        });
      }
    }
    const examinerIds = [...new Set(live.flatMap((x) => [x.examinerMembershipId, x.secondExaminerMembershipId]).filter((x): x is string => !!x))];
    if (examinerIds.length) {
      const byExaminer = await elsewhere((qb) => qb.andWhere('(x.examinerMembershipId IN (:...eids) OR x.secondExaminerMembershipId IN (:...eids))', { eids: examinerIds }));
      const name = new Map(plan.panel.map((p) => [p.membershipId, examinerName(p)]));
      for (const mine of live) {
        for (const mid of [mine.examinerMembershipId, mine.secondExaminerMembershipId]) {
          if (!mid) continue;
          const clash = byExaminer.find((x) => (x.examinerMembershipId === mid || x.secondExaminerMembershipId === mid) && overlap(mine, x));
          if (clash) {
            out.push({
              kind: 'examiner',
              slotId: mine.id,
              message: `${name.get(mid) ?? 'An examiner'} is examining in ${other(clash.sitting!)} from ${there(clash)}, so cannot also mark ${nameOf(mine.student!)} here at ${here(mine)}.`,
            });
          }
        }
      }
    }
    return out;
  }

  private async ownPupilWarnings(em: EntityManager, plan: Plan): Promise<{ slotId: string; examinerIds: string[]; message: string }[]> {
    const teachers = await this.teachersOf(em, plan.slots.map((s) => s.studentId));
    const name = new Map(plan.panel.map((p) => [p.membershipId, examinerName(p)]));
    const out: { slotId: string; examinerIds: string[]; message: string }[] = [];
    for (const slot of plan.slots) {
      if (slot.ownPupilAckAt) continue;
      const theirs = teachers.get(slot.studentId);
      const who = [slot.examinerMembershipId, slot.secondExaminerMembershipId].filter((m): m is string => !!m && !!theirs?.has(m));
      if (who.length === 0) continue;
      out.push({
        slotId: slot.id,
        examinerIds: who,
        message: who.map((m) => `${name.get(m) ?? 'An examiner'} teaches ${nameOf(slot.student!)} (${theirs!.get(m)}) and would mark their slot.`).join(' '),
      });
    }
    return out;
  }

  /** Panel examiners busy in another sitting during each slot (double-marking candidates). */
  private async busyExaminers(em: EntityManager, plan: Plan, slots: Slot[], panel: string[]): Promise<Map<string, Set<string>>> {
    const out = new Map<string, Set<string>>();
    if (slots.length === 0) return out;
    const others = await this.slots
      .withManager(em)
      .qb('x')
      .andWhere('x.sittingId <> :id', { id: plan.sitting.id })
      .andWhere('(x.examinerMembershipId IN (:...p) OR x.secondExaminerMembershipId IN (:...p))', { p: panel })
      .andWhere('x.startsAt < :to AND x.endsAt > :from', {
        from: new Date(Math.min(...slots.map((s) => s.startsAt.getTime()))),
        to: new Date(Math.max(...slots.map((s) => s.endsAt.getTime()))),
      })
      .getMany();
    for (const s of slots) {
      const set = new Set<string>();
      for (const o of others) {
        if (!(o.startsAt < s.endsAt && s.startsAt < o.endsAt)) continue;
        if (o.examinerMembershipId) set.add(o.examinerMembershipId);
        if (o.secondExaminerMembershipId) set.add(o.secondExaminerMembershipId);
      }
      out.set(s.id, set);
    }
    return out;
  }

  /** How often each pair of examiners double-marked together in the past year of other sittings. */
  private async pairHistory(em: EntityManager, sitting: Sitting): Promise<Map<string, number>> {
    const rows = await this.slots
      .withManager(em)
      .qb('x')
      .andWhere('x.sittingId <> :id', { id: sitting.id })
      .andWhere('x.secondExaminerMembershipId IS NOT NULL AND x.examinerMembershipId IS NOT NULL')
      .andWhere('x.startsAt > :since', { since: new Date(sitting.startsAt.getTime() - 365 * 86_400_000) })
      .getMany();
    const out = new Map<string, number>();
    for (const r of rows) {
      const k = pairKey(r.examinerMembershipId!, r.secondExaminerMembershipId!);
      out.set(k, (out.get(k) ?? 0) + 1);
    }
    return out;
  }

  /** Pins the versions the sitting uses (issue 5 §1): lists, their rubrics, the band policy. */
  private async pin(em: EntityManager, plan: Plan): Promise<void> {
    for (const p of plan.papers) await this.lists.markUsed(p.paper.listVersionId, em);
    const rubrics = new Set<string>();
    for (const p of plan.papers) for (const l of p.list.lines) rubrics.add(l.rubricVersionId);
    plan.sitting.pinnedRubricVersionIds = [...rubrics].sort();
    plan.sitting.bandPolicyId = (await this.currentBandPolicy(em)).id;
  }

  /** The organisation's newest band policy version; version 1 is the default policy (design.md §4.1). */
  async currentBandPolicy(em: EntityManager): Promise<BandPolicyVersion> {
    const repo = this.bandPolicies.withManager(em);
    const latest = await repo.findOne({ where: {}, order: { version: 'DESC' } });
    if (latest) return latest;
    await em.query(
      `INSERT INTO band_policies (organisation_id, version, bands, below) VALUES ($1, 1, $2, $3) ON CONFLICT (organisation_id, version) DO NOTHING`,
      [RequestContext.requireCaller().organisationId, JSON.stringify(DEFAULT_BAND_POLICY.bands), JSON.stringify(DEFAULT_BAND_POLICY.below)],
    );
    return repo.getOne({ where: { version: 1 } });
  }

  // ---------- small steps ----------

  private setWindow(s: Sitting, date: string, dayStart: string, dayEnd: string): void {
    try {
      s.startsAt = localToInstant(date, parseClock(dayStart), s.timeZone);
      s.endsAt = localToInstant(date, parseClock(dayEnd), s.timeZone);
    } catch (err) {
      if (err instanceof NonexistentLocalTime) throw invalid(`dayStart: ${err.message}`, [{ path: 'dayStart', message: err.message }]);
      throw err;
    }
    // A plan in wall-clock minutes is exact only when no clock change falls inside the day.
    if (zoneOffsetMinutes(s.startsAt, s.timeZone) !== zoneOffsetMinutes(s.endsAt, s.timeZone)) {
      throw invalid(`The clocks change in ${s.timeZone} between ${dayStart} and ${dayEnd} on ${date}; start the day after the change.`, [
        { path: 'dayStart', message: 'the clocks change during the day' },
      ]);
    }
  }

  private checkBreaksInDay(s: Sitting): void {
    const start = instantToLocal(s.startsAt, s.timeZone).minutes;
    const end = instantToLocal(s.endsAt, s.timeZone).minutes;
    s.breaks.forEach((b, i) => {
      if (parseClock(b.start) < start || parseClock(b.end) > end) {
        throw invalid(`breaks.${i}.start: A break lies inside the day (${formatClock(start)}–${formatClock(end)}).`, [{ path: `breaks.${i}.start`, message: 'outside the day' }]);
      }
    });
  }

  private async setPapers(em: EntityManager, plan: Plan, input: CreateSittingInput['papers']): Promise<void> {
    const ids = input.map((p) => p.listVersionId);
    const versions = await this.listVersions.withManager(em).find({ where: { id: In(ids) }, relations: { lines: { rubricVersion: true } } });
    input.forEach((p, i) => {
      const v = versions.find((x) => x.id === p.listVersionId);
      if (!v) throw invalid(`papers.${i}.listVersionId: No such requirement list version.`, [{ path: `papers.${i}.listVersionId`, message: 'not found' }]);
      if (v.status !== 'published') throw invalid(`papers.${i}.listVersionId: "${v.name}" version ${v.version} is a draft; a sitting uses published lists only.`, [{ path: `papers.${i}.listVersionId`, message: 'draft' }]);
      if (p.slotMinutes != null && p.slotMinutes <= plan.sitting.writeUpGapMinutes) {
        throw invalid(`papers.${i}.slotMinutes: A slot must be longer than the ${plan.sitting.writeUpGapMinutes}-minute write-up gap it includes.`, [{ path: `papers.${i}.slotMinutes`, message: 'not longer than the write-up gap' }]);
      }
    });
    const keep = new Set(ids);
    const dropped = plan.papers.filter((p) => !keep.has(p.paper.listVersionId));
    for (const d of dropped) {
      const using = plan.slots.filter((s) => s.paperId === d.paper.id);
      if (using.length) {
        throw conflict(`${using.length} candidate(s) take ${d.name} (first: ${nameOf(using[0]!.student!)}); move them to another list or remove them before dropping it.`, [
          { path: 'papers', message: `in use: ${d.name}` },
        ]);
      }
    }
    const repo = this.papers.withManager(em);
    if (dropped.length) await em.delete(SittingPaper, { id: In(dropped.map((d) => d.paper.id)), organisationId: plan.sitting.organisationId });
    const next: PaperFacts[] = [];
    for (const [position, p] of input.entries()) {
      const v = versions.find((x) => x.id === p.listVersionId)!;
      const existing = plan.papers.find((x) => x.paper.listVersionId === p.listVersionId)?.paper;
      const row = existing ?? repo.create({ sittingId: plan.sitting.id, listVersionId: v.id, position, suggestedMinutes: 1, slotMinutes: null });
      row.position = position;
      row.slotMinutes = p.slotMinutes ?? null;
      row.listVersion = v;
      const facts = toPaperFacts(row);
      try {
        row.suggestedMinutes = paperMinutes(facts.list, plan.sitting.writeUpGapMinutes, null);
      } catch (err) {
        throw invalid(`papers.${position}.listVersionId: "${v.name}" cannot be timed: ${(err as Error).message}`, [{ path: `papers.${position}.listVersionId`, message: (err as Error).message }]);
      }
      const saved = await repo.save(row);
      saved.listVersion = v;
      next.push(toPaperFacts(saved));
    }
    plan.papers = next;
  }

  private refreshSuggestions(plan: Plan): void {
    for (const p of plan.papers) p.paper.suggestedMinutes = paperMinutes(p.list, plan.sitting.writeUpGapMinutes, null);
  }

  private async setPanel(em: EntityManager, plan: Plan, examinerIds: string[]): Promise<void> {
    const members = examinerIds.length ? await this.memberships.withManager(em).find({ where: { id: In(examinerIds) }, relations: { person: true } }) : [];
    examinerIds.forEach((mid, i) => {
      const m = members.find((x) => x.id === mid);
      if (!m || !m.active || !m.roles.includes('examiner')) {
        throw invalid(`examinerIds.${i}: Choose an active member with the examiner role.`, [{ path: `examinerIds.${i}`, message: 'not an examiner here' }]);
      }
    });
    const repo = this.panels.withManager(em);
    const keep = new Set(examinerIds);
    const gone = plan.panel.filter((p) => !keep.has(p.membershipId));
    if (gone.length) await em.delete(SittingExaminer, { id: In(gone.map((g) => g.id)), organisationId: plan.sitting.organisationId });
    const next: SittingExaminer[] = [];
    for (const [position, mid] of examinerIds.entries()) {
      const row = plan.panel.find((p) => p.membershipId === mid) ?? repo.create({ sittingId: plan.sitting.id, membershipId: mid, position });
      row.position = position;
      const saved = await repo.save(row);
      saved.membership = members.find((m) => m.id === mid)!;
      next.push(saved);
    }
    plan.panel = next;
    // Slots marked by someone no longer on the panel go to the new lead; a second marker just goes.
    const lead = next[0]?.membershipId ?? null;
    for (const s of plan.slots) {
      if (s.examinerMembershipId === null || !keep.has(s.examinerMembershipId)) {
        s.examinerMembershipId = lead;
        this.clearAck(s);
      }
      if (s.secondExaminerMembershipId && (!keep.has(s.secondExaminerMembershipId) || s.secondExaminerMembershipId === s.examinerMembershipId)) {
        s.secondExaminerMembershipId = null;
        this.clearAck(s);
      }
    }
  }

  private newSlot(plan: Plan, student: Student, paper: PaperFacts, position: number, teachers?: Map<string, string>): Slot {
    // The first panel examiner who does not teach the candidate; else the lead (a warning follows).
    const panel = plan.panel.map((p) => p.membershipId);
    const examiner = panel.find((m) => !teachers?.has(m)) ?? panel[0] ?? null;
    const slot = this.slots.create({
      // An id before saving, so the layout and its messages can name the new slot.
      id: randomUUID(),
      sittingId: plan.sitting.id,
      paperId: paper.paper.id,
      studentId: student.id,
      position,
      notBefore: null,
      examinerMembershipId: examiner,
      secondExaminerMembershipId: null,
      outcome: null,
      outcomeNote: null,
      outcomeRecordedAt: null,
      outcomeRecordedByPersonId: null,
      resitOfSlotId: null,
      ownPupilAckByPersonId: null,
      ownPupilAckAt: null,
    });
    slot.student = student;
    return slot;
  }

  private clearAck(s: Slot): void {
    s.ownPupilAckAt = null;
    s.ownPupilAckByPersonId = null;
  }

  private swapPositions(plan: Plan, i: number, j: number): void {
    const a = plan.slots[i]!;
    plan.slots[i] = plan.slots[j]!;
    plan.slots[j] = a;
  }

  private findSlot(plan: Plan, id: string): Slot {
    const s = plan.slots.find((x) => x.id === id);
    if (!s) throw notFound('slot');
    return s;
  }

  private async sittingOfSlot(slotId: string): Promise<string> {
    return (await this.slots.getById(slotId)).sittingId;
  }

  // ---------- invitations ----------

  private recipientsOf(slot: Slot, date: string): Recipient[] {
    const st = slot.student!;
    const name = nameOf(st);
    const own = st.email ?? st.membership?.person?.email ?? null;
    const guardians = (st.guardians ?? []).map((g) => ({ address: g.email, name: g.name }));
    // Minors' mail goes to their guardians (design.md §2); the candidate's own address only as a fallback.
    if (ageOn(st.dateOfBirth, date) < ADULT_AGE && guardians.length) return guardians;
    return own ? [{ address: own, name }] : guardians;
  }

  async snapshot(em: EntityManager, plan: Plan): Promise<InviteSnapshot> {
    const org = await em.getRepository(Organisation).findOneByOrFail({ id: plan.sitting.organisationId });
    const paperName = new Map(plan.papers.map((p) => [p.paper.id, p.name]));
    return {
      sittingId: plan.sitting.id,
      title: plan.sitting.title,
      room: plan.sitting.room,
      date: plan.sitting.date,
      timeZone: plan.sitting.timeZone,
      organisationName: org.name,
      revision: plan.sitting.revision,
      slots: plan.slots
        .filter((s) => s.outcome !== 'withdrawn')
        .map((s) => ({
          id: s.id,
          startsAt: new Date(s.startsAt),
          endsAt: new Date(s.endsAt),
          candidateName: nameOf(s.student!),
          listName: paperName.get(s.paperId) ?? '',
          examinerId: s.examinerMembershipId,
          secondExaminerId: s.secondExaminerMembershipId,
          recipients: this.recipientsOf(s, plan.sitting.date),
        })),
      examiners: plan.panel.map((p) => ({ id: p.membershipId, name: examinerName(p), address: p.membership!.person!.email })),
    };
  }

  private async sendInvitations(em: EntityManager, before: InviteSnapshot | null, after: InviteSnapshot): Promise<void> {
    const mails = invitationsFor(before, after, now());
    const organisationId = RequestContext.requireCaller().organisationId;
    // OutboundMail rows in this transaction, like every e-mail: a rolled-back change sends nothing.
    if (mails.length) await this.mail.enqueue(em, mails.map((m) => asOutboundMail(organisationId, after.sittingId, m)));
  }

  // ---------- access arrangements (relayout of the sittings they touch) ----------

  /**
   * After an arrangement changes, every draft or scheduled sitting with this candidate is laid out
   * again in the same transaction: a change that would push a slot past the day's end or into a
   * conflict is refused, and those whose times change are told.
   */
  async relayoutForStudent(em: EntityManager, studentId: string): Promise<void> {
    const rows = await this.slots
      .withManager(em)
      .qb('x')
      .innerJoin('x.sitting', 's')
      .andWhere('x.studentId = :sid', { sid: studentId })
      .andWhere(`s.status IN ('draft', 'scheduled')`)
      .select('DISTINCT x.sittingId', 'sittingId')
      .getRawMany<{ sittingId: string }>();
    for (const { sittingId } of rows) {
      const plan = await this.loadPlan(em, sittingId, true);
      const before = plan.sitting.status === 'draft' ? null : await this.snapshot(em, plan);
      if (before) plan.sitting.revision += 1;
      const problems: PlanConflict[] = this.relayout(plan);
      problems.push(...(await this.conflicts(em, plan)));
      if (problems.length) throw conflict(`In "${plan.sitting.title}" (${plan.sitting.date}): ${summarise(problems)}`, { kind: 'conflicts', conflicts: problems });
      await this.slots.withManager(em).saveMany(plan.slots);
      await this.sittings.withManager(em).save(plan.sitting);
      if (before) await this.sendInvitations(em, before, await this.snapshot(em, plan));
    }
  }

  afterCommit(): void {
    this.mail.afterCommit();
  }

  /** Used by the arrangements service: may the caller see this slot's arrangement (examiner while marking)? */
  async examinerMarksStudentNow(em: EntityManager, studentId: string): Promise<boolean> {
    const caller = RequestContext.requireCaller();
    if (!caller.roles.includes('examiner')) return false;
    const n = await this.slots
      .withManager(em)
      .qb('x')
      .innerJoin('x.sitting', 's')
      .andWhere('x.studentId = :sid', { sid: studentId })
      .andWhere(`s.status = 'in_progress'`)
      .andWhere('(x.examinerMembershipId = :me OR x.secondExaminerMembershipId = :me)', { me: caller.membershipId })
      .getCount();
    return n > 0;
  }
}

function toPaperFacts(paper: SittingPaper): PaperFacts {
  const v = paper.listVersion;
  if (!v?.lines) throw new Error('sitting paper loaded without its list version and lines');
  const lines: RequirementLine[] = [...v.lines].sort((a, b) => a.position - b.position).map(toLineView);
  return { paper, list: { lines, selectionRule: v.selectionRule }, name: v.name, grade: v.grade, version: v.version, listId: v.listId };
}
