import { Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  changeRequestSchema,
  correctCellSchema,
  saveCellSchema,
  submitSheetSchema,
  type ChangeRequestInput,
  type CorrectCellInput,
  type DeskView,
  type MarkingSittingSummary,
  type MarkSheetView,
  type SaveCellInput,
  type SaveResult,
  type SubmitSheetInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody } from '../common/validation.js';
import { MarkingService } from './marking.service.js';

@ApiTags('marking')
@Controller()
export class MarkingController {
  constructor(private readonly marking: MarkingService) {}

  @Get('marking/today')
  @Route({
    summary: 'Today’s sittings and the slots the caller marks in them',
    roles: ['examiner'],
  })
  today(): Promise<MarkingSittingSummary[]> {
    return this.marking.myMarking();
  }

  @Get('slots/:id/desk')
  @Route({
    summary:
      'The marking desk of a slot: the draw, criteria, the candidate’s fingerings, the caller’s sheet',
    roles: ['examiner'],
    owned: true,
    description:
      'Only the slot’s examiners; the other examiner’s sheet appears once both are submitted.',
  })
  desk(@IdParam() id: string): Promise<DeskView> {
    return this.marking.desk(id);
  }

  @Post('slots/:id/start')
  @HttpCode(200)
  @Route({
    summary: 'Start a slot: the seeded draw (once per slot, audited) and the caller’s mark sheet',
    roles: ['examiner'],
    owned: true,
    description: 'The sitting must be in progress. Starting again answers the same draw and sheet.',
  })
  start(@IdParam() id: string): Promise<DeskView> {
    return this.marking.start(id);
  }

  @Post('slots/:id/request-changes')
  @HttpCode(200)
  @Route({
    summary: 'Change a drawn request, with the reason (recorded)',
    roles: ['examiner'],
    owned: true,
  })
  changeRequest(
    @IdParam() id: string,
    @ValidBody(changeRequestSchema) body: ChangeRequestInput,
  ): Promise<DeskView> {
    return this.marking.changeRequest(id, body);
  }

  @Get('mark-sheets/:id')
  @Route({
    summary: 'A mark sheet',
    roles: ['admin', 'examiner'],
    owned: true,
    description:
      'Blind second marking: an examiner sees the other examiner’s sheet, and an admin any sheet, only once every sheet of the slot is submitted.',
  })
  sheet(@IdParam() id: string): Promise<MarkSheetView> {
    return this.marking.getSheet(id);
  }

  @Post('mark-sheets/:id/cells')
  @HttpCode(200)
  @Route({
    summary: 'Save one cell of the caller’s sheet (idempotent by change id)',
    roles: ['examiner'],
    owned: true,
    description:
      'The same change id twice is applied once (answered `duplicate`). 409 with `details.kind` = "cell_conflict" (both values) when that same cell changed since `baseVersion`, or "submitted".',
  })
  @ApiConflictResponse({ description: 'The cell changed since, or the sheet is submitted.' })
  save(@IdParam() id: string, @ValidBody(saveCellSchema) body: SaveCellInput): Promise<SaveResult> {
    return this.marking.saveCell(id, body);
  }

  @Post('mark-sheets/:id/submit')
  @HttpCode(200)
  @Route({
    summary: 'Submit the caller’s sheet: read-only from then on',
    roles: ['examiner'],
    owned: true,
    description:
      '409 "queue_not_empty" when the client’s last change has not arrived; 400 with every missing mark.',
  })
  submit(
    @IdParam() id: string,
    @ValidBody(submitSheetSchema) body: SubmitSheetInput,
  ): Promise<DeskView> {
    return this.marking.submit(id, body);
  }

  @Post('mark-sheets/:id/corrections')
  @HttpCode(200)
  @Route({
    summary: 'Correct a cell of a submitted sheet, with a reason (audited with old and new values)',
    roles: ['examiner'],
    owned: true,
  })
  correct(
    @IdParam() id: string,
    @ValidBody(correctCellSchema) body: CorrectCellInput,
  ): Promise<SaveResult> {
    return this.marking.correct(id, body);
  }
}
