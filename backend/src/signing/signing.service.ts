import { createHash, randomBytes } from 'node:crypto';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  cancellationDeadline,
  checkAcknowledgements,
  contractRules,
  formatUsd,
  FTC_429_BUYER_STATEMENT,
  money,
  SIGNING_CAUTIONS,
  todayInZone,
  toMoneyString,
  weekdayDate,
  type CancelSigningResponse,
  type ContractView,
  type SendProposalResponse,
  type SigningView,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { MailService } from '../mail/mail.service';
import { JobsService } from '../jobs/jobs.service';
import { ProposalsRepository, type ProposalRecord } from '../proposals/proposals.repository';
import { ProposalsService } from '../proposals/proposals.service';
import { Clock } from './clock';
import { ContractsService, contractFilename, windowClosed } from './contracts.service';
import { readSignaturePng } from './signature';
import { SigningDocuments } from './signing-documents.service';
import { contractSignedMail, proposalSentMail } from './signing-mails';
import { SigningRepository, type ContractRecord, type SigningLinkRecord } from './signing.repository';
import {
  branchView,
  cancellationPreview,
  contractStatus,
  findingsOf,
  pricedOptions,
  unionNotices,
  windowOpen,
  type ProposalContext,
} from './signing-view';
import type { SendProposalDto, SignContractDto, SignInPersonDto, CancelSigningDto } from './dto/signing.dto';

/** A token as we issue them: 32 random bytes in base64url (43 characters). Anything else is unknown. */
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{32,128}$/;
const DAY_MS = 86_400_000;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
const newToken = () => randomBytes(32).toString('base64url');

const gone = (code: string, message: string) => new DomainError('gone', code, message);
const linkUnknown = () =>
  gone(
    'SIGNING.LINK_UNKNOWN',
    'This signing link is not known. Check that the whole link was copied, or ask the contractor for a new one.',
  );
const linkExpired = () =>
  gone(
    'SIGNING.LINK_EXPIRED',
    'This signing link has expired. Ask the contractor to send the proposal again.',
  );
const linkRevoked = () =>
  gone(
    'SIGNING.LINK_REVOKED',
    'This signing link no longer works: a newer link or a changed proposal was sent. Use the latest e-mail from the contractor.',
  );
const contractCancelled = (c: ContractRecord) =>
  gone(
    'SIGNING.CONTRACT_CANCELLED',
    `This contract was cancelled on ${c.cancelledAt!.toISOString().slice(0, 10)}. Nothing more is owed under it.`,
  );
const alreadySigned = () => conflict('CONTRACT.ALREADY_SIGNED', 'This proposal has already been signed.');

/** What the request tells about the signer's device. */
export interface SigningEvidence {
  ip: string | null;
  userAgent: string | null;
}

interface SignInput {
  optionId: string;
  signerName: string;
  png: Buffer;
  acknowledgedNotices: string[];
}

/**
 * Sending a proposal to the homeowner, the homeowner's signing page (public, behind an unguessable
 * expiring link of which only the SHA-256 is stored), signing (online or in person on the salesperson's
 * device) and the homeowner's cancellation inside the 16 CFR 429 window.
 */
@Injectable()
export class SigningService {
  private readonly logger = new Logger(SigningService.name);

  constructor(
    private readonly repo: SigningRepository,
    private readonly documents: SigningDocuments,
    private readonly contracts: ContractsService,
    private readonly proposals: ProposalsService,
    private readonly proposalsRepo: ProposalsRepository,
    private readonly mail: MailService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly jobs: JobsService,
  ) {}

  // ---- staff: the proposal PDF and sending ---------------------------------------------------------

  async proposalPdf(user: SessionUser, id: string): Promise<{ pdf: Buffer; filename: string }> {
    const p = await this.proposalsRepo.findProposal(id);
    if (!p || !this.may(user, 'read', p)) throw notFound('proposal');
    const ctx = await this.documents.context(id);
    const link = await this.repo.latestLink(id);
    const datedOn = todayInZone(ctx.branch.timezone, p.sentAt ? new Date(p.sentAt) : this.clock.now());
    const pdf = await this.documents.render(
      this.documents.proposalModel(ctx, { deposit: link?.depositAmount ?? null, datedOn }),
    );
    return { pdf, filename: `proposal-v${p.version}.pdf` };
  }

