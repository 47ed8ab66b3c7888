import {
  Controller,
  Delete,
  Get,
  Header,
  HttpCode,
  Patch,
  Post,
  Req,
  Res,
  UseInterceptors,
} from '@nestjs/common';
import {
  ApiBody,
  ApiConflictResponse,
  ApiConsumes,
  ApiPayloadTooLargeResponse,
  ApiProduces,
  ApiTags,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import {
  addClassMemberSchema,
  classImportQuerySchema,
  CLASS_IMPORT_MAX_BYTES,
  CLASS_IMPORT_MAX_ROWS,
  CLASS_LIST_COLUMNS,
  createClassSchema,
  listClassesQuerySchema,
  updateClassSchema,
  type AddClassMemberInput,
  type ClassDetail,
  type ClassImportQuery,
  type ClassRow,
  type CreateClassInput,
  type ImportReport,
  type ListClassesQuery,
  type UpdateClassInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { classListTemplate } from './class-list-export.js';
import { ClassesService } from './classes.service.js';
import { ClassImportService } from './import/class-import.service.js';
import { CsvUploadInterceptor } from './import/csv-upload.interceptor.js';
import { ImportProgressBoard, type ImportProgress } from './import/import-progress.js';
import { RequestContext } from '../common/request-context.js';
import { notFound } from '../common/errors.js';

const STAFF = ['admin', 'teacher'] as const;
const COLUMNS_DOC = CLASS_LIST_COLUMNS.map(
  (c) => `${c.header}${c.required ? '' : ' (optional)'}`,
).join(', ');

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

@ApiTags('classes')
@Controller('classes')
export class ClassesController {
  constructor(
    private readonly classes: ClassesService,
    private readonly importer: ClassImportService,
    private readonly progress: ImportProgressBoard,
  ) {}

  @Get()
  @Route({ summary: 'Classes: a teacher’s own, or all for an admin', roles: [...STAFF] })
  list(@ValidQuery(listClassesQuerySchema) q: ListClassesQuery): Promise<ClassRow[]> {
    return this.classes.list(q);
  }

  @Post()
  @Route({
    summary: 'Create a class',
    roles: [...STAFF],
    description: 'A teacher who creates a class teaches it.',
  })
  @ApiConflictResponse({ description: 'The class code is already used.' })
  create(@ValidBody(createClassSchema) body: CreateClassInput): Promise<ClassRow> {
    return this.classes.create(body);
  }

  @Get('import/template')
  @Route({
    summary: 'The class-list CSV template (header line)',
    roles: [...STAFF],
    description: `Columns: ${COLUMNS_DOC}.`,
  })
  @ApiProduces('text/csv')
  @Header('Content-Type', 'text/csv; charset=utf-8')
  @Header('Content-Disposition', 'attachment; filename="class-list-template.csv"')
  template(): string {
    return classListTemplate();
  }

  @Post('import')
  @HttpCode(200)
  @UseInterceptors(CsvUploadInterceptor)
  @Route({
    summary: 'Import a class list (CSV); dryRun=true previews it',
    roles: [...STAFF],
    description:
      `Multipart field "file": UTF-8 CSV (RFC 4180; comma or semicolon; header names in any case and order), at most ` +
      `${CLASS_IMPORT_MAX_ROWS} rows and ${CLASS_IMPORT_MAX_BYTES / 1024 / 1024} MB. Columns: ${COLUMNS_DOC}. Dates YYYY-MM-DD. ` +
      'Students are matched by pupil number, else by student e-mail; a blank optional cell keeps what is stored. ' +
      'The dry run reports every row as new, updated, unchanged or error with its line. Applying is all or nothing: ' +
      'any error answers 400 with the report in details.report and changes nothing. A teacher imports into own classes ' +
      'and new class codes only.',
  })
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file'],
      properties: {
        progressId: {
          type: 'string',
          format: 'uuid',
          description: 'Optional, before the file: GET /api/classes/import/progress/{progressId} then reports how far the import has come.',
        },
        file: { type: 'string', format: 'binary' },
      },
    },
  })
  @ApiPayloadTooLargeResponse({ description: 'Larger than 2 MB.' })
  importList(
    @Req() req: Request,
    @ValidQuery(classImportQuerySchema) q: ClassImportQuery,
  ): Promise<ImportReport> {
    const id = (req.body as { progressId?: unknown } | undefined)?.progressId;
    const progressId = typeof id === 'string' && UUID.test(id) ? id : null;
    return this.importer.import(req.file!, q.dryRun, progressId);
  }

  @Get('import/progress/:progressId')
  @Route({
    summary: 'How far an import sent with this progressId has come (while it runs)',
    roles: [...STAFF],
    description:
      'phase reading → checking (done/total rows) → writing (done/total steps) → done. 404 when this API instance knows no such import of the caller.',
  })
  importProgress(@IdParam('progressId') progressId: string): ImportProgress {
    const p = this.progress.get(RequestContext.requireCaller().membershipId, progressId);
    if (!p) throw notFound('import');
    return p;
  }

  @Get(':id')
  @Route({ summary: 'A class with its teachers and members', roles: [...STAFF], owned: true })
  detail(@IdParam() id: string): Promise<ClassDetail> {
    return this.classes.detail(id);
  }

  @Patch(':id')
  @Route({
    summary: 'Rename, deactivate or reactivate a class; admins also set its teachers',
    roles: [...STAFF],
    owned: true,
  })
  update(
    @IdParam() id: string,
    @ValidBody(updateClassSchema) body: UpdateClassInput,
  ): Promise<ClassRow> {
    return this.classes.update(id, body);
  }

  @Get(':id/export')
  @Route({
    summary: 'The class list as CSV, in the import layout',
    roles: [...STAFF],
    owned: true,
    description: 'Importing it again changes nothing.',
  })
  @ApiProduces('text/csv')
  async exportList(
    @IdParam() id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const { fileName, csv } = await this.classes.exportCsv(id);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.setHeader('Cache-Control', 'no-store');
    return csv;
  }

  @Post(':id/members')
  @HttpCode(200)
  @Route({
    summary: 'Add a student to the class, or move one here from another class',
    roles: [...STAFF],
    owned: true,
  })
  addMember(
    @IdParam() id: string,
    @ValidBody(addClassMemberSchema) body: AddClassMemberInput,
  ): Promise<ClassDetail> {
    return this.classes.addMember(id, body);
  }

  @Delete(':id/members/:studentId')
  @HttpCode(204)
  @Route({
    summary: 'Take a student out of the class (the student and their records stay)',
    roles: [...STAFF],
    owned: true,
  })
  async removeMember(
    @IdParam() id: string,
    @IdParam('studentId') studentId: string,
  ): Promise<void> {
    await this.classes.removeMember(id, studentId);
  }
}
