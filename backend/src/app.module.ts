import { randomUUID } from 'node:crypto';
import { type DynamicModule, Module, RequestMethod } from '@nestjs/common';
import { APP_FILTER } from '@nestjs/core';
import { LoggerModule } from 'nestjs-pino';
import { APP_CONFIG, type AppConfig } from './config/config';
import { AllExceptionsFilter } from './common/exception.filter';
import { DatabaseModule } from './database/database.module';
import { MailModule } from './mail/mail.module';
import { AuthModule } from './auth/auth.module';
import { BranchesModule } from './branches/branches.module';
import { UsersModule } from './users/users.module';
import { CalculatorsModule } from './calculators/calculators.module';
import { LeadsModule } from './leads/leads.module';
import { StorageModule } from './storage/storage.module';
import { InspectionsModule } from './inspections/inspections.module';
import { ProposalsModule } from './proposals/proposals.module';
import { SigningModule } from './signing/signing.module';
import { JobsModule } from './jobs/jobs.module';
import { FieldModule } from './field/field.module';
import { HealthController } from './health/health.controller';
import { LedgerModule } from './ledger/ledger.module';
import { PaymentsModule } from './payments/payments.module';
import { ReconciliationModule } from './reconciliation/reconciliation.module';
import { CommissionsModule } from './commissions/commissions.module';

/** Log levels at which pino-http would write no per-request line (it logs requests at info). */
const QUIET_LEVELS = new Set(['warn', 'error', 'fatal', 'silent']);

@Module({})
export class AppModule {
  static forRoot(config: AppConfig): DynamicModule {
    return {
      module: AppModule,
      global: true,
      imports: [
        LoggerModule.forRoot({
          // The per-request logger (pino-http's request-completed line at info, and the request bound to
          // every line logged while it runs) only at info or more verbose: at warn or quieter it writes
          // nothing, and binding it to each request cost ~0.15 ms of every API request. Errors are logged
          // at any level, with the request id (AllExceptionsFilter).
          forRoutes: QUIET_LEVELS.has(config.logLevel)
            ? []
            : [{ path: '{*path}', method: RequestMethod.ALL }],
          pinoHttp: {
            level: config.logLevel,
            // The id assigned by the first middleware (app.factory.ts).
            genReqId: (req) => String((req as { id?: string }).id ?? randomUUID()),
            redact: ['req.headers.authorization', 'req.headers.cookie'],
            // Single-use links carry their secret in the path: keep it out of the logs.
            serializers: {
              req: (req: { url?: string }) => ({
                ...req,
                url: req.url?.replace(/\/(signing|password-links)\/[^/?]+/, '/$1/[token]'),
              }),
            },
            autoLogging: { ignore: (req) => req.url === '/api/health' },
          },
        }),
        DatabaseModule,
        MailModule,
        AuthModule,
        BranchesModule,
        UsersModule,
        CalculatorsModule,
        StorageModule,
        InspectionsModule,
        LeadsModule,
        ProposalsModule,
        SigningModule,
        JobsModule,
        FieldModule,
        LedgerModule,
        PaymentsModule,
        ReconciliationModule,
        CommissionsModule,
      ],
      controllers: [HealthController],
      providers: [
        { provide: APP_CONFIG, useValue: config },
        { provide: APP_FILTER, useClass: AllExceptionsFilter },
      ],
      exports: [APP_CONFIG],
    };
  }
}