  /**
   * Sends an approved version (or sends a sent one again): a new signing link (earlier unused ones stop
   * working), the e-mail with the link and the PDF, the lead's value (the highest option's total) and,
   * from "inspected", the move to "proposal sent". The e-mail goes inside the transaction: when it cannot
   * be sent nothing is recorded, and sending again is safe.
   */
  async send(user: SessionUser, id: string, dto: SendProposalDto): Promise<SendProposalResponse> {
    const result = await inTransaction(this.knex, async (trx) => {
      const p = await this.proposalsRepo.findProposal(id, trx, true);
      if (!p || !this.may(user, 'read', p)) throw notFound('proposal');
      ForbiddenError.from(user.ability).throwUnlessCan('update', this.subject(p));
      if (p.status === 'signed' || (await this.repo.contractOfProposal(p.id, trx))) throw alreadySigned();
      const lead = (await this.repo.lead(p.leadId, trx, true))!;
      const to = dto.email ?? lead.email;
      if (!to) {
        throw new DomainError(
          'rule',
          'SIGNING.NO_EMAIL',
          'The homeowner has no e-mail address on the lead.',
          [{ field: 'email', message: 'Enter the homeowner’s e-mail address, or add it to the lead.' }],
        );
      }
      const resend = p.status === 'sent';
      if (!resend) await this.proposals.markSent(p.id, trx); // 409 PROPOSAL.NOT_APPROVED unless approved

      const ctx = await this.documents.context(p.id, trx);
      const deposit = this.checkDeposit(
        dto.depositAmount ?? null,
        ctx.options.map((o) => o.totals.customerTotal),
      );
      const revoked = await this.repo.countUnusedLinks(p.id, trx);
      await this.proposalsRepo.revokeSigningLinks(p.id, trx);
      const now = this.clock.now();
      const token = newToken();
      const link = await this.repo.insertLink(
        {
          proposalId: p.id,
          branchId: p.branchId,
          tokenHash: hashToken(token),
          sentTo: to,
          expiresAt: new Date(now.getTime() + this.config.signingLinkTtlDays * DAY_MS),
          depositAmount: deposit,
          sentBy: user.id,
        },
        trx,
      );

      const highest = ctx.options.reduce(
        (max, o) => (money(o.totals.customerTotal).greaterThan(max) ? o.totals.customerTotal : max),
        '0.00',
      );
      await this.repo.setLeadValue(p.leadId, highest, trx);
      if (lead.stage === 'inspected') await this.contracts.moveLead(lead, 'proposal_sent', user.id, trx);

      const tz = ctx.branch.timezone;
      const expiresOn = todayInZone(tz, link.expiresAt);
      const mail = proposalSentMail({
        homeownerName: lead.homeownerName,
        branchName: ctx.branch.name,
        branchPhone: ctx.branch.phone,
        salespersonName: ctx.salesperson?.name ?? null,
        version: p.version,
        options: ctx.options.map((o) => ({
          position: o.position,
          title: o.title,
          customerTotal: o.totals.customerTotal,
        })),
        link: `${this.config.publicUrl}/sign/${token}`,
        expiresOn,
      });
      await this.repo.addActivity(
        {
          leadId: p.leadId,
          branchId: p.branchId,
          kind: 'proposal',
          body:
            `Proposal version ${p.version} ${resend ? 'sent again' : 'sent'} to ${to}` +
            `${deposit ? ` with a deposit of ${formatUsd(deposit)}` : ''}; the signing link works until ${weekdayDate(expiresOn)}` +
            `${revoked ? ` (${revoked} earlier link${revoked > 1 ? 's' : ''} stopped working)` : ''}.`,
          data: {
            event: resend ? 'resent' : 'sent',
            proposalId: p.id,
            signingLinkId: link.id,
            sentTo: to,
            expiresAt: link.expiresAt.toISOString(),
            depositAmount: deposit,
            revokedLinks: revoked,
          },
          actorId: user.id,
        },
        trx,
      );
      await this.repo.addActivity(
        {
          leadId: p.leadId,
          branchId: p.branchId,
          kind: 'email',
          body: `E-mail "${mail.subject}" sent to ${to}, with the proposal PDF and the signing link.`,
          data: { event: 'proposal_mail', proposalId: p.id, signingLinkId: link.id, to },
          actorId: user.id,
        },
        trx,
      );
      const pdf = await this.documents.render(
        this.documents.proposalModel(ctx, { deposit, datedOn: todayInZone(tz, now) }),
      );
      await this.mail.send({
        to,
        ...mail,
        attachments: [
          { filename: `proposal-v${p.version}.pdf`, content: pdf, contentType: 'application/pdf' },
        ],
      });
      return { link, revoked };
    });
    return {
      proposal: await this.proposals.get(user, id),
      signingLink: {
        id: result.link.id,
        sentTo: result.link.sentTo,
        expiresAt: result.link.expiresAt.toISOString(),
        createdAt: result.link.createdAt.toISOString(),
        depositAmount: result.link.depositAmount,
      },
      revokedLinkCount: result.revoked,
    };
  }

