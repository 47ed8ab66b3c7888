import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { StudentFingering } from '../fingerings/entities/student-fingering.entity.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { AccessArrangement } from '../sittings/entities/access-arrangement.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SittingsModule } from '../sittings/sittings.module.js';
import { ResultsModule } from '../results/results.module.js';
import { MarkCell } from './entities/mark-cell.entity.js';
import { MarkChange } from './entities/mark-change.entity.js';
import { MarkSheet } from './entities/mark-sheet.entity.js';
import { SlotDraw } from './entities/slot-draw.entity.js';
import { MarkingController } from './marking.controller.js';
import { MarkingService } from './marking.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([
      Slot,
      SlotDraw,
      MarkSheet,
      MarkCell,
      MarkChange,
      AccessArrangement,
      StudentFingering,
      RubricVersion,
    ]),
    SittingsModule,
    ResultsModule,
  ],
  controllers: [MarkingController],
  providers: [MarkingService],
})
export class MarkingModule {}
