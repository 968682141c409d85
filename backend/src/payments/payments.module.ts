import { Module } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module';
import { LeadsModule } from '../leads/leads.module';
import { LedgerModule } from '../ledger/ledger.module';
import { SigningModule } from '../signing/signing.module';
import { PaymentsCompletionHandler } from './completion.handler';
import { PaymentsController } from './payments.controller';
import { PaymentsRepository } from './payments.repository';
import { PaymentsService } from './payments.service';
import { ProcessorPostings } from './processor-postings.service';
import { stripeProvider } from './stripe.provider';
import { WebhookController } from './webhook.controller';
import { WebhooksService } from './webhooks.service';

/**
 * Card payments through the processor's SDK (Stripe; the local fake in development and tests), its signed
 * webhooks, the bookkeeper's cash / cheque / transfer recordings and refunds, and their postings (issue #5).
 * Exports the completion handler for FieldModule's JOB_COMPLETED_HANDLERS.
 */
@Module({
  imports: [LedgerModule, SigningModule, JobsModule, LeadsModule],
  controllers: [PaymentsController, WebhookController],
  providers: [
    stripeProvider,
    PaymentsRepository,
    ProcessorPostings,
    PaymentsService,
    WebhooksService,
    PaymentsCompletionHandler,
  ],
  exports: [PaymentsCompletionHandler, PaymentsService],
})
export class PaymentsModule {}
