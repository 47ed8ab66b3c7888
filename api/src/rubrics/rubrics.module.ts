import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RequirementList } from '../requirement-lists/entities/requirement-list.entity.js';
import { RubricCriterionRow } from './entities/rubric-criterion.entity.js';
import { RubricVersion } from './entities/rubric-version.entity.js';
import { Rubric } from './entities/rubric.entity.js';
import { RubricsController, RubricVersionsController } from './rubrics.controller.js';
import { RubricsService } from './rubrics.service.js';
import { StarterLibraryController } from './starter-library.controller.js';
import { StarterLibraryService } from './starter-library.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([
      Rubric,
      RubricVersion,
      RubricCriterionRow,
      // The starter library adds lists as well as rubrics.
      RequirementList,
      RequirementListVersion,
    ]),
  ],
  controllers: [RubricsController, RubricVersionsController, StarterLibraryController],
  providers: [RubricsService, StarterLibraryService],
  exports: [RubricsService],
})
export class RubricsModule {}
