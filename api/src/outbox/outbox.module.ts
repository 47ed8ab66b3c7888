import { Module, type DynamicModule } from '@nestjs/common';
import { OutboxController } from './outbox.controller.js';
import { OutboxService } from './outbox.service.js';

/** The Outbox exists only outside production: there, mail goes to a real SMTP server and no catcher. */
@Module({})
export class OutboxModule {
  static forEnvironment(nodeEnv: string | undefined = process.env.NODE_ENV): DynamicModule {
    if (nodeEnv === 'production') return { module: OutboxModule };
    return { module: OutboxModule, controllers: [OutboxController], providers: [OutboxService] };
  }
}
