import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { AcknowledgedNotice, InspectionFindings, LeadStage, SurveyPoint } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

export interface SigningLead {
  id: string;
  branchId: string;
  salespersonId: string | null;
  homeownerName: string;
  phone: string | null;
  email: string | null;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
  stage: LeadStage;
  value: string;
}

export interface SigningBranchRecord {
  id: string;
  name: string;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
  phone: string | null;
  timezone: string;
}

export interface Person {
  id: string;
  name: string;
  email: string;
  active: boolean;
}

export interface InspectionForDocument {
  id: string;
  findings: Partial<InspectionFindings>;
  summary: string | null;
  completedAt: Date | null;
}

export interface SigningLinkRecord {
  id: string;
  proposalId: string;
  branchId: string;
  sentTo: string;
  expiresAt: Date;
  usedAt: Date | null;
  revokedAt: Date | null;
  depositAmount: string | null;
  createdAt: Date;
}

export interface ContractRecord {
  id: string;
  proposalId: string;
  proposalVersion: number;
  optionId: string;
  optionPosition: number;
  optionTitle: string;
  leadId: string;
  branchId: string;
  salespersonId: string | null;
  homeownerName: string;
  price: string;
  tax: string;
  depositAmount: string;
  signedByName: string;
  signedAt: Date;
  signedOn: string;
  signedIp: string | null;
  signedUserAgent: string | null;
  signedInPerson: boolean;
  signaturePng: Buffer;
  cancellationStatement: string;
  lastDayToCancel: string;
  notices: AcknowledgedNotice[];
  pdfKey: string | null;
  cancelledAt: Date | null;
  cancelledByKind: 'homeowner' | 'staff' | null;
  cancelledBy: { id: string; name: string } | null;
  cancellationNote: string | null;
  createdAt: Date;
}

export interface NewContract {
  proposalId: string;
  optionId: string;
  leadId: string;
  branchId: string;
  salespersonId: string | null;
  price: string;
  tax: string;
  depositAmount: string;
  signedByName: string;
  signedAt: Date;
  signedOn: string;
  signedIp: string | null;
  signedUserAgent: string | null;
  signedInPerson: boolean;
  signaturePng: Buffer;
  cancellationStatement: string;
  lastDayToCancel: string;
  notices: AcknowledgedNotice[];
}

type ActivityKind = 'email' | 'proposal' | 'contract' | 'cancellation' | 'note';

