import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Between, DataSource, In, Not, type EntityManager, type FindOperator } from 'typeorm';
import type { AgreementReport, AgreementScopes } from '@stavemark/shared';
import { notFound } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { Term } from '../organisations/entities/term.entity.js';
import { SittingExaminer } from '../sittings/entities/sitting-examiner.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { buildAgreementReport } from './agreement-report.js';
import { loadScoredPairs } from './double-marked.js';

/**
 * The agreement report (issue 7 §3) per sitting and per term. Who may read it: admins; the teacher
 * who planned the sitting; the sitting's lead examiner (first on its panel). A term's report pools
 * the sittings the caller may report on. Anyone else finds nothing (404).
 */
@Injectable()
export class AgreementService {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  private sittingsRepo(em: EntityManager) {
    return new ScopedRepository(em.getRepository(Sitting), 'sitting');
  }

  /** Non-draft sittings the caller may report on, optionally within some dates. */
  private async reportable(em: EntityManager, caller: Caller, where: { date?: FindOperator<string>; id?: string } = {}): Promise<Sitting[]> {
    const all = await this.sittingsRepo(em).find({ where: { ...where, status: Not('draft') }, order: { date: 'ASC', title: 'ASC' } });
    if (caller.roles.includes('admin')) return all;
    const leads = caller.roles.includes('examiner')
      ? new Set(
          (
            await new ScopedRepository(em.getRepository(SittingExaminer), 'sitting examiner').find({
              where: { membershipId: caller.membershipId, position: 0, sittingId: In(all.map((s) => s.id)) },
            })
          ).map((e) => e.sittingId),
        )
      : new Set<string>();
    const plans = caller.roles.includes('teacher');
    return all.filter((s) => (plans && s.plannedByMembershipId === caller.membershipId) || leads.has(s.id));
  }

  async forSitting(sittingId: string): Promise<AgreementReport> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const [sitting] = await this.reportable(em, caller, { id: sittingId });
      if (!sitting) throw notFound('sitting');
      return this.report(em, { kind: 'sitting', id: sitting.id, title: sitting.title, from: sitting.date, to: sitting.date }, [sitting]);
    });
  }

  async forTerm(termId: string): Promise<AgreementReport> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const term = await new ScopedRepository(em.getRepository(Term), 'term').getById(termId);
      const sittings = await this.reportable(em, caller, { date: Between(term.startsOn, term.endsOn) });
      return this.report(em, { kind: 'term', id: term.id, title: `${term.name} (${term.academicYear})`, from: term.startsOn, to: term.endsOn }, sittings);
    });
  }

  async scopes(): Promise<AgreementScopes> {
    const caller = RequestContext.requireCaller();
    return this.db.transaction(async (em) => {
      const sittings = await this.reportable(em, caller);
      const counts = sittings.length
        ? ((await em.query(
            `SELECT sitting_id, count(*)::int AS n FROM slots WHERE organisation_id = $1 AND second_examiner_membership_id IS NOT NULL AND sitting_id = ANY($2::uuid[]) GROUP BY sitting_id`,
            [caller.organisationId, sittings.map((s) => s.id)],
          )) as { sitting_id: string; n: number }[])
        : [];
      const countOf = new Map(counts.map((c) => [c.sitting_id, c.n]));
      // Terms only for those who pool sittings (admins, planners); a lead examiner reports per sitting.
      const terms =
        caller.roles.includes('admin') || caller.roles.includes('teacher')
          ? await new ScopedRepository(em.getRepository(Term), 'term').find({ order: { startsOn: 'DESC' } })
          : [];
      return {
        terms: terms.map((t) => ({ id: t.id, name: t.name, academicYear: t.academicYear, startsOn: t.startsOn, endsOn: t.endsOn })),
        sittings: sittings
          .map((s) => ({ id: s.id, title: s.title, date: s.date, status: s.status, doubleMarkedSlots: countOf.get(s.id) ?? 0 }))
          .reverse(),
      };
    });
  }

  private async report(em: EntityManager, scope: AgreementReport['scope'], sittings: Sitting[]): Promise<AgreementReport> {
    const loaded = await loadScoredPairs(em, sittings);
    return buildAgreementReport({
      scope,
      sittings: sittings.map((s) => ({ id: s.id, title: s.title, date: s.date })),
      counts: { doubleMarkedSlots: loaded.doubleMarkedSlots, notCompleted: loaded.notCompleted, notSubmitted: loaded.notSubmitted },
      pairs: loaded.pairs,
      bandLevels: loaded.bandLevels,
    });
  }
}
