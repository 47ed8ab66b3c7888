import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RubricCriterionRow } from './entities/rubric-criterion.entity.js';
import { RubricVersion } from './entities/rubric-version.entity.js';
import { Rubric } from './entities/rubric.entity.js';
import { RubricsController, RubricVersionsController } from './rubrics.controller.js';
import { RubricsService } from './rubrics.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Rubric, RubricVersion, RubricCriterionRow])],
  controllers: [RubricsController, RubricVersionsController],
  providers: [RubricsService],
  exports: [RubricsService],
})
export class RubricsModule {}
