import { Controller, Get } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { Route } from '../auth/auth.decorators.js';
import { TodayService, type TodayView } from './today.service.js';

@ApiTags('today')
@Controller('today')
export class TodayController {
  constructor(private readonly today: TodayService) {}

  @Get()
  @Route({ summary: 'Each role’s home: the date in the organisation’s zone and what matters today' })
  get(): Promise<TodayView> {
    return this.today.today();
  }
}
