import { Module } from '@nestjs/common';
import { StandardisationController } from './standardisation.controller.js';
import { StandardisationService } from './standardisation.service.js';

@Module({
  controllers: [StandardisationController],
  providers: [StandardisationService],
})
export class StandardisationModule {}
