import { Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  contractBalance,
  jobCompleted,
  money,
  MoneyDecimal,
  todayInZone,
  toMoneyString,
} from '@loambook/common';
import type { JobCompletedEvent, JobCompletedHandler } from '../field/job-completed';
import { DomainError } from '../common/domain-error';
import { LeadsService } from '../leads/leads.service';
import { LedgerService } from '../ledger/ledger.service';
import { PaymentsRepository } from './payments.repository';
import { PaymentsService } from './payments.service';

/**
 * At completion (issue #4 tells the JOB_COMPLETED_HANDLERS inside the completion's transaction): the
 * contract price becomes revenue (ASC 606, for a short job at completion), the deposits held stop being
 * owed, the rest is receivable — customer deposits + accounts receivable / contract revenue — posted once
 * per job (key `job.completed:<job id>`). Then the balance is invoiced: a payment link e-mailed to the
 * homeowner once the completion commits. A contract paid in full before completion moves its lead on to
 * paid in full here (the completion has just moved it to completed).
 *
 * Deposits above the price (rare: an overpayment) are left as customer deposits, still owed back.
 * The balance link needs the processor: when it is not configured or refuses, the completion still stands
 * and the link can be made from the contract's payments panel.
 */
@Injectable()
export class PaymentsCompletionHandler implements JobCompletedHandler {
  private readonly logger = new Logger(PaymentsCompletionHandler.name);

  constructor(
    private readonly repo: PaymentsRepository,
    private readonly ledger: LedgerService,
    private readonly payments: PaymentsService,
    private readonly leads: LeadsService,
  ) {}

  async onJobCompleted(e: JobCompletedEvent, trx: Knex.Transaction): Promise<void> {
    const c = await this.repo.contract(e.contractId, trx, true);
    if (!c || c.cancelledAt) return;
    const b = contractBalance(c.price, await this.repo.movements(c.id, trx));
    const held = MoneyDecimal.max(0, MoneyDecimal.min(money(b.depositHeld), money(c.price)));
    const { created } = await this.ledger.post(
      jobCompleted({ contractPrice: c.price, depositsHeld: toMoneyString(held) }),
      {
        branchId: c.branchId,
        idempotencyKey: `job.completed:${e.jobId}`,
        source: { kind: 'system', ref: 'job.completed' },
        effectiveOn: todayInZone(c.timezone, e.completedAt),
        leadId: c.leadId,
        contractId: c.id,
        jobId: e.jobId,
      },
      trx,
    );
    // Everything was paid before the work was done (cash up front, say): the lead goes on to paid in full.
    await this.leads.settleIfPaid(c.leadId, null, trx);
    // Told again about the same job (a retried completion): the balance was invoiced the first time.
    if (!created || !money(b.balanceDue).greaterThan(0)) return;
    try {
      await this.payments.makeLink(c, 'balance', b.balanceDue, null, trx);
    } catch (err) {
      // Only a refusal before anything was written here (processor off or refusing, an amount rule):
      // the completion stands and the link is made by hand later.
      if (err instanceof DomainError) {
        this.logger.warn({ contract: c.id, code: err.code }, 'No balance link made at completion');
        return;
      }
      throw err;
    }
  }
}
