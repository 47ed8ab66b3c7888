import { Controller, Get } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import type { AttentionView, ProgressView } from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam } from '../common/validation.js';
import { ProgressService } from './progress.service.js';

@ApiTags('progress')
@Controller()
export class ProgressController {
  constructor(private readonly progress: ProgressService) {}

  @Get('students/:studentId/progress')
  @Route({
    summary: 'A student’s year: results per sitting, criteria, slip rate, bands, comments, trend and percentile',
    description:
      'The student themself, their teachers and admins; anyone else 404. Absent sittings appear as absent, never as zero. Trends are per requirement-list lineage and grade; the percentile is null below 10 students.',
    roles: ['admin', 'teacher', 'student'],
    owned: true,
  })
  year(@IdParam('studentId') studentId: string): Promise<ProgressView> {
    return this.progress.progress(studentId);
  }

  @Get('attention')
  @Route({
    summary: 'The attention list: entrenched issues, persistent low tension marks, rising slip rates, with evidence',
    description: 'A teacher sees their own classes’ students; an admin everyone.',
    roles: ['admin', 'teacher'],
  })
  attention(): Promise<AttentionView> {
    return this.progress.attention();
  }
}
