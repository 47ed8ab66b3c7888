import { Controller, Get, HttpCode, Patch, Post, Put, Req, Res } from '@nestjs/common';
import { ApiBody, ApiConsumes, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import {
  attemptMarksSchema,
  createExerciseSchema,
  updateExerciseSchema,
  type AttemptMarksInput,
  type CreateExerciseInput,
  type DeviationHistory,
  type ExerciseSummary,
  type ExerciseView,
  type UpdateExerciseInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import type { SignedMediaUrl } from '../storage/storage.service.js';
import { StandardisationService } from './standardisation.service.js';

const BLIND =
  'Blind: the reference marks, the other examiners’ marks and the agreement appear only once the caller’s own attempt is submitted (admins and the exercise’s author see them always, and cannot attempt it).';

@ApiTags('standardisation')
@Controller('standardisation')
export class StandardisationController {
  constructor(private readonly service: StandardisationService) {}

  @Get('exercises')
  @Route({ summary: 'Standardisation exercises: published ones, and drafts the caller manages', roles: ['admin', 'teacher', 'examiner'] })
  list(): Promise<ExerciseSummary[]> {
    return this.service.list();
  }

  @Post('exercises')
  @Route({ summary: 'Create a draft exercise: what was performed, the rubric version, reference marks', roles: ['admin', 'teacher'] })
  create(@ValidBody(createExerciseSchema) body: CreateExerciseInput): Promise<ExerciseView> {
    return this.service.create(body);
  }

  @Get('exercises/:id')
  @Route({ summary: 'One exercise', roles: ['admin', 'teacher', 'examiner'], owned: true, description: BLIND })
  view(@IdParam() id: string): Promise<ExerciseView> {
    return this.service.view(id);
  }

  @Patch('exercises/:id')
  @Route({ summary: 'Change a draft exercise (its author or an admin)', roles: ['admin', 'teacher'], owned: true, description: 'A published exercise answers 409.' })
  update(@IdParam() id: string, @ValidBody(updateExerciseSchema) body: UpdateExerciseInput): Promise<ExerciseView> {
    return this.service.update(id, body);
  }

  @Post('exercises/:id/publish')
  @HttpCode(200)
  @Route({ summary: 'Publish an exercise for examiners to mark', roles: ['admin', 'teacher'], owned: true, description: 'Every reference mark must be given (400 lists the missing ones); published already: 409.' })
  publish(@IdParam() id: string): Promise<ExerciseView> {
    return this.service.publish(id);
  }

  @Post('exercises/:id/recording')
  @HttpCode(200)
  @ApiConsumes('multipart/form-data')
  @ApiBody({ schema: { type: 'object', required: ['file'], properties: { file: { type: 'string', format: 'binary' } } } })
  @Route({
    summary: 'Attach the reference performance (audio or video) to a draft exercise',
    roles: ['admin', 'teacher'],
    owned: true,
    description: 'Multipart field `file`, streamed to storage; the type is read from the content (415 when it is not playable audio or video), 413 over 50 MB. A published exercise answers 409.',
  })
  uploadRecording(@IdParam() id: string, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<ExerciseView> {
    return this.service.uploadRecording(id, req, res);
  }

  @Get('exercises/:id/recording-url')
  @Route({
    summary: 'A short-lived signed address to play the reference recording (HTTP range requests work)',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: 'For whoever may see the exercise; 404 when none is attached.',
  })
  recordingUrl(@IdParam() id: string): Promise<SignedMediaUrl> {
    return this.service.recordingUrl(id);
  }

  @Put('exercises/:id/attempt')
  @Route({ summary: 'Save the caller’s marks so far (a draft)', roles: ['examiner'], owned: true, description: `Submitted marks cannot change (409). ${BLIND}` })
  saveAttempt(@IdParam() id: string, @ValidBody(attemptMarksSchema) body: AttemptMarksInput): Promise<ExerciseView> {
    return this.service.saveAttempt(id, body);
  }

  @Post('exercises/:id/attempt/submit')
  @HttpCode(200)
  @Route({ summary: 'Submit the caller’s marks; the answer shows the reference and the deviation', roles: ['examiner'], owned: true, description: 'Every criterion of every request needs a mark (400 lists the missing ones).' })
  submitAttempt(@IdParam() id: string, @ValidBody(attemptMarksSchema) body: AttemptMarksInput): Promise<ExerciseView> {
    return this.service.saveAttempt(id, body, true);
  }

  @Get('deviations')
  @Route({ summary: 'The caller’s deviation from reference marks over time, per exercise and criterion', roles: ['examiner'] })
  deviations(): Promise<DeviationHistory> {
    return this.service.myDeviations();
  }
}
