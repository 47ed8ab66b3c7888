import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClassesModule } from '../classes/classes.module.js';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RequirementListsModule } from '../requirement-lists/requirement-lists.module.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { ResultsModule } from '../results/results.module.js';
import { AccessArrangementsService } from './access-arrangements.service.js';
import { BandPolicyService } from './band-policy.service.js';
import { AccessArrangement } from './entities/access-arrangement.entity.js';
import { BandPolicyVersion } from './entities/band-policy.entity.js';
import { SittingExaminer } from './entities/sitting-examiner.entity.js';
import { SittingPaper } from './entities/sitting-paper.entity.js';
import { Sitting } from './entities/sitting.entity.js';
import { Slot } from './entities/slot.entity.js';
import { ScheduleController, SittingsController, SlotsController } from './sittings.controller.js';
import { SittingsService } from './sittings.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Sitting, SittingPaper, SittingExaminer, Slot, AccessArrangement, BandPolicyVersion, RequirementListVersion, Student, ClassGroup, Membership, Organisation]),
    RequirementListsModule,
    ClassesModule,
    ResultsModule,
  ],
  controllers: [SittingsController, SlotsController, ScheduleController],
  // E-mail through the global MailModule (OutboundMail rows, sent after commit).
  providers: [SittingsService, AccessArrangementsService, BandPolicyService],
  // The marking desk and Today read sittings through the service.
  exports: [SittingsService],
})
export class SittingsModule {}
