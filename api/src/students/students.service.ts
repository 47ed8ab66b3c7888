import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type { ListStudentsQuery, StudentRow, UpdateStudentInput } from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { ClassesService } from '../classes/classes.service.js';
import { toStudentRow } from '../classes/classes.mapper.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Student } from './entities/student.entity.js';

/** Students the caller may see: all of the organisation's for an admin, those in own classes for a teacher. */
@Injectable()
export class StudentsService {
  private readonly students: ScopedRepository<Student>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Student) repo: Repository<Student>,
    private readonly classes: ClassesService,
    private readonly audit: AuditService,
  ) {
    this.students = new ScopedRepository(repo, 'student');
  }

  async list(q: ListStudentsQuery): Promise<StudentRow[]> {
    const visible = await this.classes.visibleClassIds();
    const qb = this.students.qb('s').leftJoinAndSelect('s.guardians', 'g');
    if (visible) {
      qb.andWhere(
        'EXISTS (SELECT 1 FROM class_members cm WHERE cm.student_id = s.id AND cm.class_id = ANY(:ids))',
        { ids: [...visible] },
      );
    }
    if (q.search) {
      qb.andWhere("(s.givenName || ' ' || s.familyName ILIKE :s OR s.pupilNumber ILIKE :s)", {
        s: `%${q.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
      });
    }
    if (q.notInClassId) {
      qb.andWhere(
        'NOT EXISTS (SELECT 1 FROM class_members cm2 WHERE cm2.student_id = s.id AND cm2.class_id = :nc)',
        { nc: q.notInClassId },
      );
    }
    const rows = await qb
      .orderBy('s.familyName', 'ASC')
      .addOrderBy('s.givenName', 'ASC')
      .take(50)
      .getMany();
    const codes = await this.classes.classCodesOf(
      rows.map((r) => r.id),
      visible,
    );
    return rows.map((s) => toStudentRow(s, codes.get(s.id) ?? []));
  }

  async update(id: string, input: UpdateStudentInput): Promise<StudentRow> {
    await this.db.transaction(async (em) => {
      const s = await this.classes.visibleStudent(em, id);
      const before = { active: s.active };
      s.active = input.active;
      await this.students.withManager(em).save(s);
      await this.audit.record(
        {
          action: input.active ? 'student.reactivated' : 'student.deactivated',
          entity: 'student',
          entityId: s.id,
          before,
          after: { active: s.active },
        },
        em,
      );
    });
    const s = await this.students.getById(id, { relations: { guardians: true } });
    const codes = await this.classes.classCodesOf([id], await this.classes.visibleClassIds());
    return toStudentRow(s, codes.get(id) ?? []);
  }
}
