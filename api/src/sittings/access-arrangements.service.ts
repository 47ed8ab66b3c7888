import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type { AccessArrangementInput, AccessArrangementView } from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { ClassesService } from '../classes/classes.service.js';
import { DomainError, ErrorCode, notFound } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { AccessArrangement } from './entities/access-arrangement.entity.js';
import { toArrangementView } from './sittings.mapper.js';
import { SittingsService } from './sittings.service.js';

/**
 * Access arrangements (issue 5 §3): confidential. The candidate's teachers and admins read and
 * change them; an examiner reads one only while marking that candidate in a sitting in progress.
 * Everyone else gets 404, as if there were no such student.
 */
@Injectable()
export class AccessArrangementsService {
  private readonly arrangements: ScopedRepository<AccessArrangement>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(AccessArrangement) repo: Repository<AccessArrangement>,
    private readonly classes: ClassesService,
    private readonly sittings: SittingsService,
    private readonly audit: AuditService,
  ) {
    this.arrangements = new ScopedRepository(repo, 'access arrangement');
  }

  private isStaff(): boolean {
    const roles = RequestContext.requireCaller().roles;
    return roles.includes('admin') || roles.includes('teacher');
  }

  async get(studentId: string): Promise<AccessArrangementView> {
    return this.db.transaction(async (em) => {
      let allowed = false;
      if (this.isStaff()) {
        try {
          await this.classes.visibleStudent(em, studentId);
          allowed = true;
        } catch (err) {
          if (!(err instanceof DomainError) || err.code !== ErrorCode.NotFound) throw err;
        }
      }
      if (!allowed) allowed = await this.sittings.examinerMarksStudentNow(em, studentId);
      if (!allowed) throw notFound('student');
      const a = await this.arrangements.withManager(em).findOne({ where: { studentId }, relations: { updatedBy: true } });
      return toArrangementView(studentId, a);
    });
  }

  async put(studentId: string, input: AccessArrangementInput): Promise<AccessArrangementView> {
    await this.db.transaction(async (em) => {
      const student = await this.classes.visibleStudent(em, studentId);
      const repo = this.arrangements.withManager(em);
      const existing = await repo.findOne({ where: { studentId }, lock: { mode: 'pessimistic_write' } });
      const before = existing ? toArrangementView(studentId, existing) : null;
      const row = existing ?? repo.create({ studentId: student.id });
      row.extraTimePercent = input.extraTimePercent;
      row.restBreakMinutes = input.restBreakMinutes;
      row.substitutions = input.substitutions;
      row.notes = input.notes || null;
      row.updatedByPersonId = RequestContext.requireCaller().personId;
      await repo.save(row);
      await this.audit.record(
        {
          action: 'access_arrangement.saved',
          entity: 'student',
          entityId: student.id,
          before: before && { extraTimePercent: before.extraTimePercent, restBreakMinutes: before.restBreakMinutes, substitutions: before.substitutions, notes: before.notes },
          after: { extraTimePercent: row.extraTimePercent, restBreakMinutes: row.restBreakMinutes, substitutions: row.substitutions, notes: row.notes },
        },
        em,
      );
      // Slot lengths follow at once; a change that no longer fits a planned day is refused.
      await this.sittings.relayoutForStudent(em, student.id);
    });
    this.sittings.afterCommit();
    return this.get(studentId);
  }
}
