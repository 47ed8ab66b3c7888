import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuthModule } from '../auth/auth.module.js';
import { InvitationsModule } from '../invitations/invitations.module.js';
import { Membership } from './entities/membership.entity.js';
import { Person } from './entities/person.entity.js';
import { UsersController } from './users.controller.js';
import { UsersService } from './users.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Person, Membership]), AuthModule, InvitationsModule],
  controllers: [UsersController],
  providers: [UsersService],
})
export class UsersModule {}
