import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  cancellationDeadline,
  cancellationForm,
  FTC_429_BUYER_STATEMENT,
  FTC_COOLING_OFF_SOURCE,
  PROPOSAL_STATUS_LABELS,
  settlement,
  SIGNING_CAUTIONS,
  utcToZonedLocal,
  weekdayDate,
  type SettlementResult,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';
import { notFound } from '../common/domain-error';
import { ProposalsRepository } from '../proposals/proposals.repository';
import { StorageService, StoredObjectMissingError } from '../storage/storage.service';
import type { PdfDocumentModel } from './pdf/document-model';
import { renderPdf } from './pdf/render';
import { SigningRepository, type ContractRecord } from './signing.repository';
import {
  branchAddressLine,
  branchView,
  findingsOf,
  pricedOptions,
  unionNotices,
  type ProposalContext,
} from './signing-view';

/** '2026-07-02 22:30 (America/New_York)' */
const localTime = (instant: string, tz: string) =>
  `${utcToZonedLocal(instant, tz).local.replace('T', ' ')} (${tz})`;

/** Statuses of a version that may go to the homeowner as it is. */
const SENDABLE = ['approved', 'sent', 'signed'];

/**
 * The documents of a proposal: what they are made from (ProposalContext), the proposal PDF, and the
 * signed contract's PDF, kept in the bucket under branches/<branchId>/contracts/<contractId>.pdf.
 */
@Injectable()
export class SigningDocuments {
  private readonly logger = new Logger(SigningDocuments.name);

