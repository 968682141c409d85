import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  APPROVAL_REASON_LABELS,
  APPROVER_LABELS,
  approvalDecision,
  asSubject,
  combineDecisions,
  commissionPreview,
  money,
  PricingError,
  priceOption,
  PROPOSAL_EDIT_MAKES_VERSION,
  PROPOSAL_EDITABLE_IN_PLACE,
  PROPOSAL_READ_ONLY,
  PROPOSAL_STATUS_LABELS,
  toMoneyString,
  type ApprovalFigures,
  type CreateProposalRequest,
  type FieldError,
  type OptionTax,
  type ProposalDetail,
  type ProposalOptionRequest,
  type ProposalSummary,
  type UpdateProposalRequest,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { MailService } from '../mail/mail.service';
import { PriceBookRepository } from '../price-book/price-book.repository';
import { toApprovalView } from './approval-view';
import { approvalRequestedMail } from './proposal-mails';
import {
  ProposalsRepository,
  type LeadRef,
  type LineRecord,
  type NewOption,
  type ProposalRecord,
  type Recipient,
} from './proposals.repository';

/** The largest total a numeric(14,2) column holds. */
const MAX_TOTAL = money('999999999999.99');

const proposalNotFound = () => notFound('proposal');

/**
 * Proposals: versions of an offer to a homeowner, each with options priced from the branch's price book.
 * Totals are computed in common/ (priceOption) when an option is saved and stored with it; each line keeps
 * a copy of its price-book item, so later price changes never change a proposal already made.
 *
 * Life of a version: draft → (submit) → approved, or pending_approval → approved | refused. An edit of a
 * draft, refused or approved version changes it in place and returns it to draft. An edit of a sent
 * version makes a new version (draft) and supersedes the sent one, which stays as it was (read-only).
 * Sending and signing are another feature's; it calls markSent().
 */
@Injectable()
export class ProposalsService {
  private readonly logger = new Logger(ProposalsService.name);

