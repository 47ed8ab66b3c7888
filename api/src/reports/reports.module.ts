import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { SittingExaminer } from '../sittings/entities/sitting-examiner.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SittingsModule } from '../sittings/sittings.module.js';
import { ClassResultsController, ResultsReportsController, SittingResultsController } from './reports.controller.js';
import { ReportsService } from './reports.service.js';

/** Results pages, CSV exports and printable reports (issue 8 §3–5). */
@Module({
  imports: [TypeOrmModule.forFeature([Sitting, Slot, SittingExaminer, ClassGroup, Organisation]), SittingsModule],
  controllers: [SittingResultsController, ClassResultsController, ResultsReportsController],
  providers: [ReportsService],
})
export class ReportsModule {}