/** The only file of the signing feature that touches Knex. */
@Injectable()
export class SigningRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  // ---- the people and places a document names -------------------------------------------------

  async lead(id: string, db: Db = this.knex, forUpdate = false): Promise<SigningLead | undefined> {
    const q = db('leads')
      .select(
        'id',
        'branch_id as branchId',
        'salesperson_id as salespersonId',
        'homeowner_name as homeownerName',
        'phone_primary as phone',
        'email',
        'address_line1 as addressLine1',
        'city',
        'state',
        'postal_code as postalCode',
        'stage',
        'value',
      )
      .where({ id })
      .first();
    if (forUpdate) q.forUpdate();
    return q;
  }

  async branch(id: string, db: Db = this.knex): Promise<SigningBranchRecord> {
    return db('branches')
      .select(
        'id',
        'name',
        'address_line1 as addressLine1',
        'city',
        'state',
        'postal_code as postalCode',
        'phone',
        'timezone',
      )
      .where({ id })
      .first();
  }

  /** Anyone, active or not: a name on a record stays. */
  async person(id: string | null, db: Db = this.knex): Promise<Person | null> {
    if (!id) return null;
    return (await db('users').select('id', 'name', 'email', 'active').where({ id }).first()) ?? null;
  }

  /** The proposal's inspection, or else the lead's latest completed one. */
  async inspectionFor(
    inspectionId: string | null,
    leadId: string,
    db: Db = this.knex,
  ): Promise<InspectionForDocument | null> {
    const q = db('inspections').select('id', 'findings', 'summary', 'completed_at').first();
    if (inspectionId) q.where({ id: inspectionId, lead_id: leadId });
    else q.where({ lead_id: leadId, status: 'completed' }).orderBy('completed_at', 'desc');
    const row = await q;
    return row
      ? { id: row.id, findings: row.findings ?? {}, summary: row.summary, completedAt: row.completed_at }
      : null;
  }

  async surveyPoints(inspectionId: string, db: Db = this.knex): Promise<SurveyPoint[]> {
    const rows = await db('survey_points')
      .select('label', 'x_ft', 'y_ft', 'elevation_in')
      .where({ inspection_id: inspectionId, kind: 'inspection' })
      .orderBy('position');
    return rows.map((r) => ({ label: r.label, xFt: r.x_ft, yFt: r.y_ft, elevationIn: r.elevation_in }));
  }

  async setLeadValue(leadId: string, value: string, db: Db): Promise<void> {
    await db('leads').where({ id: leadId }).update({ value, updated_at: db.fn.now() });
  }

  async addActivity(
    a: {
      leadId: string;
      branchId: string;
      kind: ActivityKind;
      body: string;
      data: object;
      actorId: string | null;
    },
    db: Db,
  ): Promise<void> {
    await db('lead_activities').insert({
      lead_id: a.leadId,
      branch_id: a.branchId,
      kind: a.kind,
      body: a.body.slice(0, 4000),
      data: JSON.stringify(a.data),
      actor_id: a.actorId,
    });
  }

  // ---- signing links ----------------------------------------------------------------------------

  async insertLink(
    l: {
      proposalId: string;
      branchId: string;
      tokenHash: string;
      sentTo: string;
      expiresAt: Date;
      depositAmount: string | null;
      sentBy: string | null;
      usedAt?: Date;
    },
    db: Db,
  ): Promise<SigningLinkRecord> {
    const [row] = await db('signing_links')
      .insert({
        proposal_id: l.proposalId,
        branch_id: l.branchId,
        token_hash: l.tokenHash,
        sent_to: l.sentTo,
        expires_at: l.expiresAt,
        deposit_amount: l.depositAmount,
        sent_by: l.sentBy,
        used_at: l.usedAt ?? null,
      })
      .returning('*');
    return toLink(row);
  }

  async findLinkByHash(tokenHash: string, db: Db = this.knex, forUpdate = false) {
    const q = db('signing_links').where({ token_hash: tokenHash }).first();
    if (forUpdate) q.forUpdate();
    const row = await q;
    return row ? toLink(row) : undefined;
  }

  async latestLink(proposalId: string, db: Db = this.knex): Promise<SigningLinkRecord | undefined> {
    const row = await db('signing_links')
      .where({ proposal_id: proposalId })
      .orderBy('created_at', 'desc')
      .orderBy('id')
      .first();
    return row ? toLink(row) : undefined;
  }

  async countUnusedLinks(proposalId: string, db: Db): Promise<number> {
    const [{ n }] = await db('signing_links')
      .where({ proposal_id: proposalId })
      .whereNull('used_at')
      .whereNull('revoked_at')
      .count({ n: '*' });
    return Number(n);
  }

  async markLinkUsed(id: string, at: Date, db: Db): Promise<void> {
    await db('signing_links').where({ id }).update({ used_at: at });
  }

  // ---- contracts --------------------------------------------------------------------------------

  private contracts(db: Db) {
    return db('contracts as c')
      .join('proposals as p', 'p.id', 'c.proposal_id')
      .join('proposal_options as o', 'o.id', 'c.option_id')
      .join('leads as l', 'l.id', 'c.lead_id')
      .leftJoin('users as cu', 'cu.id', 'c.cancelled_by')
      .select(
        'c.*',
        db.raw(`to_char(c.signed_on, 'YYYY-MM-DD') as signed_on_text`),
        db.raw(`to_char(c.last_day_to_cancel, 'YYYY-MM-DD') as last_day_text`),
        'p.version as proposal_version',
        'o.position as option_position',
        'o.title as option_title',
        'l.homeowner_name',
        'cu.name as cancelled_by_name',
      );
  }

  async insertContract(c: NewContract, db: Db): Promise<string> {
    const [row] = await db('contracts')
      .insert({
        proposal_id: c.proposalId,
        option_id: c.optionId,
        lead_id: c.leadId,
        branch_id: c.branchId,
        salesperson_id: c.salespersonId,
        price: c.price,
        tax: c.tax,
        deposit_amount: c.depositAmount,
        signed_by_name: c.signedByName,
        signed_at: c.signedAt,
        signed_on: c.signedOn,
        signed_ip: c.signedIp,
        signed_user_agent: c.signedUserAgent,
        signed_in_person: c.signedInPerson,
        signature_png: c.signaturePng,
        cancellation_statement: c.cancellationStatement,
        last_day_to_cancel: c.lastDayToCancel,
        notices: JSON.stringify(c.notices),
      })
      .returning('id');
    return row.id;
  }

  async findContract(id: string, db: Db = this.knex, forUpdate = false): Promise<ContractRecord | undefined> {
    const q = this.contracts(db).where('c.id', id).first();
    if (forUpdate) q.forUpdate('c');
    const row = await q;
    return row ? toContract(row) : undefined;
  }

  async contractOfProposal(proposalId: string, db: Db = this.knex, forUpdate = false) {
    const q = this.contracts(db).where('c.proposal_id', proposalId).first();
    if (forUpdate) q.forUpdate('c');
    const row = await q;
    return row ? toContract(row) : undefined;
  }

  async latestContractOfLead(leadId: string, db: Db = this.knex): Promise<ContractRecord | undefined> {
    const row = await this.contracts(db)
      .where('c.lead_id', leadId)
      .orderBy('c.signed_at', 'desc')
      .orderBy('c.id')
      .first();
    return row ? toContract(row) : undefined;
  }

  async setPdfKey(id: string, key: string, db: Db = this.knex): Promise<void> {
    await db('contracts').where({ id }).update({ pdf_key: key });
  }

  async cancelContract(
    id: string,
    c: { at: Date; byKind: 'homeowner' | 'staff'; by: string | null; note: string | null },
    db: Db,
  ): Promise<void> {
    await db('contracts').where({ id }).update({
      cancelled_at: c.at,
      cancelled_by_kind: c.byKind,
      cancelled_by: c.by,
      cancellation_note: c.note,
    });
  }
}

