import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountToken } from '../invitations/entities/account-token.entity.js';
import { OutboundMail } from './entities/outbound-mail.entity.js';
import { MailQueue } from './mail-queue.js';
import { MailSender } from './mail-sender.js';
import { MailService } from './mail.service.js';

/** E-mail: rows written with the change, jobs in pg-boss, sent after commit. Global: any feature may send. */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([OutboundMail, AccountToken])],
  providers: [MailQueue, MailSender, MailService],
  exports: [MailService, MailQueue],
})
export class MailModule {}
