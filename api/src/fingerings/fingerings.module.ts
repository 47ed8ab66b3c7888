import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Student } from '../students/entities/student.entity.js';
import { StudentFingering } from './entities/student-fingering.entity.js';
import { FingeringsController } from './fingerings.controller.js';
import { FingeringsService } from './fingerings.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([StudentFingering, Student])],
  controllers: [FingeringsController],
  providers: [FingeringsService],
  // The marking desk shows the current fingering through currentFor().
  exports: [FingeringsService],
})
export class FingeringsModule {}
