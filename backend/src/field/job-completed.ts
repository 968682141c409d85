import type { Knex } from 'knex';

/**
 * Told when a job is completed, inside the completion's transaction (issue #5 recognises the revenue
 * and invoices the balance). A handler that throws rolls the completion back.
 *
 * FieldModule provides an empty list under this token. To add handlers, replace that provider with a
 * factory that lists them, e.g.
 *   { provide: JOB_COMPLETED_HANDLERS, useFactory: (a: LedgerJobCompleted) => [a], inject: [LedgerJobCompleted] }
 * (importing the module that provides them).
 */
export const JOB_COMPLETED_HANDLERS = Symbol('JOB_COMPLETED_HANDLERS');

export interface JobCompletedEvent {
  jobId: string;
  contractId: string;
  leadId: string;
  branchId: string;
  completedAt: Date;
}

export interface JobCompletedHandler {
  onJobCompleted(e: JobCompletedEvent, trx: Knex.Transaction): Promise<void>;
}
