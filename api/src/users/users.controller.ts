import { Controller, Get, Patch, Post } from '@nestjs/common';
import { ApiConflictResponse, ApiTags } from '@nestjs/swagger';
import {
  createUserSchema,
  listUsersQuerySchema,
  updateUserSchema,
  type CreateUserInput,
  type ListUsersQuery,
  type Page,
  type UpdateUserInput,
  type UserRow,
} from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { IdParam, ValidBody, ValidQuery } from '../common/validation.js';
import { UsersService } from './users.service.js';

@ApiTags('people')
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @Route({ summary: 'People in the organisation, with search, sort and paging', roles: ['admin'] })
  list(@ValidQuery(listUsersQuerySchema) q: ListUsersQuery): Promise<Page<UserRow>> {
    return this.users.list(q);
  }

  @Post()
  @Route({ summary: 'Add a person to the organisation with roles', roles: ['admin'] })
  @ApiConflictResponse({ description: 'Already a member.' })
  create(@ValidBody(createUserSchema) body: CreateUserInput): Promise<UserRow> {
    return this.users.create(body);
  }

  @Patch(':id')
  @Route({ summary: 'Change a person’s name, roles or active state', roles: ['admin'], owned: true })
  update(@IdParam() id: string, @ValidBody(updateUserSchema) body: UpdateUserInput): Promise<UserRow> {
    return this.users.update(id, body);
  }
}
