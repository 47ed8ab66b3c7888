import { Controller, Get, Post } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import {
  studentFingeringBodySchema,
  type CurrentFingering,
  type StudentFingeringInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import { FingeringsService } from './fingerings.service.js';

@ApiTags('fingerings')
@Controller('students/:studentId/fingerings')
export class FingeringsController {
  constructor(private readonly fingerings: FingeringsService) {}

  @Get()
  @Route({
    summary: 'A student’s approved fingerings: the current one per request, with history',
    description:
      'For admins, the student’s teachers and the student themselves; anyone else gets 404.',
    owned: true,
  })
  list(@IdParam('studentId') studentId: string): Promise<CurrentFingering[]> {
    return this.fingerings.list(studentId);
  }

  @Post()
  @Route({
    summary: 'Record a student’s approved fingering (a new revision; the earlier ones stay)',
    description:
      'Digits 1–5, one per note of the span (octaves and direction). Admins and the student’s teachers only.',
    roles: ['admin', 'teacher'],
    owned: true,
  })
  record(
    @IdParam('studentId') studentId: string,
    @ValidBody(studentFingeringBodySchema) body: StudentFingeringInput,
  ): Promise<CurrentFingering> {
    return this.fingerings.record(studentId, body);
  }
}