  // ---- the homeowner's page (public) ------------------------------------------------------------

  async view(token: string): Promise<SigningView> {
    const { link, contract } = await this.resolve(token);
    const ctx = await this.documents.context(link.proposalId);
    return this.viewOf(ctx, link, contract, token);
  }

  async pdfForToken(token: string): Promise<{ pdf: Buffer; filename: string }> {
    const { link, contract } = await this.resolve(token);
    if (contract)
      return { pdf: await this.documents.contractPdf(contract), filename: contractFilename(contract) };
    const ctx = await this.documents.context(link.proposalId);
    const datedOn = todayInZone(ctx.branch.timezone, this.clock.now());
    const pdf = await this.documents.render(
      this.documents.proposalModel(ctx, { deposit: link.depositAmount, datedOn }),
    );
    return { pdf, filename: `proposal-v${ctx.proposal.version}.pdf` };
  }

  async sign(token: string, dto: SignContractDto, evidence: SigningEvidence): Promise<SigningView> {
    const png = await readSignaturePng(dto.signaturePng);
    const contractId = await inTransaction(this.knex, async (trx) => {
      // Lock order proposal → link, as everywhere else (a new version revokes links with its proposal locked).
      const seen = TOKEN_SHAPE.test(token)
        ? await this.repo.findLinkByHash(hashToken(token), trx)
        : undefined;
      if (!seen) throw linkUnknown();
      const p = (await this.proposalsRepo.findProposal(seen.proposalId, trx, true))!;
      const link = (await this.repo.findLinkByHash(hashToken(token), trx, true))!;
      const existing = await this.repo.contractOfProposal(p.id, trx);
      if (existing?.cancelledAt) throw contractCancelled(existing);
      if (link.revokedAt) throw linkRevoked();
      if (existing || link.usedAt) throw alreadySigned();
      const now = this.clock.now();
      if (link.expiresAt.getTime() <= now.getTime()) throw linkExpired();
      if (p.status !== 'sent') throw linkRevoked();
      const ctx = await this.documents.context(p.id, trx);
      const id = await this.createContract(
        trx,
        ctx,
        { ...dto, png },
        {
          deposit: link.depositAmount,
          inPerson: false,
          evidence,
          now,
          actorId: null,
        },
      );
      await this.repo.markLinkUsed(link.id, now, trx);
      await this.proposalsRepo.revokeSigningLinks(p.id, trx);
      return id;
    });
    await this.afterSigning(contractId, token, null);
    return this.view(token);
  }

  async cancel(token: string, _dto: CancelSigningDto): Promise<CancelSigningResponse> {
    const contract = await inTransaction(this.knex, async (trx) => {
      const link = TOKEN_SHAPE.test(token)
        ? await this.repo.findLinkByHash(hashToken(token), trx)
        : undefined;
      if (!link) throw linkUnknown();
      const c = await this.repo.contractOfProposal(link.proposalId, trx, true);
      if (c?.cancelledAt) throw contractCancelled(c);
      if (link.revokedAt) throw linkRevoked();
      if (!c) {
        if (link.expiresAt.getTime() <= this.clock.now().getTime()) throw linkExpired();
        throw conflict('CONTRACT.NOT_SIGNED', 'Nothing to cancel: this proposal has not been signed.');
      }
      const branch = await this.repo.branch(c.branchId, trx);
      const now = this.clock.now();
      if (!windowOpen(c, branch.timezone, now)) throw windowClosed(c, branch.timezone);
      await this.contracts.recordCancellation(trx, c, {
        byKind: 'homeowner',
        by: null,
        note: null,
        now,
        afterWindow: false,
      });
      return (await this.repo.findContract(c.id, trx))!;
    });
    await this.contracts.notifyCancellation(contract, { byKind: 'homeowner', actor: null, note: null });
    return {
      status: 'cancelled',
      contractId: contract.id,
      cancelledAt: contract.cancelledAt!.toISOString(),
      message:
        'Your contract is cancelled. A confirmation has been sent by e-mail. You owe nothing under it.',
      refundNote:
        'Any payment you made under the contract, the deposit included, is refunded within 10 business days.',
    };
  }

