import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClassesModule } from '../classes/classes.module.js';
import { Student } from './entities/student.entity.js';
import { StudentsController } from './students.controller.js';
import { StudentsService } from './students.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Student]), ClassesModule],
  controllers: [StudentsController],
  providers: [StudentsService],
})
export class StudentsModule {}
