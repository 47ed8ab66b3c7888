import { Controller, Get } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import type { OutboxList } from '@stavemark/shared';
import { Route } from '../auth/auth.decorators.js';
import { OutboxService } from './outbox.service.js';

@ApiTags('development')
@Controller('dev/outbox')
export class OutboxController {
  constructor(private readonly outbox: OutboxService) {}

  @Get()
  @Route({
    summary: 'E-mails the local mail catcher received, rendered (not in production)',
    roles: ['admin'],
    description:
      'Only the organisation’s own mail. This route does not exist when NODE_ENV=production.',
  })
  list(): Promise<OutboxList> {
    return this.outbox.list();
  }
}