  // ---- in person, on the salesperson's device ----------------------------------------------------

  async signInPerson(
    user: SessionUser,
    id: string,
    dto: SignInPersonDto,
    evidence: SigningEvidence,
  ): Promise<ContractView> {
    const png = await readSignaturePng(dto.signaturePng);
    const { contractId, token } = await inTransaction(this.knex, async (trx) => {
      const p = await this.proposalsRepo.findProposal(id, trx, true);
      if (!p || !this.may(user, 'read', p)) throw notFound('proposal');
      ForbiddenError.from(user.ability).throwUnlessCan('update', this.subject(p));
      if (p.status === 'signed' || (await this.repo.contractOfProposal(p.id, trx))) throw alreadySigned();
      if (p.status !== 'sent') {
        await this.proposals.markSent(p.id, trx); // 409 PROPOSAL.NOT_APPROVED unless approved
        await this.repo.addActivity(
          {
            leadId: p.leadId,
            branchId: p.branchId,
            kind: 'proposal',
            body: `Proposal version ${p.version} presented to the homeowner in person.`,
            data: { event: 'presented_in_person', proposalId: p.id },
            actorId: user.id,
          },
          trx,
        );
      }
      const ctx = await this.documents.context(p.id, trx);
      const option = ctx.options.find((o) => o.id === dto.optionId);
      const deposit =
        dto.depositAmount !== undefined
          ? this.checkDeposit(dto.depositAmount, option ? [option.totals.customerTotal] : [])
          : ((await this.repo.latestLink(p.id, trx))?.depositAmount ?? null);
      const now = this.clock.now();
      const contractId = await this.createContract(
        trx,
        ctx,
        { ...dto, png },
        {
          deposit,
          inPerson: true,
          evidence,
          now,
          actorId: user.id,
        },
      );
      await this.proposalsRepo.revokeSigningLinks(p.id, trx);
      // A link for the homeowner to come back to: the signed contract and, inside the window, cancelling.
      let token: string | null = null;
      if (ctx.lead.email) {
        token = newToken();
        await this.repo.insertLink(
          {
            proposalId: p.id,
            branchId: p.branchId,
            tokenHash: hashToken(token),
            sentTo: ctx.lead.email,
            expiresAt: new Date(now.getTime() + this.config.signingLinkTtlDays * DAY_MS),
            depositAmount: deposit,
            sentBy: user.id,
            usedAt: now,
          },
          trx,
        );
      }
      return { contractId, token };
    });
    await this.afterSigning(contractId, token, user.id);
    return this.contracts.get(user, contractId);
  }

  // ---- helpers -----------------------------------------------------------------------------------

