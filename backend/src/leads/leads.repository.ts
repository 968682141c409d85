import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  addressKey,
  emailKey,
  NO_FACTS,
  phoneKey,
  toMoneyString,
  wholeDaysBetween,
  type DuplicateMatch,
  type DuplicateReason,
  type JobStatus,
  type LeadActivity,
  type LeadFacts,
  type LeadInput,
  type LeadStage,
  type LeadSummary,
  type LeadTransfer,
  type StageTotal,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** Which leads a person may list: every branch or some, and for a salesperson only their own. */
export interface LeadScope {
  branchIds: string[] | null;
  salespersonId: string | null;
}

export interface PipelineFilter {
  branchId?: string;
  stages?: LeadStage[];
  salespersonId?: string;
  minAgeDays?: number;
  maxAgeDays?: number;
  minValue?: string;
  maxValue?: string;
  q?: string;
  approvalPending?: boolean;
  sort: 'age' | 'daysInStage' | 'value' | 'homeowner' | 'stage';
  order: 'asc' | 'desc';
  limit: number;
  offset: number;
}

export interface LeadRow extends LeadSummary {
  phonePrimary: string | null;
  phoneSecondary: string | null;
  email: string | null;
  preferredContact: LeadInput['preferredContact'];
  state: string;
  postalCode: string;
  yearBuilt: number | null;
  foundationType: LeadInput['foundationType'];
  source: string | null;
  notes: string | null;
  lostReason: string | null;
  /** The branch's IANA time zone. */
  timezone: string;
}

/** The job of a lead's latest contract, with what the Job permission rule reads. */
export interface LeadJobRow {
  id: string;
  number: string;
  status: JobStatus;
  branchId: string;
  salespersonId: string | null;
  crewLeadId: string | null;
}

const SUMMARY_COLUMNS = [
  'l.id',
  'l.branch_id as branchId',
  'b.code as branchCode',
  'l.homeowner_name as homeownerName',
  'l.address_line1 as addressLine1',
  'l.city',
  'l.stage',
  'l.salesperson_id as salespersonId',
  'u.name as salespersonName',
];

const SORTS: Record<PipelineFilter['sort'], string> = {
  age: 'l.created_at',
  daysInStage: 'l.stage_changed_at',
  value: 'l.value',
  homeowner: 'l.homeowner_name',
  stage: 'l.stage',
};

const DIRECTION = { asc: 'asc', desc: 'desc' } as const;

