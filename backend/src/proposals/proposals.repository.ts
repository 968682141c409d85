import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type {
  ApprovalFigures,
  ApprovalReason,
  ApprovalRequestStatus,
  DiscountAuthority,
  DiscountKind,
  OptionTotals,
  PriceBookCategory,
  PriceBookUnit,
  ProposalStatus,
  ProposalVersionRef,
  QuantitySource,
  SalesTaxTreatment,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** A proposal version as stored. */
export interface ProposalRecord {
  id: string;
  leadId: string;
  branchId: string;
  inspectionId: string | null;
  version: number;
  previousId: string | null;
  status: ProposalStatus;
  salespersonId: string | null;
  notes: string | null;
  sentAt: string | null;
  createdBy: string;
  createdAt: string;
  updatedAt: string;
  taxTreatment: SalesTaxTreatment | null;
  taxRatePct: string | null;
}

export interface LineRecord {
  id: string;
  position: number;
  priceBookItemId: string | null;
  code: string;
  description: string;
  category: PriceBookCategory;
  unit: PriceBookUnit;
  quantity: string;
  unitCost: string;
  unitPrice: string;
  quantitySource: QuantitySource;
}

export interface OptionRecord {
  id: string;
  position: number;
  title: string;
  description: string | null;
  discountKind: DiscountKind;
  discountValue: string;
  totals: OptionTotals;
  lines: LineRecord[];
}

export type NewLine = Omit<LineRecord, 'id' | 'position'>;
export interface NewOption {
  title: string;
  description: string | null;
  discountKind: DiscountKind;
  discountValue: string;
  totals: OptionTotals;
  lines: NewLine[];
}

export interface LeadRef {
  id: string;
  branchId: string;
  salespersonId: string | null;
  homeownerName: string;
}

export interface BranchSettings {
  id: string;
  name: string;
  marginFloorPct: string;
  discountAuthority: DiscountAuthority;
  salesTaxTreatment: SalesTaxTreatment;
  salesTaxRatePct: string;
  commissionRatePct: string;
}

export interface ApprovalRecord {
  id: string;
  proposalId: string;
  proposalVersion: number;
  proposalStatus: ProposalStatus;
  salespersonId: string | null;
  leadId: string;
  homeownerName: string;
  branchId: string;
  branchName: string;
  status: ApprovalRequestStatus;
  approver: 'branch_manager' | 'owner';
  reasons: ApprovalReason[];
  figures: ApprovalFigures;
  requestedBy: { id: string; name: string; email: string };
  requestedAt: string;
  decidedBy: { id: string; name: string } | null;
  decidedAt: string | null;
  decisionNote: string | null;
}

export interface Recipient {
  id: string;
  name: string;
  email: string;
}

/** numeric(14,3) comes back as "240.000": the API shows "240". */
const trimDecimal = (v: string) => (v.includes('.') ? v.replace(/\.?0+$/, '') : v);
const pct = (v: string) => trimDecimal(v) || '0';
const iso = (d: Date | null) => (d ? d.toISOString() : null);

interface ProposalRow {
  id: string;
  lead_id: string;
  branch_id: string;
  inspection_id: string | null;
  version: number;
  previous_id: string | null;
  status: ProposalStatus;
  salesperson_id: string | null;
  notes: string | null;
  sent_at: Date | null;
  created_by: string;
  created_at: Date;
  updated_at: Date;
  tax_treatment: SalesTaxTreatment | null;
  tax_rate_pct: string | null;
}

interface ApprovalRow {
  id: string;
  proposal_id: string;
  proposal_version: number;
  proposal_status: ProposalStatus;
  salesperson_id: string | null;
  lead_id: string;
  homeowner_name: string;
  branch_id: string;
  branch_name: string;
  status: ApprovalRequestStatus;
  approver: 'branch_manager' | 'owner';
  reasons: ApprovalReason[];
  figures: ApprovalFigures;
  requested_by: string;
  requested_by_name: string;
  requested_by_email: string;
  created_at: Date;
  decided_by: string | null;
  decided_by_name: string | null;
  decided_at: Date | null;
  decision_note: string | null;
}

function toProposal(r: ProposalRow): ProposalRecord {
  return {
    id: r.id,
    leadId: r.lead_id,
    branchId: r.branch_id,
    inspectionId: r.inspection_id,
    version: r.version,
    previousId: r.previous_id,
    status: r.status,
    salespersonId: r.salesperson_id,
    notes: r.notes,
    sentAt: iso(r.sent_at),
    createdBy: r.created_by,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
    taxTreatment: r.tax_treatment,
    taxRatePct: r.tax_rate_pct === null ? null : pct(r.tax_rate_pct),
  };
}

function toApproval(r: ApprovalRow): ApprovalRecord {
  return {
    id: r.id,
    proposalId: r.proposal_id,
    proposalVersion: r.proposal_version,
    proposalStatus: r.proposal_status,
    salespersonId: r.salesperson_id,
    leadId: r.lead_id,
    homeownerName: r.homeowner_name,
    branchId: r.branch_id,
    branchName: r.branch_name,
    status: r.status,
    approver: r.approver,
    reasons: r.reasons,
    figures: r.figures,
    requestedBy: { id: r.requested_by, name: r.requested_by_name, email: r.requested_by_email },
    requestedAt: r.created_at.toISOString(),
    decidedBy: r.decided_by ? { id: r.decided_by, name: r.decided_by_name ?? '' } : null,
    decidedAt: iso(r.decided_at),
    decisionNote: r.decision_note,
  };
}

/** The only file of the proposals feature that touches Knex. */
@Injectable()
export class ProposalsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  // ---- leads, branches, people ---------------------------------------------------------------

  /** With `forUpdate`, locks the lead row: version numbers of its proposals are given out one at a time. */
  async findLead(id: string, db: Db = this.knex, forUpdate = false): Promise<LeadRef | undefined> {
    const q = db('leads')
      .select(
        'id',
        'branch_id as branchId',
        'salesperson_id as salespersonId',
        'homeowner_name as homeownerName',
      )
      .where({ id })
      .first();
    if (forUpdate) q.forUpdate();
    return q;
  }

  async inspectionBelongsToLead(inspectionId: string, leadId: string, db: Db = this.knex): Promise<boolean> {
    return Boolean(await db('inspections').where({ id: inspectionId, lead_id: leadId }).first('id'));
  }

  async branchSettings(branchId: string, db: Db = this.knex): Promise<BranchSettings> {
    const r = await db('branches').where({ id: branchId }).first();
    return {
      id: r.id,
      name: r.name,
      marginFloorPct: pct(r.margin_floor_pct),
      discountAuthority: {
        salesperson: pct(r.discount_limit_salesperson_pct),
        branch_manager: pct(r.discount_limit_manager_pct),
      },
      salesTaxTreatment: r.sales_tax_treatment,
      salesTaxRatePct: pct(r.sales_tax_rate_pct),
      commissionRatePct: pct(r.commission_rate_pct),
    };
  }

  async branchManagers(branchId: string, db: Db = this.knex): Promise<Recipient[]> {
    return db('users as u')
      .join('user_branches as ub', 'ub.user_id', 'u.id')
      .select('u.id', 'u.name', 'u.email')
      .where({ 'ub.branch_id': branchId, 'u.role': 'branch_manager', 'u.active': true })
      .orderBy('u.name');
  }

  async owners(db: Db = this.knex): Promise<Recipient[]> {
    return db('users').select('id', 'name', 'email').where({ role: 'owner', active: true }).orderBy('name');
  }

  async person(id: string, db: Db = this.knex): Promise<Recipient | undefined> {
    return db('users').select('id', 'name', 'email').where({ id, active: true }).first();
  }

  async addActivity(
    a: {
      leadId: string;
      branchId: string;
      kind: 'proposal' | 'approval';
      body: string;
      data: object;
      actorId: string;
    },
    db: Db,
  ): Promise<void> {
    await db('lead_activities').insert({
      lead_id: a.leadId,
      branch_id: a.branchId,
      kind: a.kind,
      body: a.body,
      data: JSON.stringify(a.data),
      actor_id: a.actorId,
    });
  }

  // ---- proposals -----------------------------------------------------------------------------

  async findProposal(id: string, db: Db = this.knex, forUpdate = false): Promise<ProposalRecord | undefined> {
    const q = db('proposals').where({ id }).first();
    if (forUpdate) q.forUpdate();
    const row = await q;
    return row ? toProposal(row) : undefined;
  }

  async proposalsOfLead(leadId: string, db: Db = this.knex): Promise<ProposalRecord[]> {
    return (await db('proposals').where({ lead_id: leadId }).orderBy('version', 'desc')).map(toProposal);
  }

  async versions(
    leadId: string,
    db: Db = this.knex,
  ): Promise<(ProposalVersionRef & { salespersonId: string | null; branchId: string })[]> {
    const rows = await db('proposals')
      .select('id', 'version', 'status', 'created_at', 'sent_at', 'salesperson_id', 'branch_id')
      .where({ lead_id: leadId })
      .orderBy('version', 'desc');
    return rows.map((r) => ({
      id: r.id,
      version: r.version,
      status: r.status,
      createdAt: r.created_at.toISOString(),
      sentAt: iso(r.sent_at),
      salespersonId: r.salesperson_id,
      branchId: r.branch_id,
    }));
  }

  async insertProposal(
    p: {
      leadId: string;
      branchId: string;
      inspectionId: string | null;
      version: number;
      previousId: string | null;
      salespersonId: string | null;
      notes: string | null;
      createdBy: string;
      taxTreatment: SalesTaxTreatment;
      taxRatePct: string;
    },
    db: Db,
  ): Promise<string> {
    const [row] = await db('proposals')
      .insert({
        lead_id: p.leadId,
        branch_id: p.branchId,
        inspection_id: p.inspectionId,
        version: p.version,
        previous_id: p.previousId,
        status: 'draft',
        salesperson_id: p.salespersonId,
        notes: p.notes,
        created_by: p.createdBy,
        tax_treatment: p.taxTreatment,
        tax_rate_pct: p.taxRatePct,
      })
      .returning('id');
    return row.id;
  }

  async updateProposal(
    id: string,
    patch: Partial<{
      status: ProposalStatus;
      inspectionId: string | null;
      notes: string | null;
      taxTreatment: SalesTaxTreatment;
      taxRatePct: string;
      sentAt: 'now';
    }>,
    db: Db,
  ): Promise<void> {
    const row: Record<string, unknown> = {
      status: patch.status,
      inspection_id: patch.inspectionId,
      notes: patch.notes,
      tax_treatment: patch.taxTreatment,
      tax_rate_pct: patch.taxRatePct,
      sent_at: patch.sentAt ? db.fn.now() : undefined,
    };
    await db('proposals')
      .where({ id })
      .update({
        ...Object.fromEntries(Object.entries(row).filter(([, v]) => v !== undefined)),
        updated_at: db.fn.now(),
      });
  }

  /** Unused signing links of a version stop working (it was replaced by a newer version). */
  async revokeSigningLinks(proposalId: string, db: Db): Promise<void> {
    await db('signing_links')
      .where({ proposal_id: proposalId })
      .whereNull('used_at')
      .whereNull('revoked_at')
      .update({ revoked_at: db.fn.now() });
  }

  // ---- options and lines ----------------------------------------------------------------------

  async options(proposalId: string, db: Db = this.knex): Promise<OptionRecord[]> {
    return (await this.optionsOf([proposalId], db)).get(proposalId) ?? [];
  }

  async optionsOf(proposalIds: string[], db: Db = this.knex): Promise<Map<string, OptionRecord[]>> {
    const result = new Map<string, OptionRecord[]>();
    if (proposalIds.length === 0) return result;
    const options = await db('proposal_options').whereIn('proposal_id', proposalIds).orderBy('position');
    const lines = options.length
      ? await db('proposal_lines')
          .whereIn(
            'option_id',
            options.map((o) => o.id),
          )
          .orderBy('position')
      : [];
    const byOption = new Map<string, LineRecord[]>();
    for (const l of lines) {
      const list = byOption.get(l.option_id) ?? [];
      list.push({
        id: l.id,
        position: l.position,
        priceBookItemId: l.price_book_item_id,
        code: l.code,
        description: l.description,
        category: l.category,
        unit: l.unit,
        quantity: trimDecimal(l.quantity),
        unitCost: l.unit_cost,
        unitPrice: l.unit_price,
        quantitySource: l.quantity_source,
      });
      byOption.set(l.option_id, list);
    }
    for (const o of options) {
      const list = result.get(o.proposal_id) ?? [];
      list.push({
        id: o.id,
        position: o.position,
        title: o.title,
        description: o.description,
        discountKind: o.discount_kind,
        discountValue: o.discount_value,
        totals: {
          costTotal: o.cost_total,
          listTotal: o.list_total,
          discountTotal: o.discount_total,
          discountPct: o.discount_pct,
          netTotal: o.net_total,
          materialsCostTotal: o.materials_cost_total,
          taxTotal: o.tax_total,
          // Filled in by the service from the proposal's treatment.
          taxBorneBy: 'homeowner',
          customerTotal: o.customer_total,
          grossProfit: o.gross_profit,
          grossMarginPct: o.gross_margin_pct,
          markupPct: o.markup_pct,
        },
        lines: byOption.get(o.id) ?? [],
      });
      result.set(o.proposal_id, list);
    }
    return result;
  }

  /** Replaces every option (and so every line) of a version that is still a draft. */
  async replaceOptions(proposalId: string, branchId: string, options: NewOption[], db: Db): Promise<void> {
    await db('proposal_options').where({ proposal_id: proposalId }).delete();
    for (const [i, o] of options.entries()) {
      const t = o.totals;
      const [row] = await db('proposal_options')
        .insert({
          proposal_id: proposalId,
          branch_id: branchId,
          position: i + 1,
          title: o.title,
          description: o.description,
          discount_kind: o.discountKind,
          discount_value: o.discountValue,
          cost_total: t.costTotal,
          list_total: t.listTotal,
          discount_total: t.discountTotal,
          discount_pct: t.discountPct,
          net_total: t.netTotal,
          materials_cost_total: t.materialsCostTotal,
          tax_total: t.taxTotal,
          customer_total: t.customerTotal,
          gross_profit: t.grossProfit,
          gross_margin_pct: t.grossMarginPct,
          markup_pct: t.markupPct,
        })
        .returning('id');
      if (o.lines.length === 0) continue;
      await db('proposal_lines').insert(
        o.lines.map((l, j) => ({
          option_id: row.id,
          branch_id: branchId,
          position: j + 1,
          price_book_item_id: l.priceBookItemId,
          code: l.code,
          description: l.description,
          category: l.category,
          unit: l.unit,
          quantity: l.quantity,
          unit_cost: l.unitCost,
          unit_price: l.unitPrice,
          quantity_source: l.quantitySource,
        })),
      );
    }
  }

  // ---- approval requests ----------------------------------------------------------------------

  private approvalsQuery(db: Db) {
    return db('approval_requests as a')
      .join('proposals as p', 'p.id', 'a.proposal_id')
      .join('leads as l', 'l.id', 'a.lead_id')
      .join('branches as b', 'b.id', 'a.branch_id')
      .join('users as r', 'r.id', 'a.requested_by')
      .leftJoin('users as d', 'd.id', 'a.decided_by')
      .select(
        'a.*',
        'p.version as proposal_version',
        'p.status as proposal_status',
        'p.salesperson_id',
        'l.homeowner_name',
        'b.name as branch_name',
        'r.name as requested_by_name',
        'r.email as requested_by_email',
        'd.name as decided_by_name',
      );
  }

  async insertApproval(
    a: {
      proposalId: string;
      leadId: string;
      branchId: string;
      requestedBy: string;
      approver: 'branch_manager' | 'owner';
      reasons: ApprovalReason[];
      figures: ApprovalFigures;
    },
    db: Db,
  ): Promise<string> {
    const [row] = await db('approval_requests')
      .insert({
        proposal_id: a.proposalId,
        lead_id: a.leadId,
        branch_id: a.branchId,
        requested_by: a.requestedBy,
        approver: a.approver,
        reasons: a.reasons,
        figures: JSON.stringify(a.figures),
        status: 'pending',
      })
      .returning('id');
    return row.id;
  }

  async findApproval(id: string, db: Db = this.knex, forUpdate = false): Promise<ApprovalRecord | undefined> {
    const q = this.approvalsQuery(db).where('a.id', id).first();
    if (forUpdate) q.forUpdate('a');
    const row = await q;
    return row ? toApproval(row) : undefined;
  }

  async latestApproval(proposalId: string, db: Db = this.knex): Promise<ApprovalRecord | undefined> {
    const row = await this.approvalsQuery(db)
      .where('a.proposal_id', proposalId)
      .orderBy('a.created_at', 'desc')
      .orderBy('a.id')
      .first();
    return row ? toApproval(row) : undefined;
  }

  /** `scope` null: every branch. Pending requests oldest first (a queue); decided ones newest first. */
  async listApprovals(
    scope: string[] | null,
    status: ApprovalRequestStatus,
    db: Db = this.knex,
  ): Promise<ApprovalRecord[]> {
    const q = this.approvalsQuery(db)
      .where('a.status', status)
      .orderBy('a.created_at', status === 'pending' ? 'asc' : 'desc')
      .orderBy('a.id')
      .limit(500);
    if (scope) q.whereIn('a.branch_id', scope);
    return (await q).map(toApproval);
  }

  async decideApproval(
    id: string,
    d: { status: 'approved' | 'refused'; decidedBy: string; note: string | null },
    db: Db,
  ): Promise<void> {
    await db('approval_requests')
      .where({ id })
      .update({ status: d.status, decided_by: d.decidedBy, decided_at: db.fn.now(), decision_note: d.note });
  }
}
