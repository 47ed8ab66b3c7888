import { Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  agreeMarksSchema,
  thirdMarkerSchema,
  type AgreeMarksInput,
  type ModerationView,
  type ThirdMarkerInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import { ModerationService } from './moderation.service.js';

@ApiTags('moderation')
@Controller()
export class ModerationController {
  constructor(private readonly moderation: ModerationService) {}

  @Get('sittings/:id/moderation')
  @Route({
    summary: 'Double-marked pairs of a sitting side by side, with flags outside tolerance',
    roles: ['admin', 'teacher'],
    owned: true,
    description:
      'After marking closes. Admins and the sitting’s planner see every pair, a teacher the pairs of the students they teach.',
  })
  @ApiConflictResponse({ description: 'Marking is still open.' })
  view(@IdParam() id: string): Promise<ModerationView> {
    return this.moderation.view(id);
  }

  @Post('moderation/slots/:slotId/agree')
  @HttpCode(200)
  @Route({
    summary: 'Resolve a flagged pair with agreed marks and the reason (audited)',
    roles: ['admin', 'teacher'],
    owned: true,
    description:
      'Every criterion of every request asked needs a mark; the result is recomputed from them.',
  })
  @ApiConflictResponse({ description: 'The pair is not flagged, already settled, or released.' })
  agree(
    @IdParam('slotId') slotId: string,
    @ValidBody(agreeMarksSchema) body: AgreeMarksInput,
  ): Promise<ModerationView> {
    return this.moderation.agree(slotId, body);
  }

  @Post('moderation/slots/:slotId/third-marker')
  @HttpCode(200)
  @Route({
    summary: 'Send a flagged pair to a third examiner, who marks it blind on the desk',
    roles: ['admin', 'teacher'],
    owned: true,
  })
  @ApiConflictResponse({ description: 'The pair is not flagged or already resolved.' })
  thirdMarker(
    @IdParam('slotId') slotId: string,
    @ValidBody(thirdMarkerSchema) body: ThirdMarkerInput,
  ): Promise<ModerationView> {
    return this.moderation.sendToThird(slotId, body);
  }
}
