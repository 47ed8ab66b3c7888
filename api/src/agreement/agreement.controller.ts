import { Controller, Get } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import type { AgreementReport, AgreementScopes } from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam } from '../common/validation.js';
import { AgreementService } from './agreement.service.js';

const WHO = 'Admins, the teacher who planned the sitting, and its lead examiner (first on the panel); anyone else 404.';

@ApiTags('agreement')
@Controller()
export class AgreementController {
  constructor(private readonly agreement: AgreementService) {}

  @Get('agreement/scopes')
  @Route({ summary: 'Terms and sittings the caller may see an agreement report for', roles: ['admin', 'teacher', 'examiner'] })
  scopes(): Promise<AgreementScopes> {
    return this.agreement.scopes();
  }

  @Get('sittings/:id/agreement')
  @Route({
    summary: 'Agreement between examiners on a sitting’s double-marked candidates',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: `ICC on totals (form chosen by how pairs were set up), band agreement, kappa per examiner pair, severity. ${WHO}`,
  })
  sitting(@IdParam() id: string): Promise<AgreementReport> {
    return this.agreement.forSitting(id);
  }

  @Get('terms/:id/agreement')
  @Route({
    summary: 'Agreement between examiners over a term’s sittings',
    roles: ['admin', 'teacher'],
    owned: true,
    description: 'Pools the sittings of the term the caller may report on (an admin: all; a teacher: those they planned).',
  })
  term(@IdParam() id: string): Promise<AgreementReport> {
    return this.agreement.forTerm(id);
  }
}
