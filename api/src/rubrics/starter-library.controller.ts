import { Controller, Get, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  adoptStarterBodySchema,
  type AdoptStarterBody,
  type RubricVersionView,
  type StarterLibraryView,
  type StarterListAdoption,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { ValidBody } from '../common/validation.js';
import { StarterLibraryService } from './starter-library.service.js';

const EDITORS = ['admin', 'teacher'] as const;

@ApiTags('starter library')
@Controller('starter-library')
export class StarterLibraryController {
  constructor(private readonly starter: StarterLibraryService) {}

  @Get()
  @Route({
    summary: 'The starter rubrics and requirement lists, and which of them your school has',
    roles: [...EDITORS],
  })
  catalogue(): Promise<StarterLibraryView> {
    return this.starter.catalogue();
  }

  @Post('rubrics')
  @Route({
    summary: 'Add a starter rubric to your school (a new rubric, version 1 published)',
    roles: [...EDITORS],
  })
  @ApiConflictResponse({ description: 'Your school already has this starter rubric.' })
  adoptRubric(
    @ValidBody(adoptStarterBodySchema) body: AdoptStarterBody,
  ): Promise<RubricVersionView> {
    return this.starter.adoptRubric(body.key);
  }

  @Post('requirement-lists')
  @Route({
    summary: 'Add a starter requirement list to your school, with the starter rubrics it needs',
    description:
      'Version 1 is published. Starter rubrics the list is marked with are added too when your school has none of them; a copy you already have is used as it now stands.',
    roles: [...EDITORS],
  })
  @ApiConflictResponse({ description: 'Your school already has this starter list.' })
  adoptList(
    @ValidBody(adoptStarterBodySchema) body: AdoptStarterBody,
  ): Promise<StarterListAdoption> {
    return this.starter.adoptList(body.key);
  }
}
