import { Controller, Get, Patch } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import {
  listStudentsQuerySchema,
  updateStudentSchema,
  type ListStudentsQuery,
  type StudentRow,
  type UpdateStudentInput,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { StudentsService } from './students.service.js';

@ApiTags('students')
@Controller('students')
export class StudentsController {
  constructor(private readonly students: StudentsService) {}

  @Get()
  @Route({
    summary: 'Find students (a teacher: those in own classes), at most 50',
    roles: ['admin', 'teacher'],
  })
  list(@ValidQuery(listStudentsQuerySchema) q: ListStudentsQuery): Promise<StudentRow[]> {
    return this.students.list(q);
  }

  @Patch(':id')
  @Route({
    summary: 'Deactivate or reactivate a student (records stay)',
    roles: ['admin', 'teacher'],
    owned: true,
  })
  update(
    @IdParam() id: string,
    @ValidBody(updateStudentSchema) body: UpdateStudentInput,
  ): Promise<StudentRow> {
    return this.students.update(id, body);
  }
}
