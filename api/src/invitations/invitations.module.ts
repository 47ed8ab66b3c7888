import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module.js';
import { InvitationsController } from './invitations.controller.js';
import { InvitationsService } from './invitations.service.js';
import { LinkThrottlerGuard } from './link-throttler.guard.js';

@Module({
  imports: [AuthModule],
  controllers: [InvitationsController],
  providers: [InvitationsService, LinkThrottlerGuard],
  exports: [InvitationsService],
})
export class InvitationsModule {}