  constructor(
    private readonly repo: ProposalsRepository,
    private readonly priceBook: PriceBookRepository,
    private readonly mail: MailService,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async create(user: SessionUser, leadId: string, input: CreateProposalRequest): Promise<ProposalDetail> {
    const id = await inTransaction(this.knex, async (trx) => {
      const lead = await this.readableLead(user, leadId, trx, true);
      ForbiddenError.from(user.ability).throwUnlessCan(
        'create',
        asSubject('Proposal', { branchId: lead.branchId, salespersonId: lead.salespersonId }),
      );
      const inspectionId = await this.checkInspection(input.inspectionId ?? null, leadId, trx);
      const [latest] = await this.repo.versions(leadId, trx);
      // A lead has one line of versions; a new proposal starts only after the homeowner declined the last.
      if (latest && latest.status !== 'declined') {
        throw conflict(
          'PROPOSAL.EXISTS',
          'This lead already has a proposal. Edit it to make a new version.',
          {
            proposalId: latest.id,
          },
        );
      }
      const tax = await this.branchTax(lead.branchId, trx);
      const options = await this.buildOptions(lead.branchId, input.options, tax, new Map(), trx);
      const version = (latest?.version ?? 0) + 1;
      const id = await this.repo.insertProposal(
        {
          leadId,
          branchId: lead.branchId,
          inspectionId,
          version,
          previousId: latest?.id ?? null,
          salespersonId: lead.salespersonId,
          notes: input.notes ?? null,
          createdBy: user.id,
          taxTreatment: tax.treatment,
          taxRatePct: tax.ratePct,
        },
        trx,
      );
      await this.repo.replaceOptions(id, lead.branchId, options, trx);
      await this.repo.addActivity(
        {
          leadId,
          branchId: lead.branchId,
          kind: 'proposal',
          body: `Proposal version ${version} drafted: ${options.map((o) => o.title).join('; ')}.`,
          data: { event: 'created', proposalId: id, version },
          actorId: user.id,
        },
        trx,
      );
      return id;
    });
    return this.get(user, id);
  }

  async listForLead(user: SessionUser, leadId: string): Promise<ProposalSummary[]> {
    await this.readableLead(user, leadId, this.knex);
    const proposals = (await this.repo.proposalsOfLead(leadId)).filter((p) => this.canRead(user, p));
    const options = await this.repo.optionsOf(proposals.map((p) => p.id));
    return proposals.map((p) => ({
      id: p.id,
      leadId: p.leadId,
      branchId: p.branchId,
      version: p.version,
      previousId: p.previousId,
      status: p.status,
      salespersonId: p.salespersonId,
      createdAt: p.createdAt,
      updatedAt: p.updatedAt,
      sentAt: p.sentAt,
      options: (options.get(p.id) ?? []).map((o) => ({
        id: o.id,
        position: o.position,
        title: o.title,
        netTotal: o.totals.netTotal,
        customerTotal: o.totals.customerTotal,
        grossMarginPct: o.totals.grossMarginPct,
      })),
    }));
  }

  async get(user: SessionUser, id: string, db: Db = this.knex): Promise<ProposalDetail> {
    const p = await this.repo.findProposal(id, db);
    if (!p || !this.canRead(user, p)) throw proposalNotFound();
    return this.detail(user, p, db);
  }

  async update(user: SessionUser, id: string, input: UpdateProposalRequest): Promise<ProposalDetail> {
    const resultId = await inTransaction(this.knex, async (trx) => {
      const p = await this.writable(user, id, trx);
      if (PROPOSAL_READ_ONLY.includes(p.status)) throw this.readOnly(p);
      if (p.status === 'pending_approval') {
        throw conflict(
          'PROPOSAL.AWAITING_APPROVAL',
          'This proposal is waiting for approval. It can be changed once it is approved or refused.',
        );
      }
      const makesVersion = PROPOSAL_EDIT_MAKES_VERSION.includes(p.status);
      if (!makesVersion && !PROPOSAL_EDITABLE_IN_PLACE.includes(p.status)) throw this.readOnly(p);
      await this.repo.findLead(p.leadId, trx, true); // one version number at a time
      const inspectionId =
        input.inspectionId === undefined
          ? p.inspectionId
          : await this.checkInspection(input.inspectionId, p.leadId, trx);
      const notes = input.notes === undefined ? p.notes : input.notes;
      const tax = await this.branchTax(p.branchId, trx);
      const held = new Map<string, LineRecord>();
      if (!input.refreshPrices) {
        for (const o of await this.repo.options(p.id, trx)) {
          for (const l of o.lines)
            if (l.priceBookItemId && !held.has(l.priceBookItemId)) held.set(l.priceBookItemId, l);
        }
      }
      const options = await this.buildOptions(p.branchId, input.options, tax, held, trx);

      if (!makesVersion) {
        await this.repo.replaceOptions(p.id, p.branchId, options, trx);
        await this.repo.updateProposal(
          p.id,
          { status: 'draft', inspectionId, notes, taxTreatment: tax.treatment, taxRatePct: tax.ratePct },
          trx,
        );
        return p.id;
      }

      const [latest] = await this.repo.versions(p.leadId, trx);
      if (!latest || latest.id !== p.id) throw this.readOnly(p);
      const version = latest.version + 1;
      const newId = await this.repo.insertProposal(
        {
          leadId: p.leadId,
          branchId: p.branchId,
          inspectionId,
          version,
          previousId: p.id,
          salespersonId: p.salespersonId,
          notes,
          createdBy: user.id,
          taxTreatment: tax.treatment,
          taxRatePct: tax.ratePct,
        },
        trx,
      );
      await this.repo.replaceOptions(newId, p.branchId, options, trx);
      await this.repo.updateProposal(p.id, { status: 'superseded' }, trx);
      // The homeowner can no longer sign the replaced version.
      await this.repo.revokeSigningLinks(p.id, trx);
      await this.repo.addActivity(
        {
          leadId: p.leadId,
          branchId: p.branchId,
          kind: 'proposal',
          body: `Proposal version ${version} drafted from version ${p.version}, which it replaces.`,
          data: { event: 'new_version', proposalId: newId, version, previousId: p.id },
          actorId: user.id,
        },
        trx,
      );
      return newId;
    });
    return this.get(user, resultId);
  }

  /**
   * Asks for the go-ahead: every option is judged against the branch's margin floor and the submitter's
   * discount authority (approvalDecision in common/). Within both → approved, may be sent; otherwise an
   * approval request goes to the branch's managers (or the owner) and the proposal waits.
   */
  async submit(user: SessionUser, id: string): Promise<ProposalDetail> {
    const requested = await inTransaction(this.knex, async (trx) => {
      const p = await this.writable(user, id, trx);
      if (p.status !== 'draft') {
        throw conflict(
          'PROPOSAL.NOT_DRAFT',
          `Only a draft can be submitted; this one is: ${PROPOSAL_STATUS_LABELS[p.status].toLowerCase()}.`,
          { status: p.status },
        );
      }
      const settings = await this.repo.branchSettings(p.branchId, trx);
      const options = await this.repo.options(p.id, trx);
      const perOption = options.map((o) => ({
        option: o,
        decision: approvalDecision({
          role: user.role,
          marginFloorPct: settings.marginFloorPct,
          discountAuthority: settings.discountAuthority,
          discountPct: o.totals.discountPct,
          grossMarginPct: o.totals.grossMarginPct,
        }),
      }));
      const overall = combineDecisions(perOption.map((x) => x.decision));
      if (!overall.needsApproval || overall.approver === 'none') {
        await this.repo.updateProposal(p.id, { status: 'approved' }, trx);
        return null;
      }
      const figures: ApprovalFigures = {
        submitterRole: user.role,
        marginFloorPct: settings.marginFloorPct,
        discountAuthority: settings.discountAuthority,
        tax: this.taxOf(p, settings),
        options: perOption.map(({ option: o, decision: d }) => ({
          optionId: o.id,
          position: o.position,
          title: o.title,
          costTotal: o.totals.costTotal,
          listTotal: o.totals.listTotal,
          discountTotal: o.totals.discountTotal,
          discountPct: o.totals.discountPct,
          netTotal: o.totals.netTotal,
          taxTotal: o.totals.taxTotal,
          customerTotal: o.totals.customerTotal,
          grossProfit: o.totals.grossProfit,
          grossMarginPct: o.totals.grossMarginPct,
          approver: d.approver,
          reasons: d.reasons,
        })),
      };
      const requestId = await this.repo.insertApproval(
        {
          proposalId: p.id,
          leadId: p.leadId,
          branchId: p.branchId,
          requestedBy: user.id,
          approver: overall.approver,
          reasons: overall.reasons,
          figures,
        },
        trx,
      );
      await this.repo.updateProposal(p.id, { status: 'pending_approval' }, trx);
      await this.repo.addActivity(
        {
          leadId: p.leadId,
          branchId: p.branchId,
          kind: 'approval',
          body:
            `Approval of proposal version ${p.version} requested from the ${APPROVER_LABELS[overall.approver].toLowerCase()}: ` +
            `${overall.reasons.map((r) => APPROVAL_REASON_LABELS[r].toLowerCase()).join('; ')}.`,
          data: {
            event: 'requested',
            approvalRequestId: requestId,
            proposalId: p.id,
            approver: overall.approver,
          },
          actorId: user.id,
        },
        trx,
      );
      const lead = (await this.repo.findLead(p.leadId, trx))!;
      const recipients = [
        ...(await this.repo.branchManagers(p.branchId, trx)),
        ...(overall.approver === 'owner' ? await this.repo.owners(trx) : []),
      ];
      return { p, lead, requestId, overall, figures, recipients, branchName: settings.name };
    });

    if (requested) await this.notifyApprovers(user, requested);
    return this.get(user, id);
  }

  /**
   * For the sending feature: marks an approved version as sent, inside the caller's transaction.
   * A version that is not approved cannot be sent (409 PROPOSAL.NOT_APPROVED). The caller checks that
   * the person may send it (update on the Proposal).
   */
  async markSent(proposalId: string, trx: Knex.Transaction): Promise<ProposalRecord> {
    const p = await this.repo.findProposal(proposalId, trx, true);
    if (!p) throw proposalNotFound();
    if (p.status !== 'approved') {
      throw conflict('PROPOSAL.NOT_APPROVED', 'Only an approved proposal can be sent to the homeowner.', {
        status: p.status,
      });
    }
    await this.repo.updateProposal(p.id, { status: 'sent', sentAt: 'now' }, trx);
    return (await this.repo.findProposal(p.id, trx))!;
  }

  // ---------------------------------------------------------------------------------------------

  private canRead(user: SessionUser, p: { branchId: string; salespersonId: string | null }): boolean {
    return user.ability.can(
      'read',
      asSubject('Proposal', { branchId: p.branchId, salespersonId: p.salespersonId }),
    );
  }

  private canUpdate(user: SessionUser, p: { branchId: string; salespersonId: string | null }): boolean {
    return user.ability.can(
      'update',
      asSubject('Proposal', { branchId: p.branchId, salespersonId: p.salespersonId }),
    );
  }

  private async readableLead(user: SessionUser, leadId: string, db: Db, forUpdate = false): Promise<LeadRef> {
    const lead = await this.repo.findLead(leadId, db, forUpdate);
    if (!lead || !user.ability.can('read', asSubject('Lead', lead))) throw notFound('lead');
    return lead;
  }

  private async writable(user: SessionUser, id: string, trx: Knex.Transaction): Promise<ProposalRecord> {
    const p = await this.repo.findProposal(id, trx, true);
    if (!p || !this.canRead(user, p)) throw proposalNotFound();
    ForbiddenError.from(user.ability).throwUnlessCan(
      'update',
      asSubject('Proposal', { branchId: p.branchId, salespersonId: p.salespersonId }),
    );
    return p;
  }

  private readOnly(p: ProposalRecord): DomainError {
    return conflict(
      'PROPOSAL.READ_ONLY',
      `Version ${p.version} is ${PROPOSAL_STATUS_LABELS[p.status].toLowerCase()} and is kept as it was. Edit the latest version.`,
      { status: p.status },
    );
  }

  private async checkInspection(inspectionId: string | null, leadId: string, db: Db): Promise<string | null> {
    if (inspectionId === null) return null;
    if (!(await this.repo.inspectionBelongsToLead(inspectionId, leadId, db))) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [
        { field: 'inspectionId', message: 'This inspection is not one of this lead’s.' },
      ]);
    }
    return inspectionId;
  }

  private async branchTax(branchId: string, db: Db): Promise<OptionTax> {
    const s = await this.repo.branchSettings(branchId, db);
    return { treatment: s.salesTaxTreatment, ratePct: s.salesTaxRatePct };
  }

  private taxOf(
    p: ProposalRecord,
    s: { salesTaxTreatment: OptionTax['treatment']; salesTaxRatePct: string },
  ): OptionTax {
    return { treatment: p.taxTreatment ?? s.salesTaxTreatment, ratePct: p.taxRatePct ?? s.salesTaxRatePct };
  }

  /**
   * Copies each line's item (or the copy already held by the version being edited) and prices every
   * option. All unknown or deactivated items are reported together, by field.
   */
  private async buildOptions(
    branchId: string,
    requested: ProposalOptionRequest[],
    tax: OptionTax,
    held: Map<string, LineRecord>,
    db: Db,
  ): Promise<NewOption[]> {
    const ids = [...new Set(requested.flatMap((o) => o.lines.map((l) => l.priceBookItemId)))];
    const items = await this.priceBook.findForBranch(branchId, ids, db);
    const faults: FieldError[] = [];
    const options = requested.map((o, i) => {
      const lines = o.lines.map((l, j) => {
        const field = `options.${i}.lines.${j}.priceBookItemId`;
        const kept = held.get(l.priceBookItemId);
        const item = items.get(l.priceBookItemId);
        const source = kept ?? item;
        if (!source) faults.push({ field, message: 'Choose an item from this branch’s price book.' });
        else if (!kept && item && !item.active) {
          faults.push({ field, message: `${item.code} is no longer offered (deactivated).` });
        }
        return {
          priceBookItemId: l.priceBookItemId,
          code: source?.code ?? '',
          description: source?.description ?? '',
          category: source?.category ?? 'mobilisation',
          unit: source?.unit ?? 'each',
          quantity: l.quantity,
          unitCost: source?.unitCost ?? '0',
          unitPrice: source?.unitPrice ?? '0',
          quantitySource: l.quantitySource ?? 'typed',
        };
      });
      return { request: o, lines };
    });
    if (faults.length)
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', faults);

    return options.map(({ request: o, lines }, i) => {
      const discount = o.discount.kind === 'none' ? { kind: 'none' as const, value: '0' } : o.discount;
      let totals;
      try {
        totals = priceOption({ lines, discount, tax });
      } catch (e) {
        if (!(e instanceof PricingError)) throw e;
        const field = `options.${i}.${e.field}`;
        throw e.code === 'PRICING.DISCOUNT_EXCEEDS_LIST'
          ? new DomainError('rule', 'PROPOSAL.DISCOUNT_EXCEEDS_LIST', e.message, [
              { field, message: e.message },
            ])
          : new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [
              { field, message: e.message },
            ]);
      }
      if (
        [totals.costTotal, totals.listTotal, totals.customerTotal].some((t) =>
          money(t).greaterThan(MAX_TOTAL),
        )
      ) {
        throw new DomainError(
          'rule',
          'PROPOSAL.TOTAL_TOO_LARGE',
          'This option’s total is too large to record.',
          [
            {
              field: `options.${i}`,
              message: 'Check the quantities: the total is beyond what can be recorded.',
            },
          ],
        );
      }
      return {
        title: o.title,
        description: o.description ?? null,
        discountKind: discount.kind,
        discountValue: toMoneyString(discount.value),
        totals,
        lines,
      };
    });
  }

  private async detail(user: SessionUser, p: ProposalRecord, db: Db): Promise<ProposalDetail> {
    const [options, settings, versions, latestRequest] = await Promise.all([
      this.repo.options(p.id, db),
      this.repo.branchSettings(p.branchId, db),
      this.repo.versions(p.leadId, db),
      this.repo.latestApproval(p.id, db),
    ]);
    const tax = this.taxOf(p, settings);
    const optionViews = options.map((o) => {
      const totals = {
        ...o.totals,
        taxBorneBy: tax.treatment === 'materials_cost' ? 'contractor' : 'homeowner',
      } as const;
      return {
        id: o.id,
        position: o.position,
        title: o.title,
        description: o.description,
        discount: { kind: o.discountKind, value: o.discountKind === 'none' ? '0' : o.discountValue },
        lines: o.lines.map((l) => ({
          ...l,
          lineCost: toMoneyString(money(l.quantity).times(l.unitCost)),
          lineList: toMoneyString(money(l.quantity).times(l.unitPrice)),
        })),
        totals,
        approval: approvalDecision({
          role: user.role,
          marginFloorPct: settings.marginFloorPct,
          discountAuthority: settings.discountAuthority,
          discountPct: totals.discountPct,
          grossMarginPct: totals.grossMarginPct,
        }),
        commission: {
          ratePct: settings.commissionRatePct,
          basis: 'net' as const,
          amount: commissionPreview({
            netTotal: totals.netTotal,
            grossProfit: totals.grossProfit,
            ratePct: settings.commissionRatePct,
            basis: 'net',
          }),
        },
      };
    });
    const mayUpdate = this.canUpdate(user, p);
    return {
      id: p.id,
      leadId: p.leadId,
      branchId: p.branchId,
      inspectionId: p.inspectionId,
      version: p.version,
      previousId: p.previousId,
      status: p.status,
      salespersonId: p.salespersonId,
      notes: p.notes,
      sentAt: p.sentAt,
      createdBy: p.createdBy,
      createdAt: p.createdAt,
      updatedAt: p.updatedAt,
      tax,
      options: optionViews,
      approval: combineDecisions(optionViews.map((o) => o.approval)),
      approvalRequest: latestRequest ? toApprovalView(user, latestRequest) : null,
      versions: versions
        .filter((v) => this.canRead(user, v))
        .map((v) => ({
          id: v.id,
          version: v.version,
          status: v.status,
          createdAt: v.createdAt,
          sentAt: v.sentAt,
        })),
      editable:
        mayUpdate &&
        (PROPOSAL_EDITABLE_IN_PLACE.includes(p.status) || PROPOSAL_EDIT_MAKES_VERSION.includes(p.status)),
      readOnly: PROPOSAL_READ_ONLY.includes(p.status),
      canSubmit: mayUpdate && p.status === 'draft',
    };
  }

  /** After the commit: the queue in the app is the record; an e-mail that fails is logged, not fatal. */
  private async notifyApprovers(
    user: SessionUser,
    r: {
      p: ProposalRecord;
      lead: LeadRef;
      overall: {
        approver: 'none' | 'branch_manager' | 'owner';
        reasons: ApprovalFigures['options'][number]['reasons'];
      };
      figures: ApprovalFigures;
      recipients: Recipient[];
      branchName: string;
    },
  ): Promise<void> {
    const seen = new Set<string>([user.id]);
    for (const to of r.recipients) {
      if (seen.has(to.id)) continue;
      seen.add(to.id);
      const mail = approvalRequestedMail({
        recipientName: to.name,
        requestedBy: user.name,
        homeownerName: r.lead.homeownerName,
        version: r.p.version,
        branchName: r.branchName,
        approver: r.overall.approver === 'owner' ? 'owner' : 'branch_manager',
        reasons: r.overall.reasons,
        figures: r.figures,
        link: `${this.config.publicUrl}/approvals`,
      });
      try {
        await this.mail.send({ to: to.email, ...mail });
      } catch (err) {
        this.logger.warn({ err, to: to.email }, 'Approval request e-mail not sent');
      }
    }
  }
}
