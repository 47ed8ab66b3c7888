import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository, type EntityManager } from 'typeorm';
import type {
  AddClassMemberInput,
  ClassDetail,
  ClassRow,
  CreateClassInput,
  ListClassesQuery,
  UpdateClassInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { conflict, forbidden, invalid, notFound } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { classListCsv } from './class-list-export.js';
import { toClassRow, toStudentRow } from './classes.mapper.js';
import { ClassGroup } from './entities/class-group.entity.js';

const isAdmin = (c: Caller): boolean => c.roles.includes('admin');

/**
 * Classes and their members. A teacher reaches only the classes they teach (class_teachers);
 * another class answers 404 like one that is not there (design.md §2). Admins reach all.
 */
@Injectable()
export class ClassesService {
  private readonly classes: ScopedRepository<ClassGroup>;
  private readonly students: ScopedRepository<Student>;
  private readonly memberships: ScopedRepository<Membership>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(ClassGroup) classRepo: Repository<ClassGroup>,
    @InjectRepository(Student) studentRepo: Repository<Student>,
    @InjectRepository(Membership) membershipRepo: Repository<Membership>,
    private readonly audit: AuditService,
  ) {
    this.classes = new ScopedRepository(classRepo, 'class');
    this.students = new ScopedRepository(studentRepo, 'student');
    this.memberships = new ScopedRepository(membershipRepo, 'teacher');
  }

  /** The ids of the classes the caller may see, or null for "all of the organisation's". */
  async visibleClassIds(em: EntityManager = this.db.manager): Promise<Set<string> | null> {
    const caller = RequestContext.requireCaller();
    if (isAdmin(caller)) return null;
    const rows = (await em.query(`SELECT class_id FROM class_teachers WHERE membership_id = $1`, [
      caller.membershipId,
    ])) as { class_id: string }[];
    return new Set(rows.map((r) => r.class_id));
  }

  /** One class the caller may see, or 404. */
  async ownedClass(id: string, em: EntityManager = this.db.manager): Promise<ClassGroup> {
    const visible = await this.visibleClassIds(em);
    if (visible && !visible.has(id)) throw notFound('class');
    return this.classes.withManager(em).getById(id, { relations: { teachers: { person: true } } });
  }

  async list(q: ListClassesQuery): Promise<ClassRow[]> {
    const visible = await this.visibleClassIds();
    const qb = this.classes
      .qb('c')
      .leftJoinAndSelect('c.teachers', 't')
      .leftJoinAndSelect('t.person', 'tp')
      .orderBy('c.active', 'DESC')
      .addOrderBy('c.name', 'ASC');
    if (visible) qb.andWhere('c.id = ANY(:ids)', { ids: [...visible] });
    if (q.active !== undefined) qb.andWhere('c.active = :active', { active: q.active });
    const rows = await qb.getMany();
    const counts = rows.length
      ? ((await this.db.query(
          `SELECT class_id, count(*)::int AS n FROM class_members WHERE class_id = ANY($1) GROUP BY class_id`,
          [rows.map((c) => c.id)],
        )) as { class_id: string; n: number }[])
      : [];
    const countOf = new Map(counts.map((r) => [r.class_id, r.n]));
    return rows.map((c) => toClassRow(c, countOf.get(c.id) ?? 0));
  }

  async detail(id: string): Promise<ClassDetail> {
    const c = await this.ownedClass(id);
    const members = await this.membersOf(id);
    const visible = await this.visibleClassIds();
    const codes = await this.classCodesOf(
      members.map((m) => m.id),
      visible,
    );
    return {
      ...toClassRow(c, members.length),
      members: members.map((m) => toStudentRow(m, codes.get(m.id) ?? [])),
    };
  }

  async create(input: CreateClassInput): Promise<ClassRow> {
    const caller = RequestContext.requireCaller();
    const created = await this.db.transaction(async (em) => {
      const classes = this.classes.withManager(em);
      if (await classes.findOne({ where: { code: input.code } })) {
        throw conflict(`The class code ${input.code} is already used here.`, [
          { path: 'code', message: 'already used' },
        ]);
      }
      let teacherPeople = input.teacherIds ?? [];
      if (!isAdmin(caller)) {
        // A teacher who creates a class teaches it.
        if (!teacherPeople.includes(caller.personId))
          teacherPeople = [caller.personId, ...teacherPeople];
      }
      const teachers = await this.teachersFor(em, teacherPeople);
      const c = await classes.save(
        classes.create({
          name: input.name,
          code: input.code,
          grade: input.grade ?? null,
          active: true,
          teachers,
        }),
      );
      await this.audit.record(
        {
          action: 'class.created',
          entity: 'class',
          entityId: c.id,
          after: { name: c.name, code: c.code },
        },
        em,
      );
      return c.id;
    });
    return toClassRow(await this.ownedClass(created), 0);
  }

  async update(id: string, input: UpdateClassInput): Promise<ClassRow> {
    const caller = RequestContext.requireCaller();
    await this.db.transaction(async (em) => {
      const c = await this.ownedClass(id, em);
      const before = {
        name: c.name,
        grade: c.grade,
        active: c.active,
        teachers: (c.teachers ?? []).map((t) => t.personId),
      };
      if (input.teacherIds !== undefined) {
        if (!isAdmin(caller))
          throw forbidden('Only an administrator can change who teaches a class.');
        c.teachers = await this.teachersFor(em, input.teacherIds);
      }
      if (input.name !== undefined) c.name = input.name;
      if (input.grade !== undefined) c.grade = input.grade;
      if (input.active !== undefined) c.active = input.active;
      await this.classes.withManager(em).save(c);
      await this.audit.record(
        {
          action: 'class.updated',
          entity: 'class',
          entityId: c.id,
          before,
          after: {
            name: c.name,
            grade: c.grade,
            active: c.active,
            teachers: (c.teachers ?? []).map((t) => t.personId),
          },
        },
        em,
      );
    });
    const c = await this.ownedClass(id);
    return toClassRow(c, (await this.membersOf(id)).length);
  }

  /** Adds a student, or moves one when `fromClassId` is given (both classes must be the caller's). */
  async addMember(classId: string, input: AddClassMemberInput): Promise<ClassDetail> {
    await this.db.transaction(async (em) => {
      const target = await this.ownedClass(classId, em);
      const student = await this.visibleStudent(em, input.studentId);
      if (input.fromClassId) {
        if (input.fromClassId === classId) throw invalid('The student is already in this class.');
        const from = await this.ownedClass(input.fromClassId, em);
        // TypeORM answers a DELETE with [rows, affected count].
        const [, removed] = (await em.query(
          `DELETE FROM class_members WHERE class_id = $1 AND student_id = $2`,
          [from.id, student.id],
        )) as [unknown, number];
        if (removed === 0) throw notFound('student in that class');
      }
      await em.query(
        `INSERT INTO class_members (class_id, student_id) VALUES ($1, $2) ON CONFLICT DO NOTHING`,
        [target.id, student.id],
      );
      await this.audit.record(
        {
          action: input.fromClassId ? 'class.member_moved' : 'class.member_added',
          entity: 'student',
          entityId: student.id,
          after: { classId: target.id, fromClassId: input.fromClassId ?? null },
        },
        em,
      );
    });
    return this.detail(classId);
  }

  async removeMember(classId: string, studentId: string): Promise<void> {
    await this.db.transaction(async (em) => {
      await this.ownedClass(classId, em);
      const [, removed] = (await em.query(
        `DELETE FROM class_members WHERE class_id = $1 AND student_id = $2`,
        [classId, studentId],
      )) as [unknown, number];
      if (removed === 0) throw notFound('student in this class');
      await this.audit.record(
        {
          action: 'class.member_removed',
          entity: 'student',
          entityId: studentId,
          after: { classId },
        },
        em,
      );
    });
  }

  async exportCsv(id: string): Promise<{ fileName: string; csv: string }> {
    const c = await this.ownedClass(id);
    const members = await this.membersOf(id);
    return {
      fileName: `class-${c.code.replace(/[^A-Za-z0-9_-]+/g, '-')}.csv`,
      csv: classListCsv(c.code, members),
    };
  }

  /** Members with their guardians, ordered as a register is. */
  private membersOf(classId: string): Promise<Student[]> {
    return this.students
      .qb('s')
      .innerJoin('class_members', 'cm', 'cm.student_id = s.id AND cm.class_id = :classId', {
        classId,
      })
      .leftJoinAndSelect('s.guardians', 'g')
      .orderBy('s.familyName', 'ASC')
      .addOrderBy('s.givenName', 'ASC')
      .addOrderBy('s.pupilNumber', 'ASC')
      .getMany();
  }

  /** Class codes per student, limited to the classes the caller may see. */
  async classCodesOf(
    studentIds: string[],
    visible: Set<string> | null,
  ): Promise<Map<string, string[]>> {
    const out = new Map<string, string[]>();
    if (studentIds.length === 0) return out;
    const rows = (await this.db.query(
      `SELECT cm.student_id, c.id, c.code FROM class_members cm JOIN classes c ON c.id = cm.class_id
        WHERE cm.student_id = ANY($1) AND c.organisation_id = $2`,
      [studentIds, RequestContext.requireCaller().organisationId],
    )) as { student_id: string; id: string; code: string }[];
    for (const r of rows) {
      if (visible && !visible.has(r.id)) continue;
      out.set(r.student_id, [...(out.get(r.student_id) ?? []), r.code]);
    }
    return out;
  }

  /** A student the caller may see: any in the organisation for an admin, else one in the caller's classes. */
  async visibleStudent(em: EntityManager, studentId: string): Promise<Student> {
    const visible = await this.visibleClassIds(em);
    const qb = this.students.withManager(em).qb('s').andWhere('s.id = :id', { id: studentId });
    if (visible) {
      qb.andWhere(
        'EXISTS (SELECT 1 FROM class_members cm WHERE cm.student_id = s.id AND cm.class_id = ANY(:ids))',
        { ids: [...visible] },
      );
    }
    const s = await qb.getOne();
    if (!s) throw notFound('student');
    return s;
  }

  private async teachersFor(em: EntityManager, personIds: string[]): Promise<Membership[]> {
    if (personIds.length === 0) return [];
    const ms = await this.memberships
      .withManager(em)
      .find({ where: { personId: In(personIds), active: true }, relations: { person: true } });
    const teachers = ms.filter((m) => m.roles.includes('teacher'));
    if (teachers.length !== new Set(personIds).size) {
      throw invalid('Each teacher must be an active member with the teacher role.', [
        { path: 'teacherIds', message: 'not a teacher here' },
      ]);
    }
    return teachers;
  }
}
