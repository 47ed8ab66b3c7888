import { Module } from '@nestjs/common';
import { ResultsModule } from '../results/results.module.js';
import { ModerationController } from './moderation.controller.js';
import { ModerationService } from './moderation.service.js';

/** Moderation of double-marked pairs (issue 7 §2): flags, agreed marks, third marking. */
@Module({
  imports: [ResultsModule],
  controllers: [ModerationController],
  providers: [ModerationService],
})
export class ModerationModule {}
