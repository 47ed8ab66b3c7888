import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import type {
  CurrentFingering,
  Hand,
  Inversion,
  Mode,
  RequestKind,
  StudentFingeringInput,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { conflict, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { isUniqueViolation } from '../common/versioned-documents.js';
import { Student } from '../students/entities/student.entity.js';
import { StudentFingering } from './entities/student-fingering.entity.js';
import { requestIdentityOf, toCurrentFingerings } from './fingerings.mapper.js';

/**
 * Students' approved fingerings (design.md §3). Admins and the student's own teachers (through
 * an active class) set them; the student reads their own; to anyone else the student is not
 * there (404).
 */
@Injectable()
export class FingeringsService {
  private readonly students: ScopedRepository<Student>;
  private readonly fingerings: ScopedRepository<StudentFingering>;

  constructor(
    @InjectRepository(Student) studentRepo: Repository<Student>,
    @InjectRepository(StudentFingering) fingeringRepo: Repository<StudentFingering>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
  ) {
    this.students = new ScopedRepository(studentRepo, 'student');
    this.fingerings = new ScopedRepository(fingeringRepo, 'fingering');
  }

  private async assertAccess(studentId: string, mode: 'read' | 'write'): Promise<Student> {
    const caller = RequestContext.requireCaller();
    const student = await this.students.getById(studentId);
    if (caller.roles.includes('admin')) return student;
    if (caller.roles.includes('teacher')) {
      const teaches = await this.students
        .qb('s')
        .innerJoin('s.classes', 'c')
        .innerJoin('c.teachers', 't')
        .andWhere('s.id = :studentId', { studentId })
        .andWhere('t.id = :membershipId', { membershipId: caller.membershipId })
        .andWhere('c.active = true')
        .getExists();
      if (teaches) return student;
    }
    if (
      mode === 'read' &&
      student.membershipId !== null &&
      student.membershipId === caller.membershipId
    )
      return student;
    throw notFound('student');
  }

  async list(studentId: string): Promise<CurrentFingering[]> {
    await this.assertAccess(studentId, 'read');
    const rows = await this.fingerings.find({ where: { studentId }, relations: { setBy: true } });
    return toCurrentFingerings(rows);
  }

  /** Records a fingering as the new current one; the earlier ones stay as history. */
  async record(studentId: string, input: StudentFingeringInput): Promise<CurrentFingering> {
    await this.assertAccess(studentId, 'write');
    const request = requestIdentityOf(input);
    try {
      await this.db.transaction(async (em) => {
        const repo = this.fingerings.withManager(em);
        const latest = await repo.findOne({
          where: { studentId, request },
          order: { revision: 'DESC' },
        });
        const same =
          latest &&
          latest.octaves === input.octaves &&
          latest.direction === input.direction &&
          (latest.note ?? undefined) === input.note &&
          latest.digits.join() === input.digits.join();
        if (same) return; // nothing changed: no new revision
        const row = await repo.save(
          repo.create({
            studentId,
            request,
            kind: input.kind,
            key: input.key,
            mode: input.mode,
            hand: input.hand,
            inversion: input.inversion,
            octaves: input.octaves,
            direction: input.direction,
            digits: input.digits,
            note: input.note ?? null,
            revision: (latest?.revision ?? 0) + 1,
            setByPersonId: RequestContext.requireCaller().personId,
          }),
        );
        await this.audit.record(
          {
            action: 'fingering.recorded',
            entity: 'student_fingering',
            entityId: row.id,
            before: latest
              ? {
                  revision: latest.revision,
                  octaves: latest.octaves,
                  direction: latest.direction,
                  digits: latest.digits,
                }
              : null,
            after: {
              studentId,
              request,
              revision: row.revision,
              octaves: row.octaves,
              direction: row.direction,
              digits: row.digits,
            },
          },
          em,
        );
      });
    } catch (err) {
      if (isUniqueViolation(err))
        throw conflict(
          'Someone else changed this fingering at the same moment; reload and try again.',
        );
      throw err;
    }
    const current = await this.currentFor(studentId, input);
    if (!current) throw new Error('fingering vanished after it was recorded');
    return current;
  }

  /**
   * The current fingering for one request, with its history, or null. For other modules (the
   * marking desk) that have already checked the caller may see the student.
   */
  async currentFor(
    studentId: string,
    r: {
      kind: RequestKind;
      key: string;
      mode: Mode | null;
      hand: Hand;
      inversion: Inversion | null;
    },
    em?: EntityManager,
  ): Promise<CurrentFingering | null> {
    const repo = em ? this.fingerings.withManager(em) : this.fingerings;
    const rows = await repo.find({
      where: { studentId, request: requestIdentityOf(r) },
      relations: { setBy: true },
    });
    return toCurrentFingerings(rows)[0] ?? null;
  }
}
