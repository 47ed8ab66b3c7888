import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { RequirementLineRow } from './entities/requirement-line.entity.js';
import { RequirementListVersion } from './entities/requirement-list-version.entity.js';
import { RequirementList } from './entities/requirement-list.entity.js';
import {
  RequirementListsController,
  RequirementListVersionsController,
} from './requirement-lists.controller.js';
import { RequirementListsService } from './requirement-lists.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([
      RequirementList,
      RequirementListVersion,
      RequirementLineRow,
      RubricVersion,
    ]),
  ],
  controllers: [RequirementListsController, RequirementListVersionsController],
  providers: [RequirementListsService],
  // Sittings call markUsed() when they pin a version.
  exports: [RequirementListsService],
})
export class RequirementListsModule {}
