import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Term } from '../organisations/entities/term.entity.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { TodayController } from './today.controller.js';
import { TodayService } from './today.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Membership, Student, ClassGroup, Term, Organisation, Sitting])],
  controllers: [TodayController],
  providers: [TodayService],
})
export class TodayModule {}
