import { Controller, Get, Res } from '@nestjs/common';
import { ApiOkResponse, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import {
  csvExportQuerySchema,
  periodCsvExportQuerySchema,
  resultsPeriodQuerySchema,
  SITTING_EXPORT_COLUMNS,
  YEAR_EXPORT_COLUMNS,
  type ClassComparisonView,
  type ClassResultsView,
  type CsvExportQuery,
  type PeriodCsvExportQuery,
  type ResultsPeriodQuery,
  type SittingResultsView,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidQuery } from '../common/validation.js';
import { ReportsService } from './reports.service.js';

const STAFF = ['admin', 'teacher'] as const;
const CSV_DOC =
  'CSV per RFC 4180 (UTF-8, CRLF line ends, a header line), streamed as it is read from the database. Cells that a ' +
  'spreadsheet would run as a formula (starting with =, +, -, @, tab or carriage return) get a leading apostrophe. ' +
  'bom=true starts the file with a UTF-8 byte-order mark, which some spreadsheets need to read accents.';
const CSV_OK = { description: 'The CSV file (text/csv). X-Expected-Rows, when sent, is the number of data rows.', schema: { type: 'string' } };
const PDF_OK = { description: 'The PDF file (application/pdf).', schema: { type: 'string', format: 'binary' } };

function sendPdf(res: Response, file: { fileName: string; pdf: Buffer }): void {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.send(file.pdf);
}

@ApiTags('results')
@Controller('sittings')
export class SittingResultsController {
  constructor(private readonly reports: ReportsService) {}

  @Get(':id/results')
  @Route({
    summary: 'A sitting’s results: a row per candidate, band counts and criterion means',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description:
      'Admins and the sitting’s planner see every candidate; a teacher sees their own pupils; an examiner on the panel ' +
      'sees the candidates they marked once marking has closed.',
  })
  sitting(@IdParam() id: string): Promise<SittingResultsView> {
    return this.reports.sittingResults(id);
  }

  @Get(':id/results/export')
  @Route({
    summary: 'A sitting’s results as CSV',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: `${CSV_DOC} Columns: ${SITTING_EXPORT_COLUMNS.join(', ')}, then one per criterion (its share in percent). The same rows as the results page.`,
  })
  @ApiProduces('text/csv')
  @ApiOkResponse(CSV_OK)
  async exportSitting(@IdParam() id: string, @ValidQuery(csvExportQuerySchema) q: CsvExportQuery, @Res() res: Response): Promise<void> {
    await this.reports.exportSitting(id, res, q.bom);
  }
}

@ApiTags('results')
@Controller('classes')
export class ClassResultsController {
  constructor(private readonly reports: ReportsService) {}

  @Get(':id/results')
  @Route({
    summary: 'A class’s results across sittings over a period',
    roles: [...STAFF],
    owned: true,
    description: 'Without from and to: the academic year of the class’s term, or the twelve months up to today.',
  })
  results(@IdParam() id: string, @ValidQuery(resultsPeriodQuerySchema) q: ResultsPeriodQuery): Promise<ClassResultsView> {
    return this.reports.classResults(id, q);
  }

  @Get(':id/results/export')
  @Route({
    summary: 'A class’s year of marks as CSV: one row per student, sitting, request and criterion',
    roles: [...STAFF],
    owned: true,
    description: `${CSV_DOC} Columns: ${YEAR_EXPORT_COLUMNS.join(', ')}. The period as for the class’s results.`,
  })
  @ApiProduces('text/csv')
  @ApiOkResponse(CSV_OK)
  async exportYear(@IdParam() id: string, @ValidQuery(periodCsvExportQuerySchema) q: PeriodCsvExportQuery, @Res() res: Response): Promise<void> {
    await this.reports.exportClassYear(id, q, res, q.bom);
  }

  @Get(':id/results/summary')
  @Route({ summary: 'A class summary as PDF (bands, sittings, students, criteria)', roles: [...STAFF], owned: true })
  @ApiProduces('application/pdf')
  @ApiOkResponse(PDF_OK)
  async summary(@IdParam() id: string, @ValidQuery(resultsPeriodQuerySchema) q: ResultsPeriodQuery, @Res() res: Response): Promise<void> {
    sendPdf(res, await this.reports.classSummaryPdf(id, q));
  }
}

@ApiTags('results')
@Controller('results')
export class ResultsReportsController {
  constructor(private readonly reports: ReportsService) {}

  @Get('classes')
  @Route({
    summary: 'Classes side by side over a period: results, mean, median and bands',
    roles: [...STAFF],
    description: 'An admin compares every active class; a teacher the classes they teach.',
  })
  compare(@ValidQuery(resultsPeriodQuerySchema) q: ResultsPeriodQuery): Promise<ClassComparisonView> {
    return this.reports.compareClasses(q);
  }

  @Get('export')
  @Route({
    summary: 'The organisation’s marks over a period as CSV (the office’s export)',
    roles: ['admin'],
    description: `${CSV_DOC} Columns: ${YEAR_EXPORT_COLUMNS.join(', ')}. Without from and to: the twelve months up to today.`,
  })
  @ApiProduces('text/csv')
  @ApiOkResponse(CSV_OK)
  async exportAll(@ValidQuery(periodCsvExportQuerySchema) q: PeriodCsvExportQuery, @Res() res: Response): Promise<void> {
    await this.reports.exportOrganisationYear(q, res, q.bom);
  }

  @Get(':id/mark-sheet')
  @Route({
    summary: 'One candidate’s mark sheet as PDF (requests, criteria, marks, comments, total, band, examiner)',
    roles: ['admin', 'teacher', 'examiner'],
    owned: true,
    description: 'For those who see the result on the sitting’s results page.',
  })
  @ApiProduces('application/pdf')
  @ApiOkResponse(PDF_OK)
  async markSheet(@IdParam() id: string, @Res() res: Response): Promise<void> {
    sendPdf(res, await this.reports.markSheetPdf(id));
  }

  @Get(':id/take-home')
  @Route({
    summary: 'The take-home report as PDF: the result, strengths and next steps in plain words',
    roles: ['admin', 'teacher', 'student'],
    owned: true,
    description: 'The student reads their own once it is released.',
  })
  @ApiProduces('application/pdf')
  @ApiOkResponse(PDF_OK)
  async takeHome(@IdParam() id: string, @Res() res: Response): Promise<void> {
    sendPdf(res, await this.reports.takeHomePdf(id));
  }
}
