import { Module } from '@nestjs/common';
import { AgreementController } from './agreement.controller.js';
import { AgreementService } from './agreement.service.js';

@Module({
  controllers: [AgreementController],
  providers: [AgreementService],
})
export class AgreementModule {}
