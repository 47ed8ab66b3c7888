import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SittingsModule } from '../sittings/sittings.module.js';
import { Student } from '../students/entities/student.entity.js';
import { Recording } from './entities/recording.entity.js';
import { RecordingsController } from './recordings.controller.js';
import { RecordingsRetention } from './recordings-retention.js';
import { RecordingsService } from './recordings.service.js';
import { RetentionQueue } from './retention-queue.js';

/** Recordings of slots and practice: upload, playback through signed URLs, retention (issue 6 §6). */
@Module({
  imports: [TypeOrmModule.forFeature([Recording, Slot, Sitting, Student]), SittingsModule],
  controllers: [RecordingsController],
  providers: [RecordingsService, RecordingsRetention, RetentionQueue],
  exports: [RecordingsService, RecordingsRetention, RetentionQueue],
})
export class RecordingsModule {}
