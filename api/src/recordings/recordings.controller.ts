import { applyDecorators, Controller, Delete, Get, HttpCode, Post, Put, Req, Res } from '@nestjs/common';
import {
  ApiBody,
  ApiConsumes,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiPayloadTooLargeResponse,
  ApiTags,
  ApiUnsupportedMediaTypeResponse,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import {
  recordedExamSchema,
  recordingSettingsSchema,
  type PlaybackView,
  type RecordedExamInput,
  type RecordingSettingsInput,
  type RecordingSettingsView,
  type RecordingView,
  type SlotRecordingsView,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import { StorageService } from '../storage/storage.service.js';
import type { UploadOptions } from '../storage/upload-receiver.js';
import { RecordingsService } from './recordings.service.js';

const UPLOAD_BODY = {
  schema: {
    type: 'object',
    required: ['file'],
    properties: {
      file: { type: 'string', format: 'binary', description: 'Audio or video: WAV, MP3, OGG, FLAC, AAC/M4A, WebM, MP4 or MOV, checked from its content.' },
      durationSeconds: { type: 'number', description: 'Optional: the length the recording device measured (a WAV’s is read from its header).' },
    },
  },
};
const CONSENT =
  'A student under 18 needs a guardian’s consent to recordings on record (403 with the reason otherwise). The file is streamed to storage, refused by size (413) and by content (415) with nothing kept. The recording is deleted, file and record, after the organisation’s retention period.';

/** The OpenAPI text of a recording upload. */
function Upload(): MethodDecorator {
  return applyDecorators(
    ApiConsumes('multipart/form-data'),
    ApiBody(UPLOAD_BODY),
    ApiPayloadTooLargeResponse({ description: 'Larger than the upload limit.' }),
    ApiUnsupportedMediaTypeResponse({ description: 'Not audio or video we can play, judged by its content.' }),
    ApiForbiddenResponse({ description: 'Not allowed for this caller or this student (e.g. no guardian consent for a minor).' }),
  );
}

@ApiTags('recordings')
@Controller()
export class RecordingsController {
  constructor(
    private readonly recordings: RecordingsService,
    private readonly storage: StorageService,
  ) {}

  private receiver(req: Request, res: Response) {
    return (opts: UploadOptions) => this.storage.receive(req, res, opts);
  }

  @Get('slots/:id/recordings')
  @Route({
    summary: 'Recordings of a slot, with short-lived playback URLs',
    description: 'For the candidate’s teachers, admins, the candidate, and the slot’s examiners while the sitting is in progress. Says whether the caller may add one, and why not.',
    roles: ['admin', 'teacher', 'examiner', 'student'],
    owned: true,
  })
  listForSlot(@IdParam() id: string): Promise<SlotRecordingsView> {
    return this.recordings.listForSlot(id);
  }

  @Post('slots/:id/recordings')
  @Route({
    summary: 'Add an audio or video recording to a slot',
    description: `By the candidate’s teacher or an admin; by the candidate themselves when the sitting is a recorded exam. ${CONSENT}`,
    roles: ['admin', 'teacher', 'student'],
    owned: true,
  })
  @Upload()
  uploadForSlot(@IdParam() id: string, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<RecordingView> {
    return this.recordings.uploadForSlot(id, this.receiver(req, res));
  }

  @Get('students/:id/recordings')
  @Route({ summary: 'A student’s practice recordings', description: 'For the student’s teachers, admins and the student.', roles: ['admin', 'teacher', 'student'], owned: true })
  listForStudent(@IdParam() id: string): Promise<RecordingView[]> {
    return this.recordings.listForStudent(id);
  }

  @Post('students/:id/recordings')
  @Route({ summary: 'Add a practice recording for a student', description: `By the student’s teacher, an admin or the student. ${CONSENT}`, roles: ['admin', 'teacher', 'student'], owned: true })
  @Upload()
  uploadPractice(@IdParam() id: string, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<RecordingView> {
    return this.recordings.uploadPractice(id, this.receiver(req, res));
  }

  @Get('recordings/:id/playback')
  @Route({ summary: 'A fresh playback URL for a recording (the previous one expires after a few minutes)', roles: ['admin', 'teacher', 'examiner', 'student'], owned: true })
  playback(@IdParam() id: string): Promise<PlaybackView> {
    return this.recordings.playback(id);
  }

  @Delete('recordings/:id')
  @HttpCode(204)
  @Route({ summary: 'Delete a recording (file and record; audited)', description: 'By its uploader, the student’s teacher or an admin.', roles: ['admin', 'teacher', 'student'], owned: true })
  @ApiNoContentResponse({ description: 'Deleted.' })
  async remove(@IdParam() id: string): Promise<void> {
    await this.recordings.remove(id);
  }

  @Get('recording-settings')
  @Route({ summary: 'The organisation’s recording retention period and upload limit', roles: ['admin'] })
  settings(): Promise<RecordingSettingsView> {
    return this.recordings.settings();
  }

  @Put('recording-settings')
  @Route({
    summary: 'Set how long recordings are kept',
    description: 'In days (7–1095). Applies to every stored recording, counted from when it was added; the retention job then deletes those past it.',
    roles: ['admin'],
  })
  updateSettings(@ValidBody(recordingSettingsSchema) body: RecordingSettingsInput): Promise<RecordingSettingsView> {
    return this.recordings.updateSettings(body);
  }

  @Put('sittings/:id/recorded-exam')
  @Route({ summary: 'Make a sitting a recorded exam (candidates may upload their own recording) or not', roles: ['admin', 'teacher'], owned: true })
  setRecordedExam(@IdParam() id: string, @ValidBody(recordedExamSchema) body: RecordedExamInput): Promise<{ sittingId: string; recordedExam: boolean }> {
    return this.recordings.setRecordedExam(id, body.recordedExam);
  }
}