function toLink(r: Record<string, unknown>): SigningLinkRecord {
  return {
    id: r.id as string,
    proposalId: r.proposal_id as string,
    branchId: r.branch_id as string,
    sentTo: r.sent_to as string,
    expiresAt: r.expires_at as Date,
    usedAt: (r.used_at as Date | null) ?? null,
    revokedAt: (r.revoked_at as Date | null) ?? null,
    depositAmount: (r.deposit_amount as string | null) ?? null,
    createdAt: r.created_at as Date,
  };
}

function toContract(r: Record<string, unknown>): ContractRecord {
  return {
    id: r.id as string,
    proposalId: r.proposal_id as string,
    proposalVersion: r.proposal_version as number,
    optionId: r.option_id as string,
    optionPosition: r.option_position as number,
    optionTitle: r.option_title as string,
    leadId: r.lead_id as string,
    branchId: r.branch_id as string,
    salespersonId: (r.salesperson_id as string | null) ?? null,
    homeownerName: r.homeowner_name as string,
    price: r.price as string,
    tax: r.tax as string,
    depositAmount: r.deposit_amount as string,
    signedByName: r.signed_by_name as string,
    signedAt: r.signed_at as Date,
    signedOn: r.signed_on_text as string,
    signedIp: (r.signed_ip as string | null) ?? null,
    signedUserAgent: (r.signed_user_agent as string | null) ?? null,
    signedInPerson: r.signed_in_person as boolean,
    signaturePng: r.signature_png as Buffer,
    cancellationStatement: r.cancellation_statement as string,
    lastDayToCancel: r.last_day_text as string,
    notices: (r.notices as AcknowledgedNotice[]) ?? [],
    pdfKey: (r.pdf_key as string | null) ?? null,
    cancelledAt: (r.cancelled_at as Date | null) ?? null,
    cancelledByKind: (r.cancelled_by_kind as 'homeowner' | 'staff' | null) ?? null,
    cancelledBy: r.cancelled_by
      ? { id: r.cancelled_by as string, name: (r.cancelled_by_name as string) ?? '' }
      : null,
    cancellationNote: (r.cancellation_note as string | null) ?? null,
    createdAt: r.created_at as Date,
  };
}
