import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Result } from './entities/result.entity.js';
import { ResultsService } from './results.service.js';

/**
 * Results (issue 7). Depends on no other feature module (it reads marking and sitting tables
 * directly), so the sittings service can compute results as marking closes without a cycle.
 */
@Module({
  imports: [TypeOrmModule.forFeature([Result])],
  providers: [ResultsService],
  exports: [ResultsService],
})
export class ResultsModule {}
