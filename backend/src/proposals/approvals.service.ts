import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  APPROVER_LABELS,
  asSubject,
  branchScope,
  mayApprove,
  type ApprovalRequestStatus,
  type ApprovalRequestView,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { MailService } from '../mail/mail.service';
import { toApprovalView } from './approval-view';
import { approvalDecidedMail } from './proposal-mails';
import { ProposalsRepository, type ApprovalRecord, type Recipient } from './proposals.repository';

/**
 * The approval queue: requests made when a proposal falls below the branch's margin floor or gives a
 * discount beyond the submitter's authority. A branch manager sees their branches' requests and decides
 * those within a manager's authority; the owner sees and decides every one.
 */
@Injectable()
export class ApprovalsService {
  private readonly logger = new Logger(ApprovalsService.name);

  constructor(
    private readonly repo: ProposalsRepository,
    private readonly mail: MailService,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async list(user: SessionUser, status: ApprovalRequestStatus = 'pending'): Promise<ApprovalRequestView[]> {
    const rows = await this.repo.listApprovals(branchScope(user, 'sales'), status);
    return rows.filter((r) => this.mayRead(user, r)).map((r) => toApprovalView(user, r));
  }

  async decide(
    user: SessionUser,
    id: string,
    decision: 'approved' | 'refused',
    note: string | null,
  ): Promise<ApprovalRequestView> {
    const decided = await inTransaction(this.knex, async (trx) => {
      const r = await this.repo.findApproval(id, trx, true);
      if (!r || !this.mayRead(user, r)) throw notFound('approval request', 'APPROVAL.NOT_FOUND');
      if (!mayApprove(user.role, r.approver)) {
        throw new DomainError(
          'forbidden',
          'APPROVAL.BEYOND_AUTHORITY',
          `This request is beyond a branch manager’s authority: only the ${APPROVER_LABELS[r.approver].toLowerCase()} can decide it.`,
        );
      }
      if (r.requestedBy.id === user.id && user.role !== 'owner') {
        throw new DomainError(
          'forbidden',
          'APPROVAL.OWN_REQUEST',
          'Someone else must decide your own request.',
        );
      }
      if (r.status !== 'pending' || r.proposalStatus !== 'pending_approval') {
        throw conflict('APPROVAL.ALREADY_DECIDED', 'This request has already been decided.', {
          status: r.status,
        });
      }
      await this.repo.decideApproval(r.id, { status: decision, decidedBy: user.id, note }, trx);
      await this.repo.updateProposal(r.proposalId, { status: decision }, trx);
      await this.repo.addActivity(
        {
          leadId: r.leadId,
          branchId: r.branchId,
          kind: 'approval',
          body: `Proposal version ${r.proposalVersion} ${decision} by ${user.name}${note ? `: ${note}` : '.'}`,
          data: { event: decision, approvalRequestId: r.id, proposalId: r.proposalId },
          actorId: user.id,
        },
        trx,
      );
      const salesperson = r.salespersonId ? await this.repo.person(r.salespersonId, trx) : undefined;
      return { record: (await this.repo.findApproval(r.id, trx))!, salesperson };
    });
    await this.notifyRequester(user, decided.record, decided.salesperson);
    return toApprovalView(user, decided.record);
  }

  /** Same reach as the proposal itself: a manager their branches, the owner everything. */
  private mayRead(user: SessionUser, r: ApprovalRecord): boolean {
    return user.ability.can(
      'approve',
      asSubject('Proposal', { branchId: r.branchId, salespersonId: r.salespersonId }),
    );
  }

  /** The person who asked is told, and the proposal's salesperson when that is someone else. */
  private async notifyRequester(
    user: SessionUser,
    r: ApprovalRecord,
    salesperson?: Recipient,
  ): Promise<void> {
    const recipients: Recipient[] = [r.requestedBy];
    if (salesperson && salesperson.id !== r.requestedBy.id) recipients.push(salesperson);
    for (const to of recipients) {
      const mail = approvalDecidedMail({
        recipientName: to.name,
        decidedBy: user.name,
        decision: r.status === 'approved' ? 'approved' : 'refused',
        homeownerName: r.homeownerName,
        version: r.proposalVersion,
        note: r.decisionNote,
        link: `${this.config.publicUrl}/proposals/${r.proposalId}`,
      });
      try {
        await this.mail.send({ to: to.email, ...mail });
      } catch (err) {
        this.logger.warn({ err, to: to.email }, 'Approval decision e-mail not sent');
      }
    }
  }
}