/** An instant as Date#toISOString writes it (UTC, milliseconds), written by PostgreSQL. */
const ISO_INSTANT = (column: string) =>
  `to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/** A timestamp as pg returns it (a Date) or already as an ISO string (see ISO_INSTANT). */
const isoInstant = (v: unknown) => (v instanceof Date ? v.toISOString() : (v as string));

function toSummary(r: Record<string, unknown>, now: Date): LeadSummary {
  const stageChangedAt = isoInstant(r.stageChangedAt);
  const createdAt = isoInstant(r.createdAt);
  const lastDay = r.lastDayToCancel as string | null;
  return {
    id: r.id as string,
    branchId: r.branchId as string,
    branchCode: r.branchCode as string,
    homeownerName: r.homeownerName as string,
    addressLine1: r.addressLine1 as string,
    city: r.city as string,
    stage: r.stage as LeadStage,
    stageChangedAt,
    createdAt,
    daysInStage: wholeDaysBetween(stageChangedAt, now),
    ageDays: wholeDaysBetween(createdAt, now),
    value: r.value as string,
    salespersonId: (r.salespersonId as string | null) ?? null,
    salespersonName: (r.salespersonName as string | null) ?? null,
    approvalPending: Boolean(r.approvalPending),
    lastDayToCancel: lastDay,
  };
}

type TotalsRow = { stage: LeadStage; count: number; value: string | null };

/** Only branch, salesperson and stage filters: the stored per-stage totals answer exactly. */
const isSimple = (f: PipelineFilter) =>
  f.minAgeDays === undefined &&
  f.maxAgeDays === undefined &&
  !f.minValue &&
  !f.maxValue &&
  !f.q &&
  f.approvalPending === undefined;

function tally(rows: TotalsRow[], f: PipelineFilter): { total: number; stages: StageTotal[] } {
  const stages = rows
    .map((s): StageTotal => ({ stage: s.stage, count: s.count, value: toMoneyString(s.value ?? '0') }))
    .filter((s) => s.count > 0);
  const total = stages
    .filter((s) => !f.stages?.length || f.stages.includes(s.stage))
    .reduce((n, s) => n + s.count, 0);
  return { total, stages };
}

/** Whether the lead waits on a manager's approval. */
const APPROVAL_PENDING_SQL = `exists (select 1 from approval_requests ar where ar.lead_id = l.id and ar.status = 'pending')`;

/** The cancellation clock, only while it runs (the window closes at the end of that day). */
const LAST_DAY_TO_CANCEL_SQL = `(select to_char(c.last_day_to_cancel, 'YYYY-MM-DD') from contracts c
  where c.lead_id = l.id and c.cancelled_at is null and c.last_day_to_cancel >= current_date
  order by c.signed_at desc limit 1)`;

/** SUMMARY_COLUMNS as SQL text (`l.branch_id as "branchId"`), with money as text and instants as ISO strings. */
const SUMMARY_JSON_SQL = [
  ...SUMMARY_COLUMNS.map((c) => c.replace(/ as (\w+)$/, ' as "$1"')),
  'l.value::text as value',
  `${ISO_INSTANT('l.stage_changed_at')} as "stageChangedAt"`,
  `${ISO_INSTANT('l.created_at')} as "createdAt"`,
  `${APPROVAL_PENDING_SQL} as "approvalPending"`,
  `${LAST_DAY_TO_CANCEL_SQL} as "lastDayToCancel"`,
].join(', ');

/** SQL text with `?` placeholders and the values for them, in order. */
interface Sql {
  sql: string;
  bindings: Knex.Value[];
}

/** Conditions joined by `and`, each with its values in order; `in_` with an empty list matches nothing. */
function conditions(first: string[] = []) {
  const where = [...first];
  const bindings: Knex.Value[] = [];
  const add = (sql: string, ...values: Knex.Value[]) => {
    where.push(sql);
    bindings.push(...values);
  };
  const in_ = (column: string, values: readonly Knex.Value[]) =>
    add(values.length ? `${column} in (${values.map(() => '?').join(', ')})` : 'false', ...values);
  const done = (): Sql => ({ sql: where.length ? where.join(' and ') : 'true', bindings });
  return { add, in_, done };
}

/** The leads a person may see (scope) that match the filter; `withStage` false leaves the stage filter out (totals). */
function pipelineConditions(scope: LeadScope, f: Partial<PipelineFilter>, withStage: boolean): Sql {
  const { add, in_, done } = conditions();
  if (scope.branchIds) in_('l.branch_id', scope.branchIds);
  if (scope.salespersonId) add('l.salesperson_id = ?', scope.salespersonId);
  if (f.branchId) add('l.branch_id = ?', f.branchId);
  if (withStage && f.stages?.length) in_('l.stage', f.stages);
  if (f.salespersonId) add('l.salesperson_id = ?', f.salespersonId);
  if (f.minAgeDays !== undefined) add('l.created_at <= now() - make_interval(days => ?)', f.minAgeDays);
  if (f.maxAgeDays !== undefined) add('l.created_at > now() - make_interval(days => ?)', f.maxAgeDays + 1);
  if (f.minValue) add('l.value >= ?', f.minValue);
  if (f.maxValue) add('l.value <= ?', f.maxValue);
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    const digits = phoneKey(f.q);
    // search_text is lower(name, address, city, e-mail): one LIKE on it is answered by its trigram
    // index (a bitmap scan), where an ILIKE per column read every lead (~2 s at concurrency 16).
    if (digits.length >= 4) add('(l.search_text like lower(?) or l.phone_key like ?)', like, `%${digits}%`);
    else add('l.search_text like lower(?)', like);
  }
  if (f.approvalPending !== undefined)
    add(f.approvalPending ? APPROVAL_PENDING_SQL : `not ${APPROVAL_PENDING_SQL}`);
  return done();
}

/** Per-stage counts and value for branch, salesperson and stage filters, from lead_stage_totals. */
function storedTotals(scope: LeadScope, f: PipelineFilter): Sql {
  const { add, in_, done } = conditions(['t.lead_count > 0']);
  if (scope.branchIds) in_('t.branch_id', scope.branchIds);
  if (f.branchId) add('t.branch_id = ?', f.branchId);
  const sp = scope.salespersonId ?? f.salespersonId;
  if (sp) add('t.salesperson_key = ?', sp);
  if (scope.salespersonId && f.salespersonId && f.salespersonId !== scope.salespersonId) add('false');
  const where = done();
  return {
    sql: `select t.stage, sum(t.lead_count)::integer as count, sum(t.value_total)::text as value
          from lead_stage_totals t where ${where.sql} group by t.stage`,
    bindings: where.bindings,
  };
}

@Injectable()
export class LeadsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  /** The summary columns, for rows pg decodes itself (money as a numeric string, instants as Dates). */
  private summaryQuery(db: Db) {
    return db('leads as l')
      .join('branches as b', 'b.id', 'l.branch_id')
      .leftJoin('users as u', 'u.id', 'l.salesperson_id')
      .select(
        ...SUMMARY_COLUMNS,
        'l.value',
        'l.stage_changed_at as stageChangedAt',
        'l.created_at as createdAt',
        db.raw(`${APPROVAL_PENDING_SQL} as "approvalPending"`),
        db.raw(`${LAST_DAY_TO_CANCEL_SQL} as "lastDayToCancel"`),
      );
  }

  /**
   * One page of the pipeline with its per-stage totals. Written as SQL text rather than built with knex:
   * this is the most requested list, and building the query cost about as much time in the server as the
   * database took to answer it (pipeline benchmark, issue #3). The conditions come from one place
   * (pipelineConditions) for the page and for the totals.
   */
  async pipeline(scope: LeadScope, f: PipelineFilter, db: Db = this.knex) {
    const now = new Date();
    const sort = SORTS[f.sort];
    const dir = DIRECTION[f.order];
    const where = pipelineConditions(scope, f, true);
    // The page's ids first (an index walk in the sort order), then the display columns and the per-row
    // look-ups for those rows only; computing them before the sort would touch every matching lead.
    // The page comes back as one JSON value (one row to decode, not 25 × 14 fields); the value column is
    // cast to text first, so money stays a string, and instants arrive in the form the API sends.
    const items = `(select coalesce(json_agg(r order by r.n), '[]') from (
        with page as (
          select l.id, ${sort} as sort_key from leads l where ${where.sql}
          order by ${sort} ${dir}, l.id ${dir} limit ? offset ?)
        select ${SUMMARY_JSON_SQL}, row_number() over (order by p.sort_key ${dir}, l.id ${dir}) as n
        from page p join leads l on l.id = p.id join branches b on b.id = l.branch_id
        left join users u on u.id = l.salesperson_id) r)`;
    const itemBindings = [...where.bindings, f.limit, f.offset];
    let result: { items: Record<string, unknown>[]; stages: TotalsRow[] };
    if (isSimple(f)) {
      // Totals kept by the trigger cost next to nothing: they ride in the same statement, one round trip
      // to the database per request.
      const totals = storedTotals(scope, f);
      result = (
        await db.raw(
          `select ${items} as items, (select coalesce(json_agg(t), '[]') from (${totals.sql}) t) as stages`,
          [...itemBindings, ...totals.bindings],
        )
      ).rows[0];
    } else {
      // Totals that aggregate the leads themselves (search, age or value filters) can be slow, and run
      // beside the page instead.
      const all = pipelineConditions(scope, f, false);
      const [page, totals] = await Promise.all([
        db.raw(`select ${items} as items`, itemBindings),
        db.raw(
          `select l.stage, count(*)::integer as count, sum(l.value)::text as value
           from leads l where ${all.sql} group by l.stage`,
          all.bindings,
        ),
      ]);
      result = { items: page.rows[0].items, stages: totals.rows };
    }
    return { items: result.items.map((r) => toSummary(r, now)), ...tally(result.stages, f) };
  }

  async findById(id: string, db: Db = this.knex): Promise<LeadRow | undefined> {
    const r = await this.summaryQuery(db)
      .select(
        'l.phone_primary as phonePrimary',
        'l.phone_secondary as phoneSecondary',
        'l.email',
        'l.preferred_contact as preferredContact',
        'l.state',
        'l.postal_code as postalCode',
        'l.year_built as yearBuilt',
        'l.foundation_type as foundationType',
        'l.source',
        'l.notes',
        'l.lost_reason as lostReason',
        'b.timezone',
      )
      .where('l.id', id)
      .first();
    if (!r) return undefined;
    const summary = toSummary(r, new Date());
    return {
      ...summary,
      phonePrimary: r.phonePrimary,
      phoneSecondary: r.phoneSecondary,
      email: r.email,
      preferredContact: r.preferredContact,
      state: r.state,
      postalCode: r.postalCode,
      yearBuilt: r.yearBuilt,
      foundationType: r.foundationType,
      source: r.source,
      notes: r.notes,
      lostReason: r.lostReason,
      timezone: r.timezone,
    };
  }

  /** The job of the lead's latest contract (a lead has one line of contracts; the newest is the live one). */
  async jobOf(leadId: string, db: Db = this.knex): Promise<LeadJobRow | undefined> {
    return db('jobs as j')
      .join('contracts as c', 'c.id', 'j.contract_id')
      .where('j.lead_id', leadId)
      .orderBy('c.signed_at', 'desc')
      .orderBy('j.created_at', 'desc')
      .first(
        'j.id',
        'j.number',
        'j.status',
        'j.branch_id as branchId',
        'j.salesperson_id as salespersonId',
        'j.crew_lead_id as crewLeadId',
      );
  }

  /** The lead's stage, its row locked for the rest of the transaction (automatic moves). */
  async lockStage(id: string, db: Db): Promise<{ stage: LeadStage; branchId: string } | undefined> {
    return db('leads').where({ id }).forUpdate().first('stage', 'branch_id as branchId');
  }

  async insert(
    input: LeadInput & { salespersonId: string | null; createdBy: string },
    db: Db,
  ): Promise<string> {
    const [row] = await db('leads')
      .insert({
        branch_id: input.branchId,
        salesperson_id: input.salespersonId,
        homeowner_name: input.homeownerName,
        phone_primary: input.phonePrimary ?? null,
        phone_secondary: input.phoneSecondary ?? null,
        email: input.email ?? null,
        preferred_contact: input.preferredContact,
        address_line1: input.addressLine1,
        city: input.city,
        state: input.state,
        postal_code: input.postalCode,
        year_built: input.yearBuilt ?? null,
        foundation_type: input.foundationType ?? null,
        source: input.source ?? null,
        notes: input.notes ?? null,
        created_by: input.createdBy,
      })
      .returning('id');
    return row.id;
  }

  async update(id: string, patch: Partial<LeadInput>, db: Db): Promise<void> {
    const columns: Record<string, keyof LeadInput> = {
      salesperson_id: 'salespersonId',
      homeowner_name: 'homeownerName',
      phone_primary: 'phonePrimary',
      phone_secondary: 'phoneSecondary',
      email: 'email',
      preferred_contact: 'preferredContact',
      address_line1: 'addressLine1',
      city: 'city',
      state: 'state',
      postal_code: 'postalCode',
      year_built: 'yearBuilt',
      foundation_type: 'foundationType',
      source: 'source',
      notes: 'notes',
    };
    const row: Record<string, unknown> = { updated_at: db.fn.now() };
    for (const [col, key] of Object.entries(columns)) if (patch[key] !== undefined) row[col] = patch[key];
    await db('leads').where({ id }).update(row);
  }

  async setStage(id: string, stage: LeadStage, lostReason: string | null, db: Db): Promise<void> {
    await db('leads')
      .where({ id })
      .update({ stage, lost_reason: lostReason, stage_changed_at: db.fn.now(), updated_at: db.fn.now() });
  }

  async setBranch(id: string, branchId: string, db: Db): Promise<void> {
    await db('leads')
      .where({ id })
      .update({ branch_id: branchId, salesperson_id: null, updated_at: db.fn.now() });
  }

  async moveRecordsToBranch(leadId: string, branchId: string, db: Db): Promise<void> {
    const inspections = db('inspections').select('id').where({ lead_id: leadId });
    const proposals = db('proposals').select('id').where({ lead_id: leadId });
    const options = db('proposal_options').select('id').whereIn('proposal_id', proposals.clone());
    await db('inspections').where({ lead_id: leadId }).update({ branch_id: branchId });
    await db('survey_points').whereIn('inspection_id', inspections.clone()).update({ branch_id: branchId });
    await db('inspection_photos')
      .whereIn('inspection_id', inspections.clone())
      .update({ branch_id: branchId });
    await db('proposal_lines').whereIn('option_id', options.clone()).update({ branch_id: branchId });
    await db('proposal_options').whereIn('proposal_id', proposals.clone()).update({ branch_id: branchId });
    await db('proposals').where({ lead_id: leadId }).update({ branch_id: branchId });
    await db('approval_requests').where({ lead_id: leadId }).update({ branch_id: branchId });
    await db('signing_links').whereIn('proposal_id', proposals.clone()).update({ branch_id: branchId });
  }

  /** A reassigned lead's proposals follow it, so the new salesperson can see and finish them. */
  async reassignOpenProposals(leadId: string, salespersonId: string | null, db: Db): Promise<void> {
    await db('proposals').where({ lead_id: leadId }).update({ salesperson_id: salespersonId });
  }

  async addActivity(
    a: {
      leadId: string;
      branchId: string;
      kind: string;
      body?: string | null;
      data?: object;
      actorId: string | null;
    },
    db: Db,
  ): Promise<void> {
    await db('lead_activities').insert({
      lead_id: a.leadId,
      branch_id: a.branchId,
      kind: a.kind,
      body: a.body ?? null,
      data: JSON.stringify(a.data ?? {}),
      actor_id: a.actorId,
    });
  }

  async activities(leadId: string, db: Db = this.knex): Promise<LeadActivity[]> {
    const rows = await db('lead_activities as a')
      .join('branches as b', 'b.id', 'a.branch_id')
      .leftJoin('users as u', 'u.id', 'a.actor_id')
      .select(
        'a.id',
        'a.kind',
        'a.body',
        'a.data',
        'u.name as actorName',
        'b.code as branchCode',
        'a.created_at as createdAt',
      )
      .where('a.lead_id', leadId)
      .orderBy('a.created_at', 'desc')
      .orderBy('a.id');
    return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
  }

  async addTransfer(
    t: { leadId: string; from: string; to: string; note: string | null; by: string },
    db: Db,
  ) {
    await db('lead_transfers').insert({
      lead_id: t.leadId,
      from_branch_id: t.from,
      to_branch_id: t.to,
      note: t.note,
      transferred_by: t.by,
    });
  }

  async transfers(leadId: string, db: Db = this.knex): Promise<LeadTransfer[]> {
    const rows = await db('lead_transfers as t')
      .join('branches as f', 'f.id', 't.from_branch_id')
      .join('branches as o', 'o.id', 't.to_branch_id')
      .join('users as u', 'u.id', 't.transferred_by')
      .select(
        't.id',
        'f.code as fromBranchCode',
        'o.code as toBranchCode',
        't.note',
        'u.name as transferredByName',
        't.created_at as createdAt',
      )
      .where('t.lead_id', leadId)
      .orderBy('t.created_at');
    return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
  }

  /** Branches a lead has been transferred out of: their managers keep read access to its history. */
  async transferredFrom(leadId: string, db: Db = this.knex): Promise<string[]> {
    return (await db('lead_transfers').distinct('from_branch_id').where({ lead_id: leadId })).map(
      (r: { from_branch_id: string }) => r.from_branch_id,
    );
  }

  async transferredOut(branchIds: string[] | null, db: Db = this.knex) {
    const q = db('lead_transfers as t')
      .join('leads as l', 'l.id', 't.lead_id')
      .join('branches as f', 'f.id', 't.from_branch_id')
      .join('branches as o', 'o.id', 't.to_branch_id')
      .select(
        'l.id',
        'l.homeowner_name as homeownerName',
        'l.address_line1 as addressLine1',
        'l.city',
        'l.stage',
        'f.code as fromBranchCode',
        'o.code as toBranchCode',
        't.created_at as transferredAt',
      )
      .orderBy('t.created_at', 'desc')
      .limit(200);
    if (branchIds) q.whereIn('t.from_branch_id', branchIds);
    return (await q).map((r) => ({ ...r, transferredAt: r.transferredAt.toISOString() }));
  }

  async duplicates(
    keys: { address?: string; phone?: string; email?: string | null; excludeId?: string },
    db: Db = this.knex,
  ): Promise<(DuplicateMatch & { branchId: string; salespersonId: string | null })[]> {
    if (!keys.address && !keys.phone && !keys.email) return [];
    const q = db('leads as l')
      .join('branches as b', 'b.id', 'l.branch_id')
      .select(
        'l.id',
        'l.homeowner_name as homeownerName',
        'l.address_line1 as addressLine1',
        'l.city',
        'l.stage',
        'b.code as branchCode',
        'l.branch_id as branchId',
        'l.salesperson_id as salespersonId',
        'l.address_key',
        'l.phone_key',
        'l.email_key',
      )
      .where((w) => {
        if (keys.address) w.orWhere('l.address_key', keys.address);
        if (keys.phone) w.orWhere('l.phone_key', keys.phone);
        if (keys.email) w.orWhere('l.email_key', keys.email);
      })
      .orderBy('l.created_at', 'desc')
      .limit(20);
    if (keys.excludeId) q.whereNot('l.id', keys.excludeId);
    return (await q).map((r) => {
      const reasons: DuplicateReason[] = [];
      if (keys.address && r.address_key === keys.address) reasons.push('address');
      if (keys.phone && r.phone_key === keys.phone) reasons.push('phone');
      if (keys.email && r.email_key === keys.email) reasons.push('email');
      return {
        id: r.id,
        homeownerName: r.homeownerName,
        addressLine1: r.addressLine1,
        city: r.city,
        stage: r.stage,
        branchCode: r.branchCode,
        branchId: r.branchId,
        salespersonId: r.salespersonId,
        reasons,
      };
    });
  }

  /** What the stage rules need to know, read from the records of the later steps. */
  async facts(leadId: string, db: Db = this.knex): Promise<LeadFacts> {
    const r = await db
      .select(
        db.raw(
          `exists (select 1 from inspections where lead_id = ? and status in ('booked', 'completed')) as "booked"`,
          [leadId],
        ),
        db.raw(
          `exists (select 1 from inspections where lead_id = ? and status = 'completed') as "inspected"`,
          [leadId],
        ),
        db.raw(`exists (select 1 from proposals where lead_id = ? and sent_at is not null) as "sent"`, [
          leadId,
        ]),
        db.raw(`exists (select 1 from contracts where lead_id = ?) as "signed"`, [leadId]),
        db.raw(
          `exists (select 1 from contracts where lead_id = ? and cancelled_at is not null) as "cancelled"`,
          [leadId],
        ),
        // Issue #4: a live contract's deposit is in (a contract asking none counts as received); its job's
        // progress. A cancelled contract's job is cancelled and counts for nothing.
        db.raw(
          `exists (select 1 from contracts where lead_id = ? and cancelled_at is null
             and (deposit_received_at is not null or deposit_amount = 0)) as "deposit"`,
          [leadId],
        ),
        db.raw(
          `exists (select 1 from jobs where lead_id = ? and status in ('scheduled', 'in_progress', 'completed')) as "scheduled"`,
          [leadId],
        ),
        db.raw(
          `exists (select 1 from jobs where lead_id = ? and status in ('in_progress', 'completed')) as "started"`,
          [leadId],
        ),
        db.raw(`exists (select 1 from jobs where lead_id = ? and status = 'completed') as "completed"`, [
          leadId,
        ]),
        // Issue #5: a live contract whose job is completed and whose payments, less what went back, cover
        // its price. Summed and compared in numeric (never a JavaScript number). A refund still pending
        // counts as gone: the money is on its way back, and paid in full is the end of the line.
        db.raw(
          `exists (select 1 from contracts c
             where c.lead_id = ? and c.cancelled_at is null
               and exists (select 1 from jobs j where j.contract_id = c.id and j.status = 'completed')
               and coalesce((select sum(p.amount) from payments p where p.contract_id = c.id), 0)
                 - coalesce((select sum(r.amount) from refunds r
                               where r.contract_id = c.id and r.status <> 'failed'), 0)
                 >= c.price) as "paid"`,
          [leadId],
        ),
      )
      .first();
    return {
      ...NO_FACTS,
      hasBookedInspection: r.booked,
      hasCompletedInspection: r.inspected,
      hasSentProposal: r.sent,
      hasSignedContract: r.signed,
      contractCancelled: r.cancelled,
      depositReceived: r.deposit,
      jobScheduled: r.scheduled,
      jobStarted: r.started,
      jobCompleted: r.completed,
      paidInFull: r.paid,
    };
  }

  async isSalespersonOf(userId: string, branchId: string, db: Db = this.knex): Promise<boolean> {
    const row = await db('users as u')
      .join('user_branches as ub', 'ub.user_id', 'u.id')
      .where({ 'u.id': userId, 'ub.branch_id': branchId, 'u.active': true })
      .whereIn('u.role', ['salesperson', 'branch_manager', 'owner'])
      .first('u.id');
    return !!row;
  }
}

export const duplicateKeys = (i: {
  addressLine1?: string;
  postalCode?: string;
  phone?: string | null;
  email?: string | null;
}) => ({
  address: i.addressLine1 && i.postalCode ? addressKey(i.addressLine1, i.postalCode) : undefined,
  phone: i.phone && phoneKey(i.phone).length >= 7 ? phoneKey(i.phone) : undefined,
  email: emailKey(i.email),
});
