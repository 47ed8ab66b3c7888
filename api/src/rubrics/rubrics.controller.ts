import {
  Controller,
  Get,
  HttpCode,
  Post,
  Put,
  Res,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import {
  ApiBody,
  ApiConflictResponse,
  ApiConsumes,
  ApiPayloadTooLargeResponse,
  ApiProduces,
  ApiTags,
} from '@nestjs/swagger';
import type { Response } from 'express';
import { memoryStorage } from 'multer';
import {
  listRubricsQuerySchema,
  RUBRIC_FILE_MAX_BYTES,
  rubricBodySchema,
  type ListRubricsQuery,
  type RubricBody,
  type RubricDetail,
  type RubricFile,
  type RubricSummary,
  type RubricVersionView,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { invalid } from '../common/errors.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { RubricsService } from './rubrics.service.js';

const EDITORS = ['admin', 'teacher'] as const;
const READERS_NOTE = 'Examiners and students see published versions only.';

@ApiTags('rubrics')
@Controller('rubrics')
export class RubricsController {
  constructor(private readonly rubrics: RubricsService) {}

  @Get()
  @Route({ summary: 'Rubrics with their latest and published versions', description: READERS_NOTE })
  list(@ValidQuery(listRubricsQuerySchema) q: ListRubricsQuery): Promise<RubricSummary[]> {
    return this.rubrics.list(q);
  }

  @Post()
  @Route({ summary: 'Create a rubric (its first version, as a draft)', roles: [...EDITORS] })
  create(@ValidBody(rubricBodySchema) body: RubricBody): Promise<RubricVersionView> {
    return this.rubrics.create(body);
  }

  @Post('import')
  @Route({
    summary: 'Import a rubric file as a new rubric with a draft version',
    description: `A JSON file in the rubric file format (rubrics/README.md), at most ${RUBRIC_FILE_MAX_BYTES / 1024} kB, in the form field "file". Errors name the path in the file.`,
    roles: [...EDITORS],
  })
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file'],
      properties: { file: { type: 'string', format: 'binary' } },
    },
  })
  @ApiPayloadTooLargeResponse({ description: 'The file is larger than the limit.' })
  @UseInterceptors(
    FileInterceptor('file', {
      storage: memoryStorage(),
      limits: { fileSize: RUBRIC_FILE_MAX_BYTES, files: 1 },
    }),
  )
  import(@UploadedFile() file: Express.Multer.File | undefined): Promise<RubricVersionView> {
    if (!file)
      throw invalid('Choose a rubric file to import (form field "file").', [
        { path: 'file', message: 'missing' },
      ]);
    return this.rubrics.import(file.buffer);
  }

  @Get(':id')
  @Route({ summary: 'A rubric with its versions', description: READERS_NOTE, owned: true })
  get(@IdParam() id: string): Promise<RubricDetail> {
    return this.rubrics.get(id);
  }

  @Post(':id/versions')
  @Route({
    summary: 'Edit a published rubric: save the edit as a new draft version',
    roles: [...EDITORS],
    owned: true,
  })
  @ApiConflictResponse({ description: 'The rubric already has a draft version.' })
  createVersion(
    @IdParam() id: string,
    @ValidBody(rubricBodySchema) body: RubricBody,
  ): Promise<RubricVersionView> {
    return this.rubrics.createVersion(id, body);
  }
}

@ApiTags('rubrics')
@Controller('rubric-versions')
export class RubricVersionsController {
  constructor(private readonly rubrics: RubricsService) {}

  @Get(':id')
  @Route({
    summary: 'One rubric version with its criteria and level descriptors',
    description: READERS_NOTE,
    owned: true,
  })
  get(@IdParam() id: string): Promise<RubricVersionView> {
    return this.rubrics.getVersion(id);
  }

  @Put(':id')
  @Route({ summary: 'Replace the content of a draft version', roles: [...EDITORS], owned: true })
  @ApiConflictResponse({ description: 'The version is published and cannot change.' })
  update(
    @IdParam() id: string,
    @ValidBody(rubricBodySchema) body: RubricBody,
  ): Promise<RubricVersionView> {
    return this.rubrics.updateVersion(id, body);
  }

  @Post(':id/publish')
  @HttpCode(200)
  @Route({
    summary: 'Publish a draft version; from then on it never changes',
    roles: [...EDITORS],
    owned: true,
  })
  @ApiConflictResponse({ description: 'Already published.' })
  publish(@IdParam() id: string): Promise<RubricVersionView> {
    return this.rubrics.publish(id);
  }

  @Get(':id/export')
  @Route({
    summary: 'Download a version as a rubric file (JSON)',
    description: READERS_NOTE,
    owned: true,
  })
  @ApiProduces('application/json')
  async export(
    @IdParam() id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<RubricFile> {
    const { fileName, file } = await this.rubrics.export(id);
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    return file;
  }
}
