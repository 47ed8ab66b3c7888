import { Module } from '@nestjs/common';
import { APP_FILTER } from '@nestjs/core';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from './audit/audit.module.js';
import { AuthModule } from './auth/auth.module.js';
import { AllExceptionsFilter } from './common/http-exception.filter.js';
import { AppConfigModule, ENV } from './config/config.module.js';
import type { Env } from './config/env.js';
import { dataSourceOptions } from './database/data-source-options.js';
import { HealthModule } from './health/health.module.js';
import { TodayModule } from './today/today.module.js';
import { RubricsModule } from './rubrics/rubrics.module.js';
import { RequirementListsModule } from './requirement-lists/requirement-lists.module.js';
import { FingeringsModule } from './fingerings/fingerings.module.js';
import { UsersModule } from './users/users.module.js';
import { MailModule } from './mail/mail.module.js';
import { InvitationsModule } from './invitations/invitations.module.js';
import { ClassesModule } from './classes/classes.module.js';
import { StudentsModule } from './students/students.module.js';
import { OutboxModule } from './outbox/outbox.module.js';
import { SittingsModule } from './sittings/sittings.module.js';
import { MarkingModule } from './marking/marking.module.js';
import { StorageModule } from './storage/storage.module.js';
import { ResultsModule } from './results/results.module.js';
import { ModerationModule } from './moderation/moderation.module.js';
import { AgreementModule } from './agreement/agreement.module.js';
import { StandardisationModule } from './standardisation/standardisation.module.js';
import { RecordingsModule } from './recordings/recordings.module.js';
import { ReportsModule } from './reports/reports.module.js';
import { ProgressModule } from './progress/progress.module.js';

@Module({
  imports: [
    AppConfigModule,
    TypeOrmModule.forRootAsync({
      inject: [ENV],
      useFactory: (env: Env) => ({
        ...dataSourceOptions(env.DATABASE_URL),
        // Start even when PostgreSQL is down, so /api/health can answer 503.
        retryAttempts: 0,
        extra: { max: 20, connectionTimeoutMillis: 3000 },
      }),
    }),
    AuditModule,
    AuthModule,
    UsersModule,
    // Before ResultsModule: its /results/classes must not be taken for /results/{id}.
    ReportsModule,
    TodayModule,
    HealthModule,
    RubricsModule,
    RequirementListsModule,
    FingeringsModule,
    MailModule,
    InvitationsModule,
    ClassesModule,
    StudentsModule,
    OutboxModule.forEnvironment(),
    SittingsModule,
    MarkingModule,
    StorageModule,
    ResultsModule,
    ModerationModule,
    AgreementModule,
    StandardisationModule,
    RecordingsModule,
    ProgressModule,
  ],
  providers: [{ provide: APP_FILTER, useClass: AllExceptionsFilter }],
})
export class AppModule {}
