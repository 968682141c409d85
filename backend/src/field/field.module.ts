import { Module } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module';
import { StorageModule } from '../storage/storage.module';
import { ActualsService } from './actuals.service';
import { CompletionService } from './completion.service';
import { FieldAccess } from './field-access';
import { FieldController } from './field.controller';
import { FieldRepository } from './field.repository';
import { InstallLogService } from './install-log.service';
import { JOB_COMPLETED_HANDLERS } from './job-completed';
import { PaymentsModule } from '../payments/payments.module';
import { PaymentsCompletionHandler } from '../payments/completion.handler';
import { WarrantyService } from './warranty.service';

/**
 * The field side of a job (issue #4): the crew's install log, day notes and photos, completion with the
 * re-survey and the homeowner's signature, actuals against the estimate, and the warranty.
 * JOB_COMPLETED_HANDLERS starts empty: issue #5 replaces this provider with its handlers (see
 * job-completed.ts).
 */
@Module({
  imports: [JobsModule, StorageModule, PaymentsModule],
  controllers: [FieldController],
  providers: [
    FieldRepository,
    FieldAccess,
    InstallLogService,
    CompletionService,
    ActualsService,
    WarrantyService,
    // Issue #5: completion posts the revenue and invoices the balance (src/payments/completion.handler.ts).
    {
      provide: JOB_COMPLETED_HANDLERS,
      useFactory: (payments: PaymentsCompletionHandler) => [payments],
      inject: [PaymentsCompletionHandler],
    },
  ],
})
export class FieldModule {}