  /**
   * The contract, with everything that signing it means: the notices acknowledged, the date of the
   * transaction on the branch's clock and its last day to cancel (16 CFR 429.1(a)), the proposal signed,
   * the lead at "contract signed" with the price as its value, and the timeline.
   */
  private async createContract(
    trx: Knex.Transaction,
    ctx: ProposalContext,
    input: SignInput,
    meta: {
      deposit: string | null;
      inPerson: boolean;
      evidence: SigningEvidence;
      now: Date;
      actorId: string | null;
    },
  ): Promise<string> {
    const option = ctx.options.find((o) => o.id === input.optionId);
    if (!option) throw invalid('optionId', 'Choose one of the proposal’s options.');
    const price = option.totals.customerTotal;
    if (!money(price).greaterThan(0)) {
      throw new DomainError('rule', 'CONTRACT.PRICE_ZERO', 'This option has no price to sign for.');
    }
    const deposit = meta.deposit && money(meta.deposit).greaterThan(0) ? toMoneyString(meta.deposit) : '0.00';
    if (money(deposit).greaterThan(price)) {
      throw invalid('depositAmount', `The deposit is more than this option’s total (${formatUsd(price)}).`);
    }
    const rules = contractRules({ state: ctx.lead.state, contractPrice: price, deposit });
    const { missing, unknown } = checkAcknowledgements(rules.notices, input.acknowledgedNotices);
    if (missing.length) {
      const titles = rules.notices.filter((n) => missing.includes(n.code)).map((n) => n.title);
      const message = `Read and acknowledge every notice before signing: ${titles.join('; ')}.`;
      throw new DomainError('invalid', 'SIGNING.NOTICE_NOT_ACKNOWLEDGED', message, [
        { field: 'acknowledgedNotices', message },
      ]);
    }
    if (unknown.length) {
      throw invalid('acknowledgedNotices', `Not a notice of this contract: ${unknown.join(', ')}.`);
    }

    const tz = ctx.branch.timezone;
    const signedOn = todayInZone(tz, meta.now);
    const deadline = cancellationDeadline({ signedOn });
    const p = ctx.proposal;
    let id: string;
    try {
      id = await this.repo.insertContract(
        {
          proposalId: p.id,
          optionId: option.id,
          leadId: p.leadId,
          branchId: p.branchId,
          salespersonId: p.salespersonId ?? ctx.lead.salespersonId,
          price,
          // Sales tax inside the price: only where it is charged on the invoice.
          tax: ctx.tax.treatment === 'invoice' ? option.totals.taxTotal : '0.00',
          depositAmount: deposit,
          signedByName: input.signerName,
          signedAt: meta.now,
          signedOn,
          signedIp: meta.evidence.ip,
          signedUserAgent: meta.evidence.userAgent,
          signedInPerson: meta.inPerson,
          signaturePng: input.png,
          cancellationStatement: FTC_429_BUYER_STATEMENT,
          lastDayToCancel: deadline.lastDayToCancel,
          notices: rules.notices.map((n) => ({
            code: n.code,
            title: n.title,
            source: n.source,
            acknowledgedAt: meta.now.toISOString(),
          })),
        },
        trx,
      );
    } catch (e) {
      if ((e as { code?: string }).code === '23505') throw alreadySigned();
      throw e;
    }
    await this.jobs.createForContract(id, trx); // issue #4: the job, with the option's lines as its plan
    await this.proposalsRepo.updateProposal(p.id, { status: 'signed' }, trx);

    const lead = (await this.repo.lead(p.leadId, trx, true))!;
    if (lead.stage === 'inspected') await this.contracts.moveLead(lead, 'proposal_sent', meta.actorId, trx);
    const moved = await this.contracts.moveLead(lead, 'contract_signed', meta.actorId, trx);
    await this.repo.setLeadValue(p.leadId, price, trx);
    const after = (await this.repo.lead(p.leadId, trx))!;
    await this.repo.addActivity(
      {
        leadId: p.leadId,
        branchId: p.branchId,
        kind: 'contract',
        body:
          `Contract signed ${meta.inPerson ? 'in person' : 'online'} by ${input.signerName}: option ${option.position} ` +
          `"${option.title}", ${formatUsd(price)}` +
          `${money(deposit).greaterThan(0) ? `, deposit ${formatUsd(deposit)}` : ''}. ` +
          `Last day to cancel: ${weekdayDate(deadline.lastDayToCancel)} (16 CFR 429.1(a)).` +
          `${moved || after.stage === 'contract_signed' ? '' : ` The lead stays at "${after.stage}": check its stage.`}`,
        data: {
          event: 'signed',
          contractId: id,
          proposalId: p.id,
          optionId: option.id,
          price,
          depositAmount: deposit,
          signedOn,
          lastDayToCancel: deadline.lastDayToCancel,
          inPerson: meta.inPerson,
          notices: rules.notices.map((n) => n.code),
        },
        actorId: meta.actorId,
      },
      trx,
    );
    return id;
  }