  constructor(
    private readonly repo: SigningRepository,
    private readonly proposals: ProposalsRepository,
    private readonly storage: StorageService,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async context(proposalId: string, db: Db = this.knex): Promise<ProposalContext> {
    const proposal = await this.proposals.findProposal(proposalId, db);
    if (!proposal) throw notFound('proposal');
    // One query at a time: `db` may be a transaction, which runs on a single connection.
    const options = await this.proposals.options(proposal.id, db);
    const lead = await this.repo.lead(proposal.leadId, db);
    if (!lead) throw notFound('lead');
    const branch = await this.repo.branch(proposal.branchId, db);
    const settings = await this.proposals.branchSettings(proposal.branchId, db);
    const salesperson = await this.repo.person(proposal.salespersonId ?? lead.salespersonId, db);
    const inspection = await this.repo.inspectionFor(proposal.inspectionId, proposal.leadId, db);
    let survey: SettlementResult | null = null;
    if (inspection) {
      const points = await this.repo.surveyPoints(inspection.id, db);
      try {
        survey = points.length >= 2 ? settlement({ points }) : null;
      } catch (err) {
        // A stored survey is checked when saved; should one fail now, the document goes without it.
        this.logger.warn({ err, inspectionId: inspection.id }, 'Survey left out of the document');
      }
    }
    return {
      proposal,
      options,
      lead,
      branch,
      salesperson,
      inspection,
      survey,
      tax: {
        treatment: proposal.taxTreatment ?? settings.salesTaxTreatment,
        ratePct: proposal.taxRatePct ?? settings.salesTaxRatePct,
      },
    };
  }

  /** The proposal with every option, as the homeowner receives it; `datedOn` on the branch's clock. */
  proposalModel(ctx: ProposalContext, p: { deposit: string | null; datedOn: string }): PdfDocumentModel {
    const priced = pricedOptions(ctx, p.deposit);
    const deadline = cancellationDeadline({ signedOn: p.datedOn });
    const status = ctx.proposal.status;
    return {
      kind: 'proposal',
      title: `Proposal for ${ctx.lead.homeownerName}, ${ctx.lead.addressLine1}`,
      reference: `Proposal version ${ctx.proposal.version}`,
      datedOn: p.datedOn,
      draftNote: SENDABLE.includes(status)
        ? null
        : `Not yet approved to send (${PROPOSAL_STATUS_LABELS[status].toLowerCase()}): figures may still change.`,
      ...this.parties(ctx),
      options: priced.map((x) => x.option),
      cautions: SIGNING_CAUTIONS,
      notices: unionNotices(priced),
      cancellation: {
        statement: FTC_429_BUYER_STATEMENT,
        source: FTC_COOLING_OFF_SOURCE,
        signedOn: p.datedOn,
        lastDayToCancel: deadline.lastDayToCancel,
        lastDayWeekday: deadline.lastDayWeekday,
        timezone: ctx.branch.timezone,
      },
    };
  }

  /** The signed contract: the accepted option, the acknowledged notices, the signature and the two forms. */
  contractModel(ctx: ProposalContext, c: ContractRecord): PdfDocumentModel {
    const priced = pricedOptions(ctx, c.depositAmount).filter((x) => x.option.id === c.optionId);
    const acknowledged = new Map(c.notices.map((n) => [n.code, n.acknowledgedAt]));
    const notices = unionNotices(priced)
      .filter((n) => acknowledged.has(n.code))
      .map((n) => ({ ...n, acknowledgedAt: localTime(acknowledged.get(n.code)!, ctx.branch.timezone) }));
    const tz = ctx.branch.timezone;
    const local = utcToZonedLocal(c.signedAt, tz);
    const deadline = cancellationDeadline({ signedOn: c.signedOn });
    return {
      kind: 'contract',
      title: `Contract with ${c.signedByName}, ${ctx.lead.addressLine1}, signed ${c.signedOn}`,
      reference: `Contract from proposal version ${ctx.proposal.version}, option ${c.optionPosition}`,
      datedOn: c.signedOn,
      draftNote: null,
      cancelledNote: c.cancelledAt
        ? `This contract was cancelled (${c.cancelledByKind === 'homeowner' ? 'by the homeowner' : 'recorded by the contractor'}) ` +
          `on ${weekdayDate(utcToZonedLocal(c.cancelledAt, tz).local.slice(0, 10))}.`
        : null,
      ...this.parties(ctx),
      options: priced.map((x) => x.option),
      cautions: SIGNING_CAUTIONS,
      notices,
      cancellation: {
        statement: c.cancellationStatement,
        source: FTC_COOLING_OFF_SOURCE,
        signedOn: c.signedOn,
        lastDayToCancel: c.lastDayToCancel,
        lastDayWeekday: deadline.lastDayWeekday,
        timezone: tz,
      },
      signature: {
        png: c.signaturePng,
        signerName: c.signedByName,
        signedAtLocal: local.local.replace('T', ' '),
        utcOffset: local.utcOffset,
        signedAtUtc: c.signedAt.toISOString().replace('T', ' ').slice(0, 19),
        ip: c.signedIp,
        userAgent: c.signedUserAgent,
        inPerson: c.signedInPerson,
      },
      cancellationForm: cancellationForm({
        buyerName: c.signedByName,
        sellerName: ctx.branch.name,
        sellerAddress: branchAddressLine(ctx.branch),
        transactionDate: c.signedOn,
        lastDayToCancel: c.lastDayToCancel,
      }),
    };
  }

  render(model: PdfDocumentModel): Promise<Buffer> {
    return renderPdf(model);
  }

  /** Makes the contract's PDF and keeps it in the bucket (the record then names its key). */
  async storeContractPdf(c: ContractRecord, db: Db = this.knex): Promise<Buffer> {
    const pdf = await this.render(this.contractModel(await this.context(c.proposalId, db), c));
    const key = `branches/${c.branchId}/contracts/${c.id}.pdf`;
    await this.storage.put(key, pdf, 'application/pdf');
    await this.repo.setPdfKey(c.id, key, db);
    return pdf;
  }

  /** The stored PDF; made (and stored) again from the record when it is missing. */
  async contractPdf(c: ContractRecord): Promise<Buffer> {
    if (c.pdfKey) {
      try {
        return await this.storage.getBuffer(c.pdfKey);
      } catch (e) {
        if (!(e instanceof StoredObjectMissingError)) throw e;
        this.logger.warn({ contractId: c.id, key: c.pdfKey }, 'Stored contract PDF missing: made again');
      }
    }
    return this.storeContractPdf(c);
  }

  private parties(ctx: ProposalContext) {
    return {
      branch: branchView(ctx.branch),
      homeowner: { name: ctx.lead.homeownerName, email: ctx.lead.email, phone: ctx.lead.phone },
      property: {
        addressLine1: ctx.lead.addressLine1,
        city: ctx.lead.city,
        state: ctx.lead.state,
        postalCode: ctx.lead.postalCode,
      },
      salesperson: ctx.salesperson ? { name: ctx.salesperson.name, email: ctx.salesperson.email } : null,
      findings: findingsOf(ctx),
    };
  }
}
