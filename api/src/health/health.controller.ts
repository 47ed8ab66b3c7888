import { Controller, Get, Res } from '@nestjs/common';
import { ApiServiceUnavailableResponse, ApiTags } from '@nestjs/swagger';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Response } from 'express';
import { DataSource } from 'typeorm';
import { PublicRoute } from '../auth/auth.decorators.js';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  @Get()
  @PublicRoute('Is the server up and can it reach its database?')
  @ApiServiceUnavailableResponse({ description: 'The database cannot be reached.' })
  async health(@Res({ passthrough: true }) res: Response): Promise<{ status: string; database: string }> {
    try {
      await Promise.race([
        this.db.query('SELECT 1'),
        new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000)),
      ]);
      return { status: 'ok', database: 'up' };
    } catch {
      res.status(503);
      return { status: 'degraded', database: 'down' };
    }
  }
}
