import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  checkTransition,
  endOfDayInZone,
  formatUsd,
  LEAD_STAGE_LABELS,
  money,
  todayInZone,
  weekdayDate,
  type ContractView,
  type LeadStage,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { conflict, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { LeadsRepository } from '../leads/leads.repository';
import { LeadsService } from '../leads/leads.service';
import { MailService } from '../mail/mail.service';
import { JobsService } from '../jobs/jobs.service';
import { Clock } from './clock';
import { SigningDocuments } from './signing-documents.service';
import { cancellationConfirmedMail, cancellationNoticeMail } from './signing-mails';
import { SigningRepository, type ContractRecord, type SigningLead } from './signing.repository';
import { windowOpen } from './signing-view';
import type { CancelContractDto } from './dto/signing.dto';

/** Roles that may record a cancellation after the homeowner's window has closed (with the reason). */
const LATE_CANCELLERS = ['owner', 'branch_manager'];

export const REFUND_NOTE =
  'Refund due: every payment made under the contract, the deposit included, within 10 business days of the ' +
  'cancellation (FTC guidance, secondary).';

const contractNotFound = () => notFound('contract');
const subjectOf = (c: { branchId: string; salespersonId: string | null }) =>
  asSubject('Contract', { branchId: c.branchId, salespersonId: c.salespersonId });

export interface CancellationInput {
  byKind: 'homeowner' | 'staff';
  by: SessionUser | null;
  note: string | null;
  now: Date;
  /** Recorded after the window closed (only an owner or branch manager gets here). */
  afterWindow: boolean;
}

/**
 * Signed contracts for the staff: reading them and their PDF, and recording a cancellation that the
 * homeowner made by mail or phone. Also the cancellation's effects, shared with the homeowner's own
 * cancelling through the signing link.
 */
@Injectable()
export class ContractsService {
  private readonly logger = new Logger(ContractsService.name);

  constructor(
    private readonly repo: SigningRepository,
    private readonly documents: SigningDocuments,
    private readonly leads: LeadsService,
    private readonly leadsRepo: LeadsRepository,
    private readonly mail: MailService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly jobs: JobsService,
  ) {}

  async get(user: SessionUser, id: string): Promise<ContractView> {
    return this.view(user, await this.readable(user, id));
  }

  async forLead(user: SessionUser, leadId: string): Promise<ContractView> {
    const lead = await this.repo.lead(leadId);
    if (!lead || !user.ability.can('read', asSubject('Lead', lead))) throw notFound('lead');
    const c = await this.repo.latestContractOfLead(leadId);
    if (!c || !user.ability.can('read', subjectOf(c))) throw contractNotFound();
    return this.view(user, c);
  }

  async pdf(user: SessionUser, id: string): Promise<{ pdf: Buffer; filename: string }> {
    const c = await this.readable(user, id);
    return { pdf: await this.documents.contractPdf(c), filename: contractFilename(c) };
  }

  /**
   * Records a cancellation the homeowner made by mail, phone or in person. Inside the window anyone who
   * may change the contract can; after it only an owner or branch manager, and the note is the reason.
   */
  async cancel(user: SessionUser, id: string, dto: CancelContractDto): Promise<ContractView> {
    const done = await inTransaction(this.knex, async (trx) => {
      const c = await this.repo.findContract(id, trx, true);
      if (!c || !user.ability.can('read', subjectOf(c))) throw contractNotFound();
      ForbiddenError.from(user.ability).throwUnlessCan('update', subjectOf(c));
      if (c.cancelledAt) {
        throw conflict('CONTRACT.ALREADY_CANCELLED', 'This contract is already cancelled.', {
          cancelledAt: c.cancelledAt.toISOString(),
        });
      }
      const branch = await this.repo.branch(c.branchId, trx);
      const now = this.clock.now();
      const open = windowOpen(c, branch.timezone, now);
      if (!open && !LATE_CANCELLERS.includes(user.role)) throw windowClosed(c, branch.timezone);
      await this.recordCancellation(trx, c, {
        byKind: 'staff',
        by: user,
        note: dto.note,
        now,
        afterWindow: !open,
      });
      return c;
    });
    await this.notifyCancellation(done, { byKind: 'staff', actor: user, note: dto.note });
    return this.get(user, id);
  }

  // ---- shared with the signing link --------------------------------------------------------------

  /** The contract's effects of a cancellation: the record, the lead's stage, the timeline (refund due). */
  async recordCancellation(trx: Knex.Transaction, c: ContractRecord, x: CancellationInput): Promise<void> {
    await this.repo.cancelContract(
      c.id,
      { at: x.now, byKind: x.byKind, by: x.by?.id ?? null, note: x.note },
      trx,
    );
    await this.jobs.cancelForContract(c.id, x.now, trx); // issue #4: both cancel paths come through here
    const lead = (await this.repo.lead(c.leadId, trx, true))!;
    const moved = await this.moveLead(lead, 'cancelled', x.by?.id ?? null, trx);
    const who =
      x.byKind === 'homeowner'
        ? 'Contract cancelled by the homeowner through the signing link, inside the 16 CFR 429 window.'
        : x.afterWindow
          ? `Cancellation recorded by ${x.by?.name} AFTER the cancellation window closed ` +
            `(${c.lastDayToCancel}), accepted by a ${x.by?.role === 'owner' ? 'owner' : 'branch manager'}: ${x.note}`
          : `Cancellation recorded by ${x.by?.name} inside the cancellation window: ${x.note}`;
    const stage = moved
      ? ''
      : ` The lead stays at "${LEAD_STAGE_LABELS[lead.stage]}": move it by hand if needed.`;
    await this.repo.addActivity(
      {
        leadId: c.leadId,
        branchId: c.branchId,
        kind: 'cancellation',
        body: `${who} ${REFUND_NOTE}${money(c.depositAmount).greaterThan(0) ? ` Deposit on the contract: ${formatUsd(c.depositAmount)}.` : ''}${stage}`,
        data: {
          event: 'contract_cancelled',
          contractId: c.id,
          byKind: x.byKind,
          afterWindow: x.afterWindow,
          refundDue: true,
          refundWithinBusinessDays: 10,
          depositAmount: c.depositAmount,
          leadStageMoved: moved,
        },
        actorId: x.by?.id ?? null,
      },
      trx,
    );
  }

  /** After the commit: the homeowner's confirmation and the salesperson's notice. A failed e-mail is logged. */
  async notifyCancellation(
    c: ContractRecord,
    x: { byKind: 'homeowner' | 'staff'; actor: SessionUser | null; note: string | null },
  ): Promise<void> {
    const [lead, branch] = await Promise.all([this.repo.lead(c.leadId), this.repo.branch(c.branchId)]);
    if (!lead) return;
    const cancelledOn = todayInZone(branch.timezone, this.clock.now());
    const sends: { to: string; mail: { subject: string; text: string; html: string }; kind: string }[] = [];
    if (lead.email) {
      sends.push({
        to: lead.email,
        kind: 'homeowner',
        mail: cancellationConfirmedMail({
          homeownerName: lead.homeownerName,
          branchName: branch.name,
          branchPhone: branch.phone,
          cancelledOn,
          paidSomething: money(c.depositAmount).greaterThan(0),
        }),
      });
    }
    const salesperson = await this.repo.person(c.salespersonId ?? lead.salespersonId);
    if (salesperson?.active && salesperson.id !== x.actor?.id) {
      sends.push({
        to: salesperson.email,
        kind: 'salesperson',
        mail: cancellationNoticeMail({
          recipientName: salesperson.name,
          homeownerName: lead.homeownerName,
          branchName: branch.name,
          how:
            x.byKind === 'homeowner'
              ? `the homeowner cancelled through the signing link on ${weekdayDate(cancelledOn)}.`
              : `${x.actor?.name ?? 'Staff'} recorded it on ${weekdayDate(cancelledOn)}: ${x.note ?? ''}`,
          depositAmount: c.depositAmount,
          link: `${this.config.publicUrl}/leads/${lead.id}`,
        }),
      });
    }
    for (const s of sends) {
      try {
        await this.mail.send({ to: s.to, ...s.mail });
        await this.repo.addActivity(
          {
            leadId: c.leadId,
            branchId: c.branchId,
            kind: 'email',
            body: `E-mail "${s.mail.subject}" sent to the ${s.kind} (${s.to}).`,
            data: { event: 'cancellation_mail', contractId: c.id, to: s.to },
            actorId: x.actor?.id ?? null,
          },
          this.knex,
        );
      } catch (err) {
        this.logger.warn({ err, to: s.to, contractId: c.id }, 'Cancellation e-mail not sent');
      }
    }
  }

  /** Moves the lead to `to` when the pipeline's rule allows it from where it is; true when it moved. */
  async moveLead(
    lead: SigningLead,
    to: LeadStage,
    actorId: string | null,
    trx: Knex.Transaction,
  ): Promise<boolean> {
    const current = (await this.repo.lead(lead.id, trx))!;
    if (current.stage === to) return false;
    const facts = await this.leadsRepo.facts(lead.id, trx);
    if (!checkTransition(current.stage, to, facts).ok) return false;
    await this.leads.moveStage(
      { leadId: lead.id, branchId: current.branchId, from: current.stage, to, reason: null, actorId },
      trx,
    );
    return true;
  }

  async view(user: SessionUser, c: ContractRecord, db: Db = this.knex): Promise<ContractView> {
    const branch = await this.repo.branch(c.branchId, db);
    const now = this.clock.now();
    const open = windowOpen(c, branch.timezone, now);
    const mayUpdate = user.ability.can('update', subjectOf(c));
    return {
      id: c.id,
      status: c.cancelledAt ? 'cancelled' : 'signed',
      proposalId: c.proposalId,
      proposalVersion: c.proposalVersion,
      optionId: c.optionId,
      option: { position: c.optionPosition, title: c.optionTitle },
      leadId: c.leadId,
      branchId: c.branchId,
      salespersonId: c.salespersonId,
      homeownerName: c.homeownerName,
      price: c.price,
      tax: c.tax,
      depositAmount: c.depositAmount,
      signedByName: c.signedByName,
      signedAt: c.signedAt.toISOString(),
      signedOn: c.signedOn,
      signedIp: c.signedIp,
      signedUserAgent: c.signedUserAgent,
      signedInPerson: c.signedInPerson,
      cancellationStatement: c.cancellationStatement,
      lastDayToCancel: c.lastDayToCancel,
      cancellableUntil: endOfDayInZone(c.lastDayToCancel, branch.timezone),
      windowOpen: open,
      notices: c.notices,
      pdfUrl: `/api/contracts/${c.id}/pdf`,
      pdfStored: c.pdfKey !== null,
      cancellation: c.cancelledAt
        ? {
            at: c.cancelledAt.toISOString(),
            byKind: c.cancelledByKind ?? 'staff',
            by: c.cancelledBy,
            note: c.cancellationNote,
            afterWindow: todayInZone(branch.timezone, c.cancelledAt) > c.lastDayToCancel,
          }
        : null,
      canCancel: mayUpdate && !c.cancelledAt && (open || LATE_CANCELLERS.includes(user.role)),
      createdAt: c.createdAt.toISOString(),
    };
  }

  private async readable(user: SessionUser, id: string): Promise<ContractRecord> {
    const c = await this.repo.findContract(id);
    if (!c || !user.ability.can('read', subjectOf(c))) throw contractNotFound();
    return c;
  }
}

export function windowClosed(c: ContractRecord, timezone: string) {
  return conflict(
    'CONTRACT.WINDOW_CLOSED',
    `The cancellation window closed at midnight at the end of ${weekdayDate(c.lastDayToCancel)} (${timezone} time).`,
    { lastDayToCancel: c.lastDayToCancel, cancellableUntil: endOfDayInZone(c.lastDayToCancel, timezone) },
  );
}

export const contractFilename = (c: ContractRecord) => `contract-${c.signedOn}-${c.id.slice(0, 8)}.pdf`;
