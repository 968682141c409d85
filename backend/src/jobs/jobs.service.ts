import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  checkTransition,
  formatJobNumber,
  jobNumberPrefix,
  labourEstimate,
  type JobDetail,
  type LeadStage,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { LeadsRepository } from '../leads/leads.repository';
import { LeadsService } from '../leads/leads.service';
import type { SessionUser } from '../auth/session-user';
import { notFound } from '../common/domain-error';
import type { Db } from '../database/transaction';
import { JobViews } from './job-views';
import { JobsRepository } from './jobs.repository';

/** The main-line moves a job's events can make, in order (paid in full is the money's, issue #5). */
const JOB_LINE: readonly LeadStage[] = [
  'contract_signed',
  'deposit_received',
  'scheduled',
  'in_progress',
  'completed',
];

/**
 * The job's life outside the HTTP surface: made from the contract inside the signing transaction,
 * cancelled with the contract, and the lead's stage following the job's facts; the detail view for
 * other features' answers. The routes are in JobBoardService (job-board.service.ts).
 */
@Injectable()
export class JobsService {
  constructor(
    private readonly repo: JobsRepository,
    private readonly leads: LeadsService,
    private readonly leadsRepo: LeadsRepository,
    private readonly views: JobViews,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  /** The job as GET /jobs/:id answers it, for the user (404 outside their reach). For other features' answers. */
  async detail(user: SessionUser, jobId: string, db: Db = this.knex): Promise<JobDetail> {
    const job = await this.repo.findForUser(user, jobId, { db });
    if (!job) throw notFound('job');
    return this.views.detail(user, job, db);
  }

  /**
   * The job of a contract just signed: its number, and the chosen option's lines copied as the plan
   * (estimated labour from the 'hour' lines). Called inside the signing transaction.
   */
  async createForContract(contractId: string, trx: Knex.Transaction): Promise<string> {
    const c = await this.repo.contractForJob(contractId, trx);
    if (!c) throw new Error(`No contract ${contractId}`);
    const lines = await this.repo.optionLines(c.optionId, trx);
    const prefix = jobNumberPrefix(c.branchCode, c.signedOn);
    const sequence = (await this.repo.lastSequence(prefix, trx)) + 1;
    const labour = labourEstimate(lines);
    return this.repo.insertJob(
      {
        contractId: c.id,
        leadId: c.leadId,
        branchId: c.branchId,
        salespersonId: c.salespersonId,
        number: formatJobNumber(c.branchCode, c.signedOn, sequence),
        estimatedLabourHours: labour.hours,
        labourCostPerHour: labour.costPerHour,
      },
      lines,
      trx,
    );
  }

  /** The contract was cancelled: so is its job (unless already completed, which cannot happen before). */
  async cancelForContract(contractId: string, at: Date, trx: Knex.Transaction): Promise<void> {
    await trx('jobs')
      .where({ contract_id: contractId })
      .whereNotIn('status', ['completed', 'cancelled'])
      .update({ status: 'cancelled', cancelled_at: at, updated_at: trx.fn.now() });
  }

  /**
   * Moves the lead along the main line (contract signed → deposit received → scheduled → in progress →
   * completed) as far as the facts allow, one checked step at a time, each with its timeline row.
   * Never moves a lead backwards nor off the line (lost, cancelled, paid in full stay where they are).
   */
  async advanceLead(leadId: string, actorId: string | null, trx: Knex.Transaction): Promise<void> {
    const lead = await this.repo.leadStage(leadId, trx, true);
    if (!lead) return;
    let stage = lead.stage as LeadStage;
    const facts = await this.leadsRepo.facts(leadId, trx);
    for (;;) {
      const at = JOB_LINE.indexOf(stage);
      if (at < 0 || at === JOB_LINE.length - 1) return;
      const next = JOB_LINE[at + 1]!;
      if (!checkTransition(stage, next, facts).ok) return;
      await this.leads.moveStage(
        { leadId, branchId: lead.branchId, from: stage, to: next, reason: null, actorId },
        trx,
      );
      stage = next;
    }
  }
}
