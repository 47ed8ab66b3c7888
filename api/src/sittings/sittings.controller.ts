import { Controller, Delete, Get, Header, HttpCode, Patch, Post, Put, Res } from '@nestjs/common';
import { ApiConflictResponse, ApiNoContentResponse, ApiOkResponse, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import {
  accessArrangementSchema,
  addCandidatesSchema,
  bandPolicyBodySchema,
  changeSittingStatusSchema,
  createResitSchema,
  createSittingSchema,
  dayScheduleQuerySchema,
  doubleMarkingSchema,
  listSittingsQuerySchema,
  moveSlotSchema,
  recordOutcomeSchema,
  swapSlotsSchema,
  updateSittingSchema,
  updateSlotSchema,
  type AccessArrangementInput,
  type AccessArrangementView,
  type AddCandidatesInput,
  type BandPolicyBody,
  type BandPolicyView,
  type ChangeSittingStatusInput,
  type CreateResitInput,
  type CreateSittingInput,
  type DaySchedule,
  type DayScheduleQuery,
  type DoubleMarkingInput,
  type ExaminerOption,
  type ListSittingsQuery,
  type MoveSlotInput,
  type RecordOutcomeInput,
  type SittingSummary,
  type SittingView,
  type SwapSlotsInput,
  type UpdateSittingInput,
  type UpdateSlotInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { AccessArrangementsService } from './access-arrangements.service.js';
import { BandPolicyService } from './band-policy.service.js';
import { SittingsService } from './sittings.service.js';

const PLANNERS = ['admin', 'teacher'] as const;
const CONFLICTS = 'Refused with 409 and `details.kind` = "conflicts" (room, candidate or examiner elsewhere at the time, a slot past the day’s end or in a break) or "own_pupil" (an examiner teaches the candidate: send `acknowledgeOwnPupil: true` to go ahead; it is recorded).';

@ApiTags('sittings')
@Controller('sittings')
export class SittingsController {
  constructor(private readonly sittings: SittingsService) {}

  @Get()
  @Route({
    summary: 'Sittings the caller may see',
    description: 'Planners see theirs, teachers those with their pupils, examiners the scheduled ones they sit on, students those they take part in (with only their own slot).',
  })
  list(@ValidQuery(listSittingsQuerySchema) q: ListSittingsQuery): Promise<SittingSummary[]> {
    return this.sittings.list(q);
  }

  @Post()
  @Route({ summary: 'Plan a sitting (a draft): date, room, day, breaks, lists and examiners', roles: [...PLANNERS], description: CONFLICTS })
  @ApiConflictResponse({ description: 'The room is booked then.' })
  create(@ValidBody(createSittingSchema) body: CreateSittingInput): Promise<SittingView> {
    return this.sittings.create(body);
  }

  @Get(':id')
  @Route({ summary: 'A sitting with the slots the caller may see', owned: true, description: 'Access arrangements appear only for the candidate’s teachers, admins and, while marking, the slot’s examiners.' })
  get(@IdParam() id: string): Promise<SittingView> {
    return this.sittings.get(id);
  }

  @Patch(':id')
  @Route({ summary: 'Change a draft or scheduled sitting (lists and write-up gap only while a draft)', roles: [...PLANNERS], owned: true, description: CONFLICTS })
  @ApiConflictResponse({ description: 'A conflict, an own pupil to acknowledge, or a pinned field.' })
  update(@IdParam() id: string, @ValidBody(updateSittingSchema) body: UpdateSittingInput): Promise<SittingView> {
    return this.sittings.update(id, body);
  }

  @Delete(':id')
  @HttpCode(204)
  @Route({ summary: 'Delete a draft sitting', roles: [...PLANNERS], owned: true })
  @ApiNoContentResponse({ description: 'Deleted.' })
  async remove(@IdParam() id: string): Promise<void> {
    await this.sittings.remove(id);
  }

  @Post(':id/candidates')
  @HttpCode(200)
  @Route({
    summary: 'Add candidates from a class or by student, each to the list of their grade',
    roles: [...PLANNERS],
    owned: true,
    description: `Answers the sitting with \`added\` and \`skipped\` (with a reason each). ${CONFLICTS}`,
  })
  addCandidates(@IdParam() id: string, @ValidBody(addCandidatesSchema) body: AddCandidatesInput): Promise<SittingView> {
    return this.sittings.addCandidates(id, body);
  }

  @Post(':id/double-marking')
  @HttpCode(200)
  @Route({
    summary: 'Double marking: give a share of the slots (or chosen slots) a second examiner',
    roles: [...PLANNERS],
    owned: true,
    description: `Balanced across examiner pairs, avoiding examiners who teach the candidate or are busy elsewhere. Slots not chosen lose their second examiner. ${CONFLICTS}`,
  })
  doubleMarking(@IdParam() id: string, @ValidBody(doubleMarkingSchema) body: DoubleMarkingInput): Promise<SittingView> {
    return this.sittings.doubleMarking(id, body);
  }

  @Post(':id/status')
  @HttpCode(200)
  @Route({
    summary: 'Move a sitting on: draft → scheduled → in_progress → marking_closed → published',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description:
      'Scheduling pins the requirement-list versions, their rubric versions and the band policy version, and e-mails the examiners and candidates (guardians for minors) with a calendar file. An examiner on the panel may start the sitting on its day. Closing marking needs an outcome for every slot.',
  })
  changeStatus(@IdParam() id: string, @ValidBody(changeSittingStatusSchema) body: ChangeSittingStatusInput): Promise<SittingView> {
    return this.sittings.changeStatus(id, body);
  }

  @Get(':id/calendar')
  @Route({
    summary: 'The sitting as an iCalendar file (RFC 5545): one event per slot the caller may see',
    owned: true,
    description: 'text/calendar; times carry the organisation’s time zone as TZID with a VTIMEZONE built from the zone’s real offsets (not UTC), so calendars show the same local times.',
  })
  @ApiProduces('text/calendar')
  @ApiOkResponse({ description: 'An .ics file (attachment).', content: { 'text/calendar': { schema: { type: 'string' } } } })
  async calendar(@IdParam() id: string, @Res({ passthrough: true }) res: Response): Promise<string> {
    const { filename, ics } = await this.sittings.calendar(id);
    res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
    return ics;
  }
}

@ApiTags('sittings')
@Controller('slots')
export class SlotsController {
  constructor(private readonly sittings: SittingsService) {}

  @Patch(':id')
  @Route({ summary: 'Change a slot: its examiner, second examiner, chosen start time or list', roles: [...PLANNERS], owned: true, description: CONFLICTS })
  update(@IdParam() id: string, @ValidBody(updateSlotSchema) body: UpdateSlotInput): Promise<SittingView> {
    return this.sittings.updateSlot(id, body);
  }

  @Post(':id/move')
  @HttpCode(200)
  @Route({ summary: 'Move a slot one place earlier or later in the day', roles: [...PLANNERS], owned: true, description: CONFLICTS })
  move(@IdParam() id: string, @ValidBody(moveSlotSchema) body: MoveSlotInput): Promise<SittingView> {
    return this.sittings.moveSlot(id, body);
  }

  @Post(':id/swap')
  @HttpCode(200)
  @Route({ summary: 'Swap two slots of the same sitting', roles: [...PLANNERS], owned: true, description: CONFLICTS })
  swap(@IdParam() id: string, @ValidBody(swapSlotsSchema) body: SwapSlotsInput): Promise<SittingView> {
    return this.sittings.swapSlots(id, body);
  }

  @Delete(':id')
  @Route({ summary: 'Take a candidate out of a draft or scheduled sitting (they are told when it was scheduled)', roles: [...PLANNERS], owned: true })
  remove(@IdParam() id: string): Promise<SittingView> {
    return this.sittings.removeSlot(id);
  }

  @Post(':id/outcome')
  @HttpCode(200)
  @Route({
    summary: 'Record a slot’s outcome: completed, absent, withdrawn or incomplete',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: 'By the slot’s examiners, the candidate’s teachers, the planner or an admin; only a withdrawal before the slot starts.',
  })
  outcome(@IdParam() id: string, @ValidBody(recordOutcomeSchema) body: RecordOutcomeInput): Promise<SittingView> {
    return this.sittings.recordOutcome(id, body);
  }

  @Post(':id/resit')
  @Route({ summary: 'A re-sit: a new slot, in a sitting with the same list, linked to the attempt it repeats', roles: [...PLANNERS], owned: true, description: CONFLICTS })
  resit(@IdParam() id: string, @ValidBody(createResitSchema) body: CreateResitInput): Promise<SittingView> {
    return this.sittings.createResit(id, body);
  }
}

@ApiTags('sittings')
@Controller()
export class ScheduleController {
  constructor(
    private readonly sittings: SittingsService,
    private readonly arrangements: AccessArrangementsService,
    private readonly bandPolicy: BandPolicyService,
  ) {}

  @Get('day-schedule')
  @Route({ summary: 'The printable day schedule: every slot of a date by room and by examiner', roles: ['admin', 'teacher', 'examiner'], description: 'An examiner sees their own column only.' })
  daySchedule(@ValidQuery(dayScheduleQuerySchema) q: DayScheduleQuery): Promise<DaySchedule> {
    return this.sittings.daySchedule(q.date);
  }

  @Get('examiners')
  @Route({ summary: 'Members with the examiner role, to choose a sitting’s panel from', roles: [...PLANNERS] })
  examiners(): Promise<ExaminerOption[]> {
    return this.sittings.examinerOptions();
  }

  @Get('students/:id/access-arrangement')
  @Route({
    summary: 'A candidate’s access arrangement (confidential)',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: 'The candidate’s teachers and admins; an examiner only while marking this candidate in a sitting in progress.',
  })
  getArrangement(@IdParam() id: string): Promise<AccessArrangementView> {
    return this.arrangements.get(id);
  }

  @Put('students/:id/access-arrangement')
  @Header('Cache-Control', 'no-store')
  @Route({
    summary: 'Set a candidate’s access arrangement: extra time, rest breaks, approved substitutions',
    roles: [...PLANNERS],
    owned: true,
    description: 'Draft and scheduled sittings with this candidate are laid out again at once; a change that no longer fits their day is refused (409).',
  })
  putArrangement(@IdParam() id: string, @ValidBody(accessArrangementSchema) body: AccessArrangementInput): Promise<AccessArrangementView> {
    return this.arrangements.put(id, body);
  }

  @Get('band-policy')
  @Route({ summary: 'The band policy: the current version and its history', roles: [...PLANNERS] })
  getBandPolicy(): Promise<BandPolicyView> {
    return this.bandPolicy.get();
  }

  @Post('band-policy')
  @Route({ summary: 'A new version of the band policy (scheduled sittings keep the version they pinned)', roles: ['admin'] })
  createBandPolicy(@ValidBody(bandPolicyBodySchema) body: BandPolicyBody): Promise<BandPolicyView> {
    return this.bandPolicy.create(body);
  }
}
