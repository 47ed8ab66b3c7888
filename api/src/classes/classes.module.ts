import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { InvitationsModule } from '../invitations/invitations.module.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { ClassesController } from './classes.controller.js';
import { ClassesService } from './classes.service.js';
import { ClassGroup } from './entities/class-group.entity.js';
import { ClassImportService } from './import/class-import.service.js';
import { CsvUploadInterceptor } from './import/csv-upload.interceptor.js';
import { ImportProgressBoard } from './import/import-progress.js';

@Module({
  imports: [TypeOrmModule.forFeature([ClassGroup, Student, Membership]), InvitationsModule],
  controllers: [ClassesController],
  providers: [ClassesService, ClassImportService, CsvUploadInterceptor, ImportProgressBoard],
  exports: [ClassesService],
})
export class ClassesModule {}
