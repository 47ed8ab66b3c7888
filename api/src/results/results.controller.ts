import { Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  releaseResultsSchema,
  type ReleaseListView,
  type ReleaseResultsInput,
  type ReleaseSummary,
  type ResultDetail,
  type ResultSummary,
  type TakeHomeReport,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import { ReleaseService } from './release.service.js';

@ApiTags('results')
@Controller()
export class ResultsController {
  constructor(private readonly release: ReleaseService) {}

  @Post('sittings/:id/release')
  @HttpCode(200)
  @Route({
    summary: 'Release a sitting’s results to students (and the take-home report by e-mail)',
    roles: ['admin', 'teacher'],
    owned: true,
    description:
      'A teacher releases the results of the students they teach, an admin all of them, each with an optional teacher’s note. Students, and guardians of minors who consented to results by e-mail, receive the take-home report. When every result is released the sitting becomes published.',
  })
  @ApiConflictResponse({
    description:
      'Marking is not closed yet, a double-marked pair is outside tolerance and unresolved, or there is nothing of yours to release.',
  })
  releaseSitting(
    @IdParam() id: string,
    @ValidBody(releaseResultsSchema) body: ReleaseResultsInput,
  ): Promise<ReleaseSummary> {
    return this.release.release(id, body);
  }

  @Get('sittings/:id/release')
  @Route({
    summary: 'The results a caller may release in a sitting, with their release state',
    roles: ['admin', 'teacher'],
    owned: true,
    description:
      'A teacher’s own students’ results, an admin’s all; blockedBy says why release is refused now.',
  })
  releaseList(@IdParam() id: string): Promise<ReleaseListView> {
    return this.release.releaseList(id);
  }

  @Get('me/results')
  @Route({
    summary: 'The signed-in student’s own released results, newest first',
    roles: ['student'],
  })
  mine(): Promise<ResultSummary[]> {
    return this.release.mine();
  }

  @Get('students/:studentId/results')
  @Route({
    summary: 'A student’s results, newest first',
    roles: ['admin', 'teacher', 'student'],
    owned: true,
    description:
      'The student sees their own released results; their teachers and admins every result. Anyone else: 404.',
  })
  forStudent(@IdParam('studentId') studentId: string): Promise<ResultSummary[]> {
    return this.release.forStudent(studentId);
  }

  @Get('results/:id')
  @Route({
    summary: 'One result with its marks per request and criterion, and the comments',
    roles: ['admin', 'teacher', 'student'],
    owned: true,
    description: 'The student only once released; their teachers and admins always.',
  })
  detail(@IdParam() id: string): Promise<ResultDetail> {
    return this.release.detail(id);
  }

  @Get('results/:id/report')
  @Route({
    summary: 'The take-home report of a result: strengths and next steps in plain words',
    roles: ['admin', 'teacher', 'student'],
    owned: true,
  })
  report(@IdParam() id: string): Promise<TakeHomeReport> {
    return this.release.report(id);
  }
}
