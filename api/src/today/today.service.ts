import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { LessThanOrEqual, MoreThanOrEqual, Repository } from 'typeorm';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { localDate, now } from '../common/clock.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Term } from '../organisations/entities/term.entity.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';

export interface TodayView {
  date: string;
  timeZone: string;
  organisationName: string;
  roles: string[];
  admin?: { people: number; students: number; classes: number; term: { name: string; startsOn: string; endsOn: string } | null };
  teacher?: { classes: { id: string; name: string; code: string; grade: number | null; studentCount: number }[] };
  examiner?: {
    sittings: { id: string; title: string; room: string; startsAt: string; endsAt: string; status: string; mySlots: number }[];
  };
  student?: { id: string; name: string; grade: number | null; classes: { id: string; name: string; code: string; teachers: string[] }[] };
}

@Injectable()
export class TodayService {
  private readonly memberships: ScopedRepository<Membership>;
  private readonly students: ScopedRepository<Student>;
  private readonly classes: ScopedRepository<ClassGroup>;
  private readonly terms: ScopedRepository<Term>;
  private readonly sittings: ScopedRepository<Sitting>;

  constructor(
    @InjectRepository(Membership) m: Repository<Membership>,
    @InjectRepository(Student) s: Repository<Student>,
    @InjectRepository(ClassGroup) c: Repository<ClassGroup>,
    @InjectRepository(Term) t: Repository<Term>,
    @InjectRepository(Organisation) private readonly orgs: Repository<Organisation>,
    @InjectRepository(Sitting) st: Repository<Sitting>,
  ) {
    this.sittings = new ScopedRepository(st, 'sitting');
    this.memberships = new ScopedRepository(m, 'person');
    this.students = new ScopedRepository(s, 'student');
    this.classes = new ScopedRepository(c, 'class');
    this.terms = new ScopedRepository(t, 'term');
  }

  async today(): Promise<TodayView> {
    const caller = RequestContext.requireCaller();
    const org = await this.orgs.findOneByOrFail({ id: caller.organisationId });
    const date = localDate(now(), org.timeZone);
    const view: TodayView = { date, timeZone: org.timeZone, organisationName: org.name, roles: caller.roles };

    if (caller.roles.includes('admin')) {
      const [people, students, classes, term] = await Promise.all([
        this.memberships.count({ where: { active: true } }),
        this.students.count({ where: { active: true } }),
        this.classes.count({ where: { active: true } }),
        this.terms.findOne({ where: { startsOn: LessThanOrEqual(date), endsOn: MoreThanOrEqual(date) } }),
      ]);
      view.admin = {
        people,
        students,
        classes,
        term: term ? { name: term.name, startsOn: term.startsOn, endsOn: term.endsOn } : null,
      };
    }
    if (caller.roles.includes('teacher')) {
      const rows = await this.classes
        .qb('c')
        .innerJoin('c.teachers', 't', 't.id = :mid', { mid: caller.membershipId })
        .leftJoin('c.students', 's', 's.active = true')
        .select(['c.id AS id', 'c.name AS name', 'c.code AS code', 'c.grade AS grade'])
        .addSelect('COUNT(s.id)::int', 'studentCount')
        .andWhere('c.active = true')
        .groupBy('c.id')
        .orderBy('c.name')
        .getRawMany<{ id: string; name: string; code: string; grade: number | null; studentCount: number }>();
      view.teacher = { classes: rows };
    }
    if (caller.roles.includes('examiner')) {
      // Today's sittings (in the organisation's zone) with at least one slot this examiner marks.
      const rows = await this.sittings
        .qb('s')
        .innerJoin('s.slots', 'sl', '(sl.examinerMembershipId = :mid OR sl.secondExaminerMembershipId = :mid)', {
          mid: caller.membershipId,
        })
        .select(['s.id AS id', 's.title AS title', 's.room AS room', 's.status AS status'])
        .addSelect('s.startsAt', 'startsAt')
        .addSelect('s.endsAt', 'endsAt')
        .addSelect('COUNT(sl.id)::int', 'mySlots')
        .andWhere('s.date = :date', { date })
        .andWhere("s.status IN ('scheduled', 'in_progress', 'marking_closed')")
        .groupBy('s.id')
        .orderBy('s.startsAt')
        .getRawMany<{ id: string; title: string; room: string; status: string; startsAt: Date; endsAt: Date; mySlots: number }>();
      view.examiner = {
        sittings: rows.map((r) => ({ ...r, startsAt: new Date(r.startsAt).toISOString(), endsAt: new Date(r.endsAt).toISOString() })),
      };
    }
    if (caller.roles.includes('student')) {
      const me = await this.students.findOne({
        where: { membershipId: caller.membershipId },
        relations: { classes: { teachers: { person: true } } },
      });
      if (me) {
        view.student = {
          id: me.id,
          name: `${me.givenName} ${me.familyName}`,
          grade: me.grade,
          classes: (me.classes ?? [])
            .filter((c) => c.active)
            .map((c) => ({
              id: c.id,
              name: c.name,
              code: c.code,
              teachers: (c.teachers ?? []).map((t) => t.person?.displayName ?? '').filter(Boolean),
            })),
        };
      }
    }
    return view;
  }
}