  /** After the commit: the signed PDF into the bucket, and to the homeowner by e-mail. Failures are logged. */
  private async afterSigning(
    contractId: string,
    token: string | null,
    actorId: string | null,
  ): Promise<void> {
    const c = (await this.repo.findContract(contractId))!;
    let pdf: Buffer | null = null;
    try {
      pdf = await this.documents.storeContractPdf(c);
    } catch (err) {
      this.logger.error({ err, contractId }, 'Contract PDF not stored; it is made again when asked for');
    }
    const [lead, branch] = await Promise.all([this.repo.lead(c.leadId), this.repo.branch(c.branchId)]);
    if (!lead?.email) return;
    try {
      pdf ??= await this.documents.render(
        this.documents.contractModel(await this.documents.context(c.proposalId), c),
      );
      const mail = contractSignedMail({
        homeownerName: lead.homeownerName,
        branchName: branch.name,
        optionTitle: c.optionTitle,
        price: c.price,
        signedOn: c.signedOn,
        lastDayToCancel: c.lastDayToCancel,
        timezone: branch.timezone,
        link: token ? `${this.config.publicUrl}/sign/${token}` : null,
      });
      await this.mail.send({
        to: lead.email,
        ...mail,
        attachments: [{ filename: contractFilename(c), content: pdf, contentType: 'application/pdf' }],
      });
      await this.repo.addActivity(
        {
          leadId: c.leadId,
          branchId: c.branchId,
          kind: 'email',
          body: `E-mail "${mail.subject}" sent to ${lead.email}, with the signed contract PDF.`,
          data: { event: 'contract_mail', contractId, to: lead.email },
          actorId,
        },
        this.knex,
      );
    } catch (err) {
      this.logger.warn({ err, contractId }, 'Signed contract e-mail not sent');
    }
  }

  /**
   * The link behind a token and the contract signed through its proposal, or 410 with the reason:
   * unknown, revoked, expired (only while unsigned: a signed contract's link keeps working so the
   * homeowner can come back to it), or the contract was cancelled.
   */
  private async resolve(
    token: string,
  ): Promise<{ link: SigningLinkRecord; contract: ContractRecord | null }> {
    const link = TOKEN_SHAPE.test(token) ? await this.repo.findLinkByHash(hashToken(token)) : undefined;
    if (!link) throw linkUnknown();
    const contract = (await this.repo.contractOfProposal(link.proposalId)) ?? null;
    if (contract?.cancelledAt) throw contractCancelled(contract);
    if (link.revokedAt) throw linkRevoked();
    if (contract) return { link, contract };
    if (link.usedAt) throw linkUnknown();
    if (link.expiresAt.getTime() <= this.clock.now().getTime()) throw linkExpired();
    const p = await this.proposalsRepo.findProposal(link.proposalId);
    if (p?.status !== 'sent') throw linkRevoked();
    return { link, contract: null };
  }

  private viewOf(
    ctx: ProposalContext,
    link: SigningLinkRecord,
    contract: ContractRecord | null,
    token: string,
  ): SigningView {
    const now = this.clock.now();
    const tz = ctx.branch.timezone;
    const priced = pricedOptions(ctx, contract ? contract.depositAmount : link.depositAmount);
    return {
      status: contract ? 'signed' : 'awaiting_signature',
      link: { sentTo: link.sentTo, expiresAt: link.expiresAt.toISOString() },
      branch: branchView(ctx.branch),
      homeowner: { name: ctx.lead.homeownerName, email: ctx.lead.email, phone: ctx.lead.phone },
      property: {
        addressLine1: ctx.lead.addressLine1,
        city: ctx.lead.city,
        state: ctx.lead.state,
        postalCode: ctx.lead.postalCode,
      },
      salesperson: ctx.salesperson ? { name: ctx.salesperson.name, email: ctx.salesperson.email } : null,
      proposal: { version: ctx.proposal.version, sentAt: ctx.proposal.sentAt },
      findings: findingsOf(ctx),
      options: priced.map((x) => x.option),
      cautions: [...SIGNING_CAUTIONS],
      notices: unionNotices(priced),
      cancellation: cancellationPreview(tz, now),
      contract: contract ? contractStatus(contract, tz, now) : null,
      pdfPath: `/api/signing/${token}/pdf`,
    };
  }

  /** A deposit as money, at most the smallest of `totals`; null for none. */
  private checkDeposit(amount: string | null, totals: string[]): string | null {
    if (amount === null || !money(amount).greaterThan(0)) return null;
    const lowest = totals.reduce<string | null>(
      (min, t) => (min === null || money(t).lessThan(min) ? t : min),
      null,
    );
    if (lowest !== null && money(amount).greaterThan(lowest)) {
      throw invalid(
        'depositAmount',
        `The deposit cannot be more than the lowest option’s total (${formatUsd(lowest)}).`,
      );
    }
    return toMoneyString(amount);
  }

  private subject(p: ProposalRecord) {
    return asSubject('Proposal', { branchId: p.branchId, salespersonId: p.salespersonId });
  }

  private may(user: SessionUser, action: 'read' | 'update', p: ProposalRecord): boolean {
    return user.ability.can(action, this.subject(p));
  }
}
