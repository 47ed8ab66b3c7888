import { Controller, Get, HttpCode, Post, Put } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  listRequirementListsQuerySchema,
  requirementListVersionBodySchema,
  type ListRequirementListsQuery,
  type RequirementListDetail,
  type RequirementListSummary,
  type RequirementListVersionBody,
  type RequirementListVersionView,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { RequirementListsService } from './requirement-lists.service.js';

const EDITORS = ['admin', 'teacher'] as const;
const READERS_NOTE = 'Examiners and students see published versions only.';

@ApiTags('requirement lists')
@Controller('requirement-lists')
export class RequirementListsController {
  constructor(private readonly lists: RequirementListsService) {}

  @Get()
  @Route({
    summary: 'Requirement lists by grade, with their latest and published versions',
    description: READERS_NOTE,
  })
  list(
    @ValidQuery(listRequirementListsQuerySchema) q: ListRequirementListsQuery,
  ): Promise<RequirementListSummary[]> {
    return this.lists.list(q);
  }

  @Post()
  @Route({
    summary: 'Create a requirement list (its first version, as a draft)',
    roles: [...EDITORS],
  })
  create(
    @ValidBody(requirementListVersionBodySchema) body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    return this.lists.create(body);
  }

  @Get(':id')
  @Route({
    summary: 'A requirement list with its versions',
    description: READERS_NOTE,
    owned: true,
  })
  get(@IdParam() id: string): Promise<RequirementListDetail> {
    return this.lists.get(id);
  }

  @Post(':id/versions')
  @Route({
    summary: 'Edit a published list: save the edit as a new draft version',
    roles: [...EDITORS],
    owned: true,
  })
  @ApiConflictResponse({ description: 'The list already has a draft version.' })
  createVersion(
    @IdParam() id: string,
    @ValidBody(requirementListVersionBodySchema) body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    return this.lists.createVersion(id, body);
  }
}

@ApiTags('requirement lists')
@Controller('requirement-list-versions')
export class RequirementListVersionsController {
  constructor(private readonly lists: RequirementListsService) {}

  @Get(':id')
  @Route({
    summary: 'One requirement list version with its lines',
    description: READERS_NOTE,
    owned: true,
  })
  get(@IdParam() id: string): Promise<RequirementListVersionView> {
    return this.lists.getVersion(id);
  }

  @Put(':id')
  @Route({ summary: 'Replace the content of a draft version', roles: [...EDITORS], owned: true })
  @ApiConflictResponse({
    description: 'The version is published or used by a sitting and cannot change.',
  })
  update(
    @IdParam() id: string,
    @ValidBody(requirementListVersionBodySchema) body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    return this.lists.updateVersion(id, body);
  }

  @Post(':id/publish')
  @HttpCode(200)
  @Route({
    summary: 'Publish a draft version',
    description:
      'Every line must use a published rubric version and the selection rule must be drawable.',
    roles: [...EDITORS],
    owned: true,
  })
  @ApiConflictResponse({
    description: 'Already published, a line’s rubric is a draft, or the rule cannot be honoured.',
  })
  publish(@IdParam() id: string): Promise<RequirementListVersionView> {
    return this.lists.publish(id);
  }
}
