import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import sharp from 'sharp';
import {
  addCalendarDays,
  approvalDecision,
  APPROVAL_REASON_LABELS,
  APPROVER_LABELS,
  assertBalanced,
  balancePaidByCard,
  balancePaidToBank,
  calendarWeekday,
  cardBrandName,
  cancellationDeadline,
  checkInstallEntry,
  combineDecisions,
  contractRules,
  defaultLocateExpiry,
  depositCapturedByCard,
  earliestDigDate,
  federalHolidaysOn,
  formatJobNumber,
  formatUsd,
  formatWarrantyNumber,
  FTC_429_BUYER_STATEMENT,
  jobCompleted,
  jobEndOn,
  jobNumberPrefix,
  labourEstimate,
  LEAD_STAGE_LABELS,
  money,
  MoneyDecimal,
  priceOption,
  processorPayout,
  todayInZone,
  toCents,
  toMoneyString,
  weekdayDate,
  zonedLocalToUtc,
  COMPLETION_CHECKLIST_ITEMS,
  type ApprovalFigures,
  type CheckedInstallEntry,
  type InspectionFindings,
  type LeadStage,
  type OptionTotals,
  type Posting,
  type StopReason,
} from '@loambook/common';
import {
  cancellationConfirmedMail,
  cancellationNoticeMail,
  contractSignedMail,
  proposalSentMail,
} from '../backend/src/signing/signing-mails';
import { jobScheduledMail } from '../backend/src/jobs/job-mails';
import scenario from './data/demo-scenario.json';

/**
 * The demo scenario (seeds/data/demo-scenario.json): about thirty invented homeowners across the three
 * demo branches, at every stage of the pipeline, so that `npm start` opens on a working company. Each lead
 * is written the way the app would have written it — the timeline rows with the services' own wording,
 * proposals priced with priceOption from the branch's price book (approval by approvalDecision), contracts
 * with their notices (contractRules), 16 CFR 429 deadline (cancellationDeadline) and the FTC buyer's
 * statement, jobs numbered and planned as JobsService.createForContract does, 811 tickets and Florida
 * permit dates, install logs checked by checkInstallEntry (helical capacity from torque), completions with a
 * re-survey, warranties — and the money posted to the ledger with common's posting builders, under the
 * idempotency keys the payments feature uses (`charge:<ch_…>`, `payout:<po_…>:<branch>`,
 * `job.completed:<job>`, `payment:<request key>`), with the matching payments and payout rows.
 *
 * Dates are relative to the day the seed runs (each branch's own calendar), so the calendar always shows
 * this week and next. Runs after 01–03. Running it again changes nothing: when the marker lead (the
 * scenario's first homeowner's e-mail) is already there, it does nothing. DEMO_SCENARIO=off skips it.
 *
 * Not seeded: photos (they live in the bucket), commissions and bank reconciliation (their own features),
 * payment links (their checkout sessions would be unknown to the card-processor fake).
 */

// ---- the data file's shapes ------------------------------------------------------------------------------

/** A moment on the branch's clock: a day relative to the branch's today, and a wall-clock time. */
interface At {
  day: number;
  at: string;
}

type SurveyRow = [string, number, number, number];

interface DemoOption {
  title: string;
  description?: string;
  discount?: { kind: 'percent' | 'amount'; value: string };
  lines: [string, string][];
}

interface DemoLead {
  key: string;
  branch: string;
  stage: LeadStage;
  salesperson: string;
  enteredBy?: string;
  homeowner: string;
  phone: string | null;
  email: string | null;
  preferredContact: 'phone' | 'text' | 'email';
  address: string;
  /** Defaults to the branch's own ZIP code (the homes are in the branch's town). */
  postalCode?: string;
  yearBuilt?: number;
  foundation?: 'slab' | 'crawlspace' | 'basement' | 'pier_and_beam';
  source?: string;
  notes?: string;
  entered: At;
  timeline?: { at: At; kind: 'call' | 'note' | 'visit' | 'email'; body: string; by?: string }[];
  inspection?: {
    booked: At;
    at: At;
    minutes?: number;
    /** The wall-clock time the inspection was completed, on its own day. */
    completed?: string;
    findings?: string;
    summary?: string;
    survey?: string;
    surveyScale?: string;
  };
  proposal?: {
    drafted: At;
    notes?: string;
    options: DemoOption[];
    submitted?: At;
    approval?: { decided?: At; by?: string; note?: string };
    sent?: At;
    depositPct?: string;
  };
  contract?: {
    option: number;
    signed: At;
    inPerson: boolean;
    depositPaid?: At & { card: 'visa' | 'mastercard' };
    cancelled?: At;
  };
  job?: {
    crew: string;
    permit?: {
      needed: boolean | null;
      appliedAfterDeposit?: number;
      issuedAfterApplied?: number;
      number?: string;
    };
    locate?: boolean;
    scheduled?: { at: At; startDay: number; durationDays: number };
    started?: string;
    log?: {
      location?: string;
      spacingFt?: string;
      depthFt?: string;
      points?: string[][];
      piles?: string[][];
      piers?: string[][];
      shaft?: '1.5in-square' | '1.75in-square' | '2.875in-round' | '3.5in-round';
      designLoadLb?: string;
      perDay: number[];
    };
    dayNotes?: { index: number; crewSize: number; hours: string; note: string }[];
    completed?: { at: string; checklistNo?: string[]; note?: string; resurveyScale: string };
    warranty?: {
      daysAfter: number;
      termYears: number;
      covers: string;
      exclusions?: string;
      transferable: boolean;
    };
  };
  balance?: {
    daysAfterCompletion: number;
    at: string;
    method: 'card' | 'cheque';
    card?: 'visa' | 'mastercard';
    reference?: string;
  };
  lost?: At & { reason: string };
}

interface Scenario {
  marker: string;
  findings: Record<string, InspectionFindings>;
  surveys: Record<string, SurveyRow[]>;
  leads: DemoLead[];
}

// ---- what the seed reads from the database ----------------------------------------------------------------

interface Item {
  id: string;
  code: string;
  description: string;
  category: string;
  unit: string;
  unitCost: string;
  unitPrice: string;
}

interface Branch {
  id: string;
  code: string;
  name: string;
  phone: string | null;
  city: string;
  state: string;
  postalCode: string;
  timezone: string;
  today: string;
  marginFloorPct: string;
  discountAuthority: { salesperson: string; branch_manager: string };
  tax: { treatment: 'materials_cost' | 'invoice'; ratePct: string };
  items: Map<string, Item>;
  accounts: Map<string, string>;
  managerId: string;
  crews: Map<string, { id: string; leadUserId: string; name: string }>;
}

interface Person {
  id: string;
  name: string;
  email: string;
  role: string;
}

/** A card charge the processor made, for the payouts at the end. */
interface Charge {
  branchId: string;
  paymentId: string;
  chargeId: string;
  balanceTransactionId: string;
  amount: string;
  fee: string;
  net: string;
  at: Date;
}

const DAY_MS = 86_400_000;
const SIGNING_LINK_TTL_DAYS = 14;
const CARDS = { visa: { brand: 'visa', last4: '4242' }, mastercard: { brand: 'mastercard', last4: '4444' } };
const trim = (v: string) => (v.includes('.') ? v.replace(/\.?0+$/, '') : v) || '0';

/** An id in the processor's style, stable for a given name: prefix, underscore, 24 base-62 characters. */
function processorId(prefix: string, name: string): string {
  const alphabet = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';
  const bytes = createHash('sha256').update(`demo-scenario:${name}`).digest();
  let s = '';
  for (let i = 0; i < 24; i++) s += alphabet[bytes[i]! % alphabet.length];
  return `${prefix}_${s}`;
}

/** The processor's fee on a card charge: 2.9% + 30¢, the percentage rounded half up (as backend/fakes/stripe charges). */
function cardFee(amount: string): string {
  return toCents(money(amount).times('0.029')).plus('0.30').toFixed(2);
}

/** A drawn signature: a dark stroke on a transparent canvas, its shape taken from the signer's name. */
async function signaturePng(name: string): Promise<Buffer> {
  const h = createHash('sha256').update(name).digest();
  let d = `M 24 ${70 + (h[0]! % 20)}`;
  let x = 24;
  for (let i = 1; i < 9; i++) {
    x += 30 + (h[i]! % 14);
    const up = 18 + (h[i + 8]! % 40);
    const down = 70 + (h[i + 16]! % 30);
    d += ` C ${x - 20} ${up}, ${x - 8} ${down + 10}, ${x} ${i % 2 ? up + 20 : down}`;
  }
  d += ` M 40 ${96 + (h[30]! % 8)} L ${Math.min(x, 380)} ${92 + (h[31]! % 8)}`;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="400" height="120"><path d="${d}" stroke="#14213d" stroke-width="3.5" fill="none" stroke-linecap="round"/></svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

export async function seed(knex: Knex, now: Date = new Date()): Promise<void> {
  if (process.env.DEMO_SCENARIO === 'off') return;
  const data = scenario as unknown as Scenario;
  await knex.transaction(async (trx) => {
    // Idempotent: the scenario goes in whole (one transaction) or not at all; its marker says it is there.
    await trx.raw('select pg_advisory_xact_lock(hashtext(?))', ['seed:demo-scenario']);
    const marker = await trx('leads').whereRaw('lower(email) = lower(?)', [data.marker]).first('id');
    if (marker) return;
    const w = new ScenarioWriter(trx, data, now);
    await w.load();
    for (const lead of data.leads) await w.lead(lead);
    await w.payouts();
  });
}

class ScenarioWriter {
  private branches = new Map<string, Branch>();
  private people = new Map<string, Person>();
  private charges: Charge[] = [];
  /** Live runs per crew, so that no crew is booked twice. */
  private crewRuns = new Map<string, { start: string; end: string }[]>();
  private bookkeeperId = '';
  private activityTimes = new Map<string, Set<number>>();

  constructor(
    private readonly trx: Knex.Transaction,
    private readonly data: Scenario,
    private readonly now: Date,
  ) {}

  async load(): Promise<void> {
    const t = this.trx;
    for (const u of await t('users').select('id', 'name', 'email', 'role')) {
      this.people.set(String(u.email).toLowerCase(), u as Person);
    }
    const bookkeeper = [...this.people.values()].find((p) => p.role === 'bookkeeper');
    if (!bookkeeper)
      throw new Error('demo scenario: the demo company has no bookkeeper (run 01-demo-company first)');
    this.bookkeeperId = bookkeeper.id;
    for (const b of await t('branches').select('*')) {
      const items = new Map<string, Item>();
      // Every item, deactivated ones too: the scenario's proposals copied them when they were offered.
      for (const i of await t('price_book_items').where({ branch_id: b.id })) {
        items.set(i.code, {
          id: i.id,
          code: i.code,
          description: i.description,
          category: i.category,
          unit: i.unit,
          unitCost: i.unit_cost,
          unitPrice: i.unit_price,
        });
      }
      const accounts = new Map<string, string>(
        (await t('ledger_accounts').where({ branch_id: b.id }).select('id', 'code')).map((a) => [
          a.code,
          a.id,
        ]),
      );
      const manager = await t('users as u')
        .join('user_branches as ub', 'ub.user_id', 'u.id')
        .where({ 'ub.branch_id': b.id, 'u.role': 'branch_manager' })
        .orderBy([{ column: 'u.active', order: 'desc' }, 'u.name'])
        .first('u.id');
      const crews = new Map<string, { id: string; leadUserId: string; name: string }>(
        (await t('crews').where({ branch_id: b.id }).select('id', 'name', 'lead_user_id')).map((c) => [
          c.name,
          { id: c.id, name: c.name, leadUserId: c.lead_user_id },
        ]),
      );
      this.branches.set(b.code, {
        id: b.id,
        code: b.code,
        name: b.name,
        phone: b.phone,
        city: b.city,
        state: b.state,
        postalCode: b.postal_code,
        timezone: b.timezone,
        today: todayInZone(b.timezone, this.now),
        marginFloorPct: trim(b.margin_floor_pct),
        discountAuthority: {
          salesperson: trim(b.discount_limit_salesperson_pct),
          branch_manager: trim(b.discount_limit_manager_pct),
        },
        tax: { treatment: b.sales_tax_treatment, ratePct: trim(b.sales_tax_rate_pct) },
        items,
        accounts,
        managerId: manager?.id ?? '',
        crews,
      });
    }
    // Jobs already on the crews (someone may have scheduled some before the scenario went in).
    for (const j of await t('jobs').whereIn('status', ['scheduled', 'in_progress']).whereNotNull('crew_id')) {
      const start = dateText(j.start_on);
      this.run(j.crew_id).push({ start, end: jobEndOn(start, j.duration_days) });
    }
  }

  // ---- helpers ---------------------------------------------------------------------------------------

  private manager(b: Branch): string {
    if (!b.managerId) throw new Error(`demo scenario: branch ${b.code} has no branch manager`);
    return b.managerId;
  }

  private person(email: string): Person {
    const p = this.people.get(email.toLowerCase());
    if (!p) throw new Error(`demo-scenario.json names an unknown person: ${email}`);
    return p;
  }

  private run(crewId: string) {
    let runs = this.crewRuns.get(crewId);
    if (!runs) this.crewRuns.set(crewId, (runs = []));
    return runs;
  }

  private day(b: Branch, offset: number): string {
    return addCalendarDays(b.today, offset);
  }

  /** The instant the branch's clocks show `time` on `date`. */
  private instantOn(b: Branch, date: string, time: string): Date {
    const r = zonedLocalToUtc(`${date}T${time}`, b.timezone);
    if (!r.ok) throw new Error(`demo scenario: ${date} ${time} in ${b.timezone}: ${r.message}`);
    return new Date(r.utc);
  }

  /** A moment of the scenario that has happened: it must be before the seed's own now. */
  private past(b: Branch, at: At, what: string): Date {
    const t = this.instantOn(b, this.day(b, at.day), at.at);
    if (t.getTime() >= this.now.getTime()) {
      throw new Error(`demo scenario: ${what} (${at.day} ${at.at}) would be in the future`);
    }
    return t;
  }

  /** A working day: not a Sunday, not a federal holiday; moved later (or earlier) until it is one. */
  private workday(date: string, direction: 1 | -1): string {
    let d = date;
    while (calendarWeekday(d) === 0 || federalHolidaysOn(d).length > 0) d = addCalendarDays(d, direction);
    return d;
  }

  /** The nearest day (later or earlier) that isWeekday. */
  private weekday(date: string, direction: 1 | -1): string {
    let d = date;
    while (!this.isWeekday(d)) d = addCalendarDays(d, direction);
    return d;
  }

  /** Monday to Friday, and not a federal holiday: a day the crews (and the permit office) work. */
  private isWeekday(date: string): boolean {
    const w = calendarWeekday(date);
    return w !== 0 && w !== 6 && federalHolidaysOn(date).length === 0;
  }

  private async activity(
    lead: { id: string; branchId: string },
    kind: string,
    body: string,
    data: object,
    actorId: string | null,
    at: Date,
  ): Promise<void> {
    // Rows of one moment (written in one transaction by the app) a second apart, in the order written,
    // so that the timeline reads in that order.
    const used = this.activityTimes.get(lead.id) ?? new Set<number>();
    this.activityTimes.set(lead.id, used);
    let ms = at.getTime();
    while (used.has(ms)) ms += 1000;
    used.add(ms);
    await this.trx('lead_activities').insert({
      lead_id: lead.id,
      branch_id: lead.branchId,
      kind,
      body: body.slice(0, 4000),
      data: JSON.stringify(data),
      actor_id: actorId,
      created_at: new Date(ms),
    });
  }

  /** A posting written as LedgerService.post writes it: the entry, then its lines, in this transaction. */
  private async post(
    b: Branch,
    posting: Posting,
    ctx: {
      key: string;
      source: { kind: 'event' | 'system'; ref: string } | { kind: 'user'; userId: string };
      effectiveOn: string;
      postedAt: Date;
      leadId?: string;
      contractId?: string;
      jobId?: string;
    },
  ): Promise<string> {
    assertBalanced(posting);
    const source =
      ctx.source.kind === 'user'
        ? { source_kind: 'user', source_ref: ctx.source.userId, posted_by: ctx.source.userId }
        : { source_kind: ctx.source.kind, source_ref: ctx.source.ref, posted_by: null };
    const [entry] = await this.trx('journal_entries')
      .insert({
        branch_id: b.id,
        reason_code: posting.reasonCode,
        ...source,
        idempotency_key: ctx.key,
        reverses_entry_id: null,
        memo: posting.memo?.slice(0, 500) || null,
        effective_on: ctx.effectiveOn,
        posted_at: ctx.postedAt,
        lead_id: ctx.leadId ?? null,
        contract_id: ctx.contractId ?? null,
        job_id: ctx.jobId ?? null,
      })
      .returning('id');
    await this.trx('journal_lines').insert(
      posting.lines.map((l, i) => {
        const accountId = b.accounts.get(l.account);
        if (!accountId) throw new Error(`demo scenario: branch ${b.code} has no account ${l.account}`);
        return {
          entry_id: entry.id,
          position: i + 1,
          account_id: accountId,
          branch_id: b.id,
          side: l.side,
          amount: money(l.amount).toFixed(2),
          salesperson_id: l.salespersonId ?? null,
        };
      }),
    );
    return entry.id;
  }

  // ---- one lead ------------------------------------------------------------------------------------------

  async lead(d: DemoLead): Promise<void> {
    const t = this.trx;
    const b = this.branches.get(d.branch);
    if (!b) throw new Error(`demo-scenario.json: ${d.key} names unknown branch ${d.branch}`);
    const seller = this.person(d.salesperson);
    const enteredBy = this.person(d.enteredBy ?? d.salesperson);
    const enteredAt = this.past(b, d.entered, `${d.key} entered`);

    const [row] = await t('leads')
      .insert({
        branch_id: b.id,
        salesperson_id: seller.id,
        homeowner_name: d.homeowner,
        phone_primary: d.phone,
        email: d.email,
        preferred_contact: d.preferredContact,
        address_line1: d.address,
        city: b.city,
        state: b.state,
        postal_code: d.postalCode ?? b.postalCode,
        year_built: d.yearBuilt ?? null,
        foundation_type: d.foundation ?? null,
        source: d.source ?? null,
        notes: d.notes ?? null,
        created_by: enteredBy.id,
        created_at: enteredAt,
        updated_at: enteredAt,
        stage_changed_at: enteredAt,
      })
      .returning('id');
    const lead = { id: row.id as string, branchId: b.id };
    let stage = 'new' as LeadStage;
    let stageAt = enteredAt;
    let value = '0.00';
    const move = async (to: LeadStage, actorId: string | null, at: Date, reason?: string) => {
      await this.activity(
        lead,
        'stage_change',
        `${LEAD_STAGE_LABELS[stage]} → ${LEAD_STAGE_LABELS[to]}${reason ? `: ${reason}` : ''}`,
        { from: stage, to },
        actorId,
        at,
      );
      stage = to;
      stageAt = at;
    };

    await this.activity(lead, 'note', 'Lead entered.', {}, enteredBy.id, enteredAt);
    for (const n of d.timeline ?? []) {
      const by = this.person(n.by ?? d.salesperson);
      await this.activity(lead, n.kind, n.body, {}, by.id, this.past(b, n.at, `${d.key} ${n.kind}`));
    }

    // ---- the inspection
    let inspectionId: string | null = null;
    let inspectionDoneAt: Date | null = null;
    if (d.inspection) {
      const i = d.inspection;
      const bookedAt = this.past(b, i.booked, `${d.key} inspection booked`);
      // Not on a Sunday or a federal holiday: a past visit moves earlier, unless that is before it was
      // booked (then later); a visit to come moves later.
      let onDate = this.workday(this.day(b, i.at.day), i.at.day < 0 ? -1 : 1);
      if (onDate <= todayInZone(b.timezone, bookedAt)) onDate = this.workday(this.day(b, i.at.day), 1);
      const scheduledAt = this.instantOn(b, onDate, i.at.at);
      const completedAt = i.completed ? this.instantOn(b, onDate, i.completed) : null;
      inspectionDoneAt = completedAt;
      if (completedAt && completedAt.getTime() >= this.now.getTime()) {
        throw new Error(`demo scenario: ${d.key}'s inspection would be completed in the future`);
      }
      if (bookedAt > scheduledAt)
        throw new Error(`demo scenario: ${d.key}'s inspection is booked after it took place`);
      if (completedAt && completedAt < scheduledAt)
        throw new Error(`demo scenario: ${d.key} inspection completed before it began`);
      const findings = i.findings ? this.data.findings[i.findings] : undefined;
      if (i.findings && !findings)
        throw new Error(`demo-scenario.json: ${d.key} names unknown findings ${i.findings}`);
      const [ins] = await t('inspections')
        .insert({
          lead_id: lead.id,
          branch_id: b.id,
          inspector_id: seller.id,
          scheduled_at: scheduledAt,
          duration_minutes: i.minutes ?? 90,
          status: completedAt ? 'completed' : 'booked',
          findings: JSON.stringify(completedAt ? (findings ?? {}) : {}),
          summary: completedAt ? (i.summary ?? null) : null,
          completed_at: completedAt,
          created_at: bookedAt,
          updated_at: completedAt ?? bookedAt,
        })
        .returning('id');
      inspectionId = ins.id;
      const local = `${onDate} ${i.at.at}`;
      await this.activity(
        lead,
        'inspection',
        `Inspection booked for ${local} (${b.timezone})`,
        {
          action: 'booked',
          inspectionId,
          scheduledAt: scheduledAt.toISOString(),
          scheduledLocal: `${onDate}T${i.at.at}`,
        },
        seller.id,
        bookedAt,
      );
      await move('inspection_booked', seller.id, bookedAt);
      if (completedAt) {
        if (i.survey) {
          const rows = this.data.surveys[i.survey];
          if (!rows) throw new Error(`demo-scenario.json: ${d.key} names unknown survey ${i.survey}`);
          await t('survey_points').insert(
            scaled(rows, i.surveyScale ?? '1').map((p, position) => ({
              inspection_id: inspectionId,
              branch_id: b.id,
              kind: 'inspection',
              position,
              label: p.label,
              x_ft: p.xFt,
              y_ft: p.yFt,
              elevation_in: p.elevationIn,
              is_reference: position === 0,
            })),
          );
        }
        await this.activity(
          lead,
          'inspection',
          'Inspection completed',
          { action: 'completed', inspectionId },
          seller.id,
          completedAt,
        );
        await move('inspected', seller.id, completedAt);
      }
    }

    // ---- the proposal
    let proposal: {
      id: string;
      options: { id: string; position: number; title: string; totals: OptionTotals; lines: PlanLine[] }[];
    } | null = null;
    let link: { id: string; deposit: string | null; sentAt: Date } | null = null;
    if (d.proposal) {
      const p = d.proposal;
      const draftedAt = this.past(b, p.drafted, `${d.key} proposal drafted`);
      if (inspectionDoneAt && draftedAt < inspectionDoneAt) {
        throw new Error(`demo scenario: ${d.key}'s proposal is drafted before the inspection was completed`);
      }
      const [pr] = await t('proposals')
        .insert({
          lead_id: lead.id,
          branch_id: b.id,
          inspection_id: inspectionId,
          version: 1,
          previous_id: null,
          status: 'draft',
          salesperson_id: seller.id,
          notes: p.notes ?? null,
          created_by: seller.id,
          tax_treatment: b.tax.treatment,
          tax_rate_pct: b.tax.ratePct,
          created_at: draftedAt,
          updated_at: draftedAt,
        })
        .returning('id');
      const options = [];
      for (const [i, o] of p.options.entries()) {
        const lines = o.lines.map(([code, quantity]) => {
          const item = b.items.get(code);
          if (!item)
            throw new Error(`demo-scenario.json: ${d.key} names ${code}, not in ${b.code}'s price book`);
          return { ...item, quantity };
        });
        const discount = o.discount ?? { kind: 'none' as const, value: '0' };
        const totals = priceOption({ lines, discount, tax: b.tax });
        const [opt] = await t('proposal_options')
          .insert({
            proposal_id: pr.id,
            branch_id: b.id,
            position: i + 1,
            title: o.title,
            description: o.description ?? null,
            discount_kind: discount.kind,
            discount_value: toMoneyString(discount.value),
            cost_total: totals.costTotal,
            list_total: totals.listTotal,
            discount_total: totals.discountTotal,
            discount_pct: totals.discountPct,
            net_total: totals.netTotal,
            materials_cost_total: totals.materialsCostTotal,
            tax_total: totals.taxTotal,
            customer_total: totals.customerTotal,
            gross_profit: totals.grossProfit,
            gross_margin_pct: totals.grossMarginPct,
            markup_pct: totals.markupPct,
          })
          .returning('id');
        await t('proposal_lines').insert(
          lines.map((l, j) => ({
            option_id: opt.id,
            branch_id: b.id,
            position: j + 1,
            price_book_item_id: l.id,
            code: l.code,
            description: l.description,
            category: l.category,
            unit: l.unit,
            quantity: l.quantity,
            unit_cost: l.unitCost,
            unit_price: l.unitPrice,
            quantity_source: 'typed',
          })),
        );
        options.push({ id: opt.id as string, position: i + 1, title: o.title, totals, lines });
      }
      proposal = { id: pr.id, options };
      await this.activity(
        lead,
        'proposal',
        `Proposal version 1 drafted: ${options.map((o) => o.title).join('; ')}.`,
        { event: 'created', proposalId: pr.id, version: 1 },
        seller.id,
        draftedAt,
      );

      let status = 'draft';
      let updatedAt = draftedAt;
      // Submitted when given, else (a proposal that goes out) a quarter of an hour after drafting.
      const submittedAt = p.submitted
        ? this.past(b, p.submitted, `${d.key} proposal submitted`)
        : p.sent || d.contract
          ? new Date(draftedAt.getTime() + 15 * 60_000)
          : null;
      if (submittedAt) {
        // ProposalsService.submit: each option judged against the floor and the submitter's authority.
        const perOption = options.map((o) => ({
          option: o,
          decision: approvalDecision({
            role: seller.role as 'salesperson',
            marginFloorPct: b.marginFloorPct,
            discountAuthority: b.discountAuthority,
            discountPct: o.totals.discountPct,
            grossMarginPct: o.totals.grossMarginPct,
          }),
        }));
        const overall = combineDecisions(perOption.map((x) => x.decision));
        const needs = overall.needsApproval && overall.approver !== 'none';
        if (needs !== Boolean(p.approval)) {
          throw new Error(
            `demo-scenario.json: ${d.key}'s proposal ${needs ? 'needs' : 'does not need'} approval (${overall.reasons.join(', ') || 'within authority'})`,
          );
        }
        if (!needs) {
          status = 'approved';
          updatedAt = submittedAt;
        } else {
          const figures: ApprovalFigures = {
            submitterRole: seller.role as 'salesperson',
            marginFloorPct: b.marginFloorPct,
            discountAuthority: b.discountAuthority,
            tax: b.tax,
            options: perOption.map(({ option: o, decision: dd }) => ({
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
              approver: dd.approver,
              reasons: dd.reasons,
            })),
          };
          const approver = overall.approver as 'branch_manager' | 'owner';
          const decided = p.approval?.decided
            ? this.past(b, p.approval.decided, `${d.key} approval decided`)
            : null;
          const decider = p.approval?.by ? this.person(p.approval.by) : null;
          if (decided && !decider) throw new Error(`demo-scenario.json: ${d.key}'s approval names nobody`);
          const [req] = await t('approval_requests')
            .insert({
              proposal_id: pr.id,
              lead_id: lead.id,
              branch_id: b.id,
              requested_by: seller.id,
              approver,
              reasons: overall.reasons,
              figures: JSON.stringify(figures),
              status: decided ? 'approved' : 'pending',
              decided_by: decided ? decider!.id : null,
              decided_at: decided,
              decision_note: decided ? (p.approval?.note ?? null) : null,
              created_at: submittedAt,
            })
            .returning('id');
          await this.activity(
            lead,
            'approval',
            `Approval of proposal version 1 requested from the ${APPROVER_LABELS[approver].toLowerCase()}: ` +
              `${overall.reasons.map((r) => APPROVAL_REASON_LABELS[r].toLowerCase()).join('; ')}.`,
            { event: 'requested', approvalRequestId: req.id, proposalId: pr.id, approver },
            seller.id,
            submittedAt,
          );
          status = 'pending_approval';
          updatedAt = submittedAt;
          if (decided) {
            const note = p.approval?.note ?? null;
            await this.activity(
              lead,
              'approval',
              `Proposal version 1 approved by ${decider!.name}${note ? `: ${note}` : '.'}`,
              { event: 'approved', approvalRequestId: req.id, proposalId: pr.id },
              decider!.id,
              decided,
            );
            status = 'approved';
            updatedAt = decided;
          }
        }
      }

      let sentAt: Date | null = null;
      if (p.sent) {
        if (status !== 'approved')
          throw new Error(`demo-scenario.json: ${d.key}'s proposal is sent without approval`);
        sentAt = this.past(b, p.sent, `${d.key} proposal sent`);
        if (!d.email) throw new Error(`demo-scenario.json: ${d.key} is sent a proposal but has no e-mail`);
        const deposit = depositFor(p.depositPct, options);
        const expiresAt = new Date(sentAt.getTime() + SIGNING_LINK_TTL_DAYS * DAY_MS);
        const [l] = await t('signing_links')
          .insert({
            proposal_id: pr.id,
            branch_id: b.id,
            token_hash: createHash('sha256').update(randomBytes(32).toString('base64url')).digest('hex'),
            sent_to: d.email,
            expires_at: expiresAt,
            deposit_amount: deposit,
            sent_by: seller.id,
            created_at: sentAt,
          })
          .returning('id');
        link = { id: l.id, deposit, sentAt };
        value = highest(options);
        const expiresOn = todayInZone(b.timezone, expiresAt);
        await this.activity(
          lead,
          'proposal',
          `Proposal version 1 sent to ${d.email}${deposit ? ` with a deposit of ${formatUsd(deposit)}` : ''}; ` +
            `the signing link works until ${weekdayDate(expiresOn)}.`,
          {
            event: 'sent',
            proposalId: pr.id,
            signingLinkId: l.id,
            sentTo: d.email,
            expiresAt: expiresAt.toISOString(),
            depositAmount: deposit,
            revokedLinks: 0,
          },
          seller.id,
          sentAt,
        );
        const mail = proposalSentMail({
          homeownerName: d.homeowner,
          branchName: b.name,
          branchPhone: b.phone,
          salespersonName: seller.name,
          version: 1,
          options: options.map((o) => ({
            position: o.position,
            title: o.title,
            customerTotal: o.totals.customerTotal,
          })),
          link: 'https://example.com/sign/…',
          expiresOn,
        });
        await this.activity(
          lead,
          'email',
          `E-mail "${mail.subject}" sent to ${d.email}, with the proposal PDF and the signing link.`,
          { event: 'proposal_mail', proposalId: pr.id, signingLinkId: l.id, to: d.email },
          seller.id,
          sentAt,
        );
        if (stage === 'inspected') await move('proposal_sent', seller.id, sentAt);
        status = 'sent';
        updatedAt = sentAt;
      }
      await t('proposals').where({ id: pr.id }).update({ status, sent_at: sentAt, updated_at: updatedAt });
    }

    // ---- the contract and its job
    if (d.contract && proposal) {
      await this.contract(
        d,
        b,
        lead,
        seller,
        proposal,
        link,
        inspectionId,
        () => stage,
        move,
        (v) => (value = v),
      );
    }

    if (d.lost) {
      const at = this.past(b, d.lost, `${d.key} lost`);
      await move('lost', seller.id, at, d.lost.reason);
    }
    if (stage !== d.stage)
      throw new Error(`demo scenario: ${d.key} ended at ${stage}, the data file says ${d.stage}`);
    await t('leads')
      .where({ id: lead.id })
      .update({
        stage,
        stage_changed_at: stageAt,
        lost_reason: stage === 'lost' ? d.lost!.reason : null,
        value,
        updated_at: stageAt,
      });
  }

  private async contract(
    d: DemoLead,
    b: Branch,
    lead: { id: string; branchId: string },
    seller: Person,
    proposal: {
      id: string;
      options: { id: string; position: number; title: string; totals: OptionTotals; lines: PlanLine[] }[];
    },
    link: { id: string; deposit: string | null; sentAt: Date } | null,
    inspectionId: string | null,
    stageNow: () => LeadStage,
    move: (to: LeadStage, actorId: string | null, at: Date, reason?: string) => Promise<void>,
    setValue: (v: string) => void,
  ): Promise<void> {
    const t = this.trx;
    const c = d.contract!;
    const option = proposal.options.find((o) => o.position === c.option);
    if (!option)
      throw new Error(`demo-scenario.json: ${d.key} signs option ${c.option}, which it does not have`);
    const signedAt = this.past(b, c.signed, `${d.key} signed`);
    const actorId = c.inPerson ? seller.id : null;

    // Signing in person without sending first: the version is presented (markSent) at the kitchen table.
    let deposit = link?.deposit ?? null;
    // The options gone through with the homeowner before the signature.
    const presentedAt = new Date(signedAt.getTime() - 25 * 60_000);
    if (!link) {
      if (!c.inPerson) throw new Error(`demo-scenario.json: ${d.key} signs online without a sent proposal`);
      deposit = depositFor(d.proposal!.depositPct, proposal.options);
      await t('proposals')
        .where({ id: proposal.id })
        .update({ status: 'sent', sent_at: presentedAt, updated_at: presentedAt });
      await this.activity(
        lead,
        'proposal',
        'Proposal version 1 presented to the homeowner in person.',
        { event: 'presented_in_person', proposalId: proposal.id },
        seller.id,
        presentedAt,
      );
    } else if (!c.inPerson && signedAt.getTime() > link.sentAt.getTime() + SIGNING_LINK_TTL_DAYS * DAY_MS) {
      throw new Error(`demo-scenario.json: ${d.key} signs after the signing link expired`);
    }

    // SigningService.createContract
    const price = option.totals.customerTotal;
    const depositAmount = deposit && money(deposit).greaterThan(0) ? toMoneyString(deposit) : '0.00';
    const rules = contractRules({ state: b.state, contractPrice: price, deposit: depositAmount });
    const signedOn = todayInZone(b.timezone, signedAt);
    const deadline = cancellationDeadline({ signedOn });
    const png = await signaturePng(d.homeowner);
    const evidence = c.inPerson
      ? {
          ip: '198.51.100.24',
          ua: 'Mozilla/5.0 (iPad; CPU OS 18_1 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/18.1 Mobile/15E148 Safari/604.1',
        }
      : {
          ip: '203.0.113.57',
          ua: 'Mozilla/5.0 (Linux; Android 15) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0 Mobile Safari/537.36',
        };
    const [contract] = await t('contracts')
      .insert({
        proposal_id: proposal.id,
        option_id: option.id,
        lead_id: lead.id,
        branch_id: b.id,
        salesperson_id: seller.id,
        price,
        tax: b.tax.treatment === 'invoice' ? option.totals.taxTotal : '0.00',
        deposit_amount: depositAmount,
        signed_by_name: d.homeowner,
        signed_at: signedAt,
        signed_on: signedOn,
        signed_ip: evidence.ip,
        signed_user_agent: evidence.ua,
        signed_in_person: c.inPerson,
        signature_png: png,
        cancellation_statement: FTC_429_BUYER_STATEMENT,
        last_day_to_cancel: deadline.lastDayToCancel,
        notices: JSON.stringify(
          rules.notices.map((n) => ({
            code: n.code,
            title: n.title,
            source: n.source,
            acknowledgedAt: signedAt.toISOString(),
          })),
        ),
        created_at: signedAt,
      })
      .returning('id');
    const contractId = contract.id as string;

    // JobsService.createForContract: the number, and the option's lines copied as the plan.
    const prefix = jobNumberPrefix(b.code, signedOn);
    await t.raw('select pg_advisory_xact_lock(hashtext(?))', [`job-number:${prefix}`]);
    const taken: { number: string }[] = await t('jobs')
      .where('number', 'like', `${prefix.replace(/[\\%_]/g, '\\$&')}%`)
      .select('number');
    const sequence =
      taken.reduce((max, r) => {
        const n = Number.parseInt(r.number.slice(prefix.length), 10);
        return Number.isInteger(n) && n > max ? n : max;
      }, 0) + 1;
    const labour = labourEstimate(option.lines);
    const jobNumber = formatJobNumber(b.code, signedOn, sequence);
    const [job] = await t('jobs')
      .insert({
        contract_id: contractId,
        lead_id: lead.id,
        branch_id: b.id,
        salesperson_id: seller.id,
        number: jobNumber,
        estimated_labour_hours: labour.hours,
        labour_cost_per_hour: labour.costPerHour,
        created_at: signedAt,
        updated_at: signedAt,
      })
      .returning('id');
    const jobId = job.id as string;
    await t('job_plan_lines').insert(
      option.lines.map((l, position) => ({
        job_id: jobId,
        branch_id: b.id,
        position,
        code: l.code,
        description: l.description,
        category: l.category,
        unit: l.unit,
        quantity: l.quantity,
        unit_cost: l.unitCost,
        unit_price: l.unitPrice,
      })),
    );
    await t('proposals').where({ id: proposal.id }).update({ status: 'signed', updated_at: signedAt });
    if (stageNow() === 'inspected') await move('proposal_sent', actorId, link ? signedAt : presentedAt);
    await move('contract_signed', actorId, signedAt);
    setValue(price);
    await this.activity(
      lead,
      'contract',
      `Contract signed ${c.inPerson ? 'in person' : 'online'} by ${d.homeowner}: option ${option.position} ` +
        `"${option.title}", ${formatUsd(price)}` +
        `${money(depositAmount).greaterThan(0) ? `, deposit ${formatUsd(depositAmount)}` : ''}. ` +
        `Last day to cancel: ${weekdayDate(deadline.lastDayToCancel)} (16 CFR 429.1(a)).`,
      {
        event: 'signed',
        contractId,
        proposalId: proposal.id,
        optionId: option.id,
        price,
        depositAmount,
        signedOn,
        lastDayToCancel: deadline.lastDayToCancel,
        inPerson: c.inPerson,
        notices: rules.notices.map((n) => n.code),
      },
      actorId,
      signedAt,
    );
    // The link: used by the online signature; in person, a used link for the homeowner to come back to.
    if (link && !c.inPerson) {
      await t('signing_links').where({ id: link.id }).update({ used_at: signedAt });
    } else {
      if (link) await t('signing_links').where({ id: link.id }).update({ revoked_at: signedAt });
      if (d.email) {
        await t('signing_links').insert({
          proposal_id: proposal.id,
          branch_id: b.id,
          token_hash: createHash('sha256').update(randomBytes(32).toString('base64url')).digest('hex'),
          sent_to: d.email,
          expires_at: new Date(signedAt.getTime() + SIGNING_LINK_TTL_DAYS * DAY_MS),
          deposit_amount: depositAmount === '0.00' ? null : depositAmount,
          sent_by: seller.id,
          used_at: signedAt,
          created_at: signedAt,
        });
      }
    }
    if (d.email) {
      const mail = contractSignedMail({
        homeownerName: d.homeowner,
        branchName: b.name,
        optionTitle: option.title,
        price,
        signedOn,
        lastDayToCancel: deadline.lastDayToCancel,
        timezone: b.timezone,
        link: null,
      });
      await this.activity(
        lead,
        'email',
        `E-mail "${mail.subject}" sent to ${d.email}, with the signed contract PDF.`,
        { event: 'contract_mail', contractId, to: d.email },
        actorId,
        new Date(signedAt.getTime() + 60_000),
      );
    }

    // ---- cancelled inside the window, through the signing link (ContractsService.recordCancellation)
    if (c.cancelled) {
      const at = this.past(b, c.cancelled, `${d.key} cancelled`);
      if (todayInZone(b.timezone, at) > deadline.lastDayToCancel) {
        throw new Error(`demo-scenario.json: ${d.key} is cancelled after the window closed`);
      }
      await t('contracts')
        .where({ id: contractId })
        .update({ cancelled_at: at, cancelled_by_kind: 'homeowner' });
      await t('jobs').where({ id: jobId }).update({ status: 'cancelled', cancelled_at: at, updated_at: at });
      await move('cancelled', null, at);
      await this.activity(
        lead,
        'cancellation',
        'Contract cancelled by the homeowner through the signing link, inside the 16 CFR 429 window. ' +
          'Refund due: every payment made under the contract, the deposit included, within 10 business days of the ' +
          'cancellation (FTC guidance, secondary).' +
          `${money(depositAmount).greaterThan(0) ? ` Deposit on the contract: ${formatUsd(depositAmount)}.` : ''}`,
        {
          event: 'contract_cancelled',
          contractId,
          byKind: 'homeowner',
          afterWindow: false,
          refundDue: true,
          refundWithinBusinessDays: 10,
          depositAmount,
          leadStageMoved: true,
        },
        null,
        at,
      );
      const cancelledOn = todayInZone(b.timezone, at);
      const mails = [
        ...(d.email
          ? [
              {
                to: d.email,
                kind: 'homeowner',
                mail: cancellationConfirmedMail({
                  homeownerName: d.homeowner,
                  branchName: b.name,
                  branchPhone: b.phone,
                  cancelledOn,
                  paidSomething: money(depositAmount).greaterThan(0),
                }),
              },
            ]
          : []),
        {
          to: seller.email,
          kind: 'salesperson',
          mail: cancellationNoticeMail({
            recipientName: seller.name,
            homeownerName: d.homeowner,
            branchName: b.name,
            how: `the homeowner cancelled through the signing link on ${weekdayDate(cancelledOn)}.`,
            depositAmount,
            link: '',
          }),
        },
      ];
      for (const m of mails) {
        await this.activity(
          lead,
          'email',
          `E-mail "${m.mail.subject}" sent to the ${m.kind} (${m.to}).`,
          { event: 'cancellation_mail', contractId, to: m.to },
          null,
          new Date(at.getTime() + 60_000),
        );
      }
      return;
    }

    // ---- the deposit, by card (ProcessorPostings.recordCharge)
    let depositOn: string | null = null;
    let depositHeld = '0.00';
    if (c.depositPaid) {
      if (!money(depositAmount).greaterThan(0))
        throw new Error(`demo-scenario.json: ${d.key} pays a deposit of none`);
      const paidAt = this.past(b, c.depositPaid, `${d.key} deposit`);
      if (paidAt < signedAt) throw new Error(`demo-scenario.json: ${d.key} pays the deposit before signing`);
      await this.cardPayment(
        b,
        lead,
        contractId,
        'deposit',
        depositAmount,
        paidAt,
        c.depositPaid.card,
        `${d.key}:deposit`,
      );
      await t('contracts').where({ id: contractId }).update({ deposit_received_at: paidAt });
      await move('deposit_received', null, paidAt);
      depositOn = todayInZone(b.timezone, paidAt);
      depositHeld = depositAmount;
    }

    const j = d.job;
    if (!j) return;
    const crew = b.crews.get(j.crew);
    if (!crew) throw new Error(`demo-scenario.json: ${d.key} names unknown crew ${j.crew} of ${b.code}`);
    const crewLead = await t('users').where({ id: crew.leadUserId }).first('id', 'name');

    // The permit (JobBoardService.setPermit)
    if (j.permit) {
      const pm = j.permit;
      let appliedOn: string | null = null;
      let issuedOn: string | null = null;
      if (pm.needed && pm.appliedAfterDeposit !== undefined) {
        if (!depositOn)
          throw new Error(`demo-scenario.json: ${d.key} applies for a permit before the deposit`);
        appliedOn = this.weekday(addCalendarDays(depositOn, pm.appliedAfterDeposit), 1);
        if (pm.issuedAfterApplied !== undefined)
          issuedOn = this.weekday(addCalendarDays(appliedOn, pm.issuedAfterApplied), 1);
      }
      const lastDay = issuedOn ?? appliedOn;
      if (lastDay && lastDay >= b.today)
        throw new Error(`demo scenario: ${d.key}'s permit dates are not in the past`);
      await t('jobs')
        .where({ id: jobId })
        .update({
          permit_needed: pm.needed,
          permit_applied_on: appliedOn,
          permit_number: appliedOn ? (pm.number ?? null) : null,
          permit_issued_on: issuedOn,
        });
      const parts =
        pm.needed === false
          ? ['not needed']
          : [
              pm.needed === null ? 'need not known yet' : 'needed',
              appliedOn ? `applied for on ${appliedOn}` : '',
              appliedOn && pm.number ? `number ${pm.number}` : '',
              issuedOn ? `issued on ${issuedOn}` : '',
            ].filter(Boolean);
      const recordedOn = issuedOn ?? appliedOn ?? depositOn ?? todayInZone(b.timezone, signedAt);
      await this.activity(
        lead,
        'job',
        `Permit for job ${jobNumber}: ${parts.join(', ')}.`,
        {
          event: 'permit',
          jobId,
          needed: pm.needed,
          appliedOn,
          number: appliedOn ? (pm.number ?? null) : null,
          issuedOn,
          inspectionPassedOn: null,
        },
        this.manager(b),
        this.laterOf(this.instantOn(b, recordedOn, '16:30'), signedAt),
      );
    }

    if (!j.scheduled) return;
    const s = j.scheduled;
    const scheduledAt = this.past(b, s.at, `${d.key} scheduled`);
    // The crew's days: weekdays (the calendar greys the weekend), and never a crew booked twice. A job still
    // on site started on the last weekday before its day and may run into a weekend; any other job's whole
    // run is on weekdays, moved later (or, in the past, earlier) until it is.
    const runs = this.run(crew.id);
    const onSite = Boolean(j.started && !j.completed);
    const dir = s.startDay < 0 ? -1 : 1;
    const fits = (start: string) => {
      const end = jobEndOn(start, s.durationDays);
      if (runs.some((r) => start <= r.end && r.start <= end)) return false;
      if (onSite) return this.isWeekday(start);
      for (let day = start; day <= end; day = addCalendarDays(day, 1)) if (!this.isWeekday(day)) return false;
      return true;
    };
    let startOn = this.day(b, s.startDay);
    while (!fits(startOn)) startOn = addCalendarDays(startOn, dir);
    if (startOn <= deadline.lastDayToCancel) {
      throw new Error(
        `demo scenario: ${d.key} would start inside the cancellation window (${deadline.lastDayToCancel})`,
      );
    }
    if (startOn < todayInZone(b.timezone, scheduledAt))
      throw new Error(`demo scenario: ${d.key} is scheduled for a day already past`);
    if (!depositOn || todayInZone(b.timezone, scheduledAt) < depositOn)
      throw new Error(`demo scenario: ${d.key} is scheduled before its deposit`);

    // The 811 ticket (JobBoardService.setLocate): filed a few days ahead, never in the future, and early
    // enough that digging is allowed on the first day of the work.
    let locate: { ticket: string; filedOn: string; digOn: string; expiresOn: string } | null = null;
    if (j.locate !== false) {
      let filedOn = addCalendarDays(startOn, -5);
      if (filedOn >= b.today) filedOn = addCalendarDays(b.today, -1);
      filedOn = this.weekday(filedOn, -1);
      while (earliestDigDate({ state: b.state, filedOn }).earliestDigDate > startOn) {
        filedOn = this.weekday(addCalendarDays(filedOn, -1), -1);
      }
      const digOn = earliestDigDate({ state: b.state, filedOn }).earliestDigDate;
      const expiresOn = defaultLocateExpiry(b.state, filedOn)!.expiresOn;
      if (expiresOn < startOn)
        throw new Error(`demo scenario: ${d.key}'s 811 ticket would expire before the work`);
      const ticket = `${filedOn.slice(2, 4)}${filedOn.slice(5, 7)}${filedOn.slice(8, 10)}-${createHash('sha256').update(d.key).digest('hex').slice(0, 4).toUpperCase()}`;
      locate = { ticket, filedOn, digOn, expiresOn };
      await t('jobs').where({ id: jobId }).update({
        locate_ticket_number: ticket,
        locate_filed_on: filedOn,
        locate_earliest_dig_on: digOn,
        locate_expires_on: expiresOn,
      });
      await this.activity(
        lead,
        'job',
        `811 ticket ${ticket} for job ${jobNumber}, filed ${weekdayDate(filedOn)}: digging allowed from ` +
          `${weekdayDate(digOn)}, ticket good until ${weekdayDate(expiresOn)} (the state’s default).`,
        { event: 'locate', jobId, ticketNumber: ticket, filedOn, earliestDigOn: digOn, expiresOn },
        this.manager(b),
        this.laterOf(this.instantOn(b, filedOn, '08:20'), signedAt),
      );
    }

    // Scheduling (JobBoardService.schedule)
    runs.push({ start: startOn, end: jobEndOn(startOn, s.durationDays) });
    await t('jobs').where({ id: jobId }).update({
      status: 'scheduled',
      crew_id: crew.id,
      crew_lead_id: crew.leadUserId,
      start_on: startOn,
      duration_days: s.durationDays,
      updated_at: scheduledAt,
    });
    const runText = `${weekdayDate(startOn)}${s.durationDays > 1 ? ` to ${weekdayDate(jobEndOn(startOn, s.durationDays))}` : ''}`;
    await this.activity(
      lead,
      'job',
      `Job ${jobNumber} scheduled on ${crew.name}: ${runText}.`,
      { event: 'scheduled', jobId, crewId: crew.id, startOn, durationDays: s.durationDays },
      this.manager(b),
      scheduledAt,
    );
    await move('scheduled', this.manager(b), scheduledAt);
    if (d.email) {
      const mail = jobScheduledMail({
        homeownerName: d.homeowner,
        branchName: b.name,
        branchPhone: b.phone,
        jobNumber,
        addressLine1: d.address,
        city: b.city,
        startOn,
        durationDays: s.durationDays,
      });
      await this.activity(
        lead,
        'email',
        `E-mail "${mail.subject}" sent to the homeowner (${d.email}).`,
        { event: 'job_scheduled_mail', jobId, to: d.email },
        this.manager(b),
        new Date(scheduledAt.getTime() + 60_000),
      );
    }

    if (!j.started) return;
    // Starting (JobBoardService.start): outside the window, on or after the dig date, deposit in.
    const startedAt = this.instantOn(b, startOn, j.started);
    if (startedAt.getTime() >= this.now.getTime())
      throw new Error(`demo scenario: ${d.key} starts in the future`);
    if (!locate || startOn < locate.digOn || startOn > locate.expiresOn)
      throw new Error(`demo scenario: ${d.key} starts without a good 811 ticket`);
    await t('jobs')
      .where({ id: jobId })
      .update({ status: 'in_progress', started_at: startedAt, updated_at: startedAt });
    await this.activity(
      lead,
      'job',
      `Work started on job ${jobNumber} by ${crew.name} (${crewLead.name}).`,
      { event: 'started', jobId, startedAt: startedAt.toISOString(), plannedStartOn: startOn },
      crewLead.id,
      startedAt,
    );
    await move('in_progress', crewLead.id, startedAt);

    // The crew's log (InstallLogService.addEntry / addDayNote): rows checked by checkInstallEntry.
    const workDate = (index: number) => addCalendarDays(startOn, index);
    const log = j.log;
    if (log) {
      const rows: { kind: 'injection' | 'push_pier' | 'helical_pile'; spec: string[] }[] = [
        ...(log.points ?? []).map((spec) => ({ kind: 'injection' as const, spec })),
        ...(log.piles ?? []).map((spec) => ({ kind: 'helical_pile' as const, spec })),
        ...(log.piers ?? []).map((spec) => ({ kind: 'push_pier' as const, spec })),
      ];
      const spacing = money(log.spacingFt ?? '5');
      let n = 0;
      for (const [dayIndex, count] of log.perDay.entries()) {
        const date = workDate(dayIndex);
        const dayStart = dayIndex === 0 ? startedAt : this.instantOn(b, date, '07:30');
        for (let k = 0; k < count; k++, n++) {
          const r = rows[n];
          if (!r) throw new Error(`demo-scenario.json: ${d.key}'s log has fewer rows than perDay counts`);
          const loggedAt = new Date(dayStart.getTime() + (k + 1) * 35 * 60_000);
          if (loggedAt.getTime() >= this.now.getTime())
            throw new Error(`demo scenario: ${d.key}'s log row ${n + 1} is in the future`);
          const number = n + 1;
          const fields =
            r.kind === 'injection'
              ? {
                  pounds: r.spec[0],
                  stopReason: r.spec[1] as StopReason,
                  note: r.spec[2] ?? null,
                  depthFt: log.depthFt ?? null,
                }
              : r.kind === 'helical_pile'
                ? {
                    torqueFtLb: r.spec[0],
                    depthFt: r.spec[1],
                    note: r.spec[2] ?? null,
                    shaft: log.shaft,
                    designLoadLb: log.designLoadLb,
                  }
                : { finalPressurePsi: r.spec[0], depthFt: r.spec[1], note: r.spec[2] ?? null };
          const checked = checkInstallEntry({
            kind: r.kind,
            number,
            location: log.location ?? null,
            locationFt: spacing.times(number - 1).toFixed(),
            ...fields,
          });
          if (!checked.ok)
            throw new Error(
              `demo-scenario.json: ${d.key} log row ${number}: ${checked.errors.map((e) => e.message).join('; ')}`,
            );
          await this.installEntry(checked.entry, jobId, b.id, crewLead.id, loggedAt);
        }
      }
      if (n !== rows.length)
        throw new Error(`demo-scenario.json: ${d.key}'s perDay counts leave rows unlogged`);
    }
    for (const note of j.dayNotes ?? []) {
      const date = workDate(note.index);
      const at = this.instantOn(b, date, '17:15');
      if (at.getTime() >= this.now.getTime())
        throw new Error(`demo scenario: ${d.key}'s day note ${date} is in the future`);
      await t('job_day_notes').insert({
        job_id: jobId,
        branch_id: b.id,
        client_row_id: randomUUID(),
        work_date: date,
        note: note.note,
        crew_size: note.crewSize,
        labour_hours: note.hours,
        written_by: crewLead.id,
        created_at: at,
      });
    }

    if (!j.completed) return;
    // Completion (CompletionService.complete): checklist, re-survey, the homeowner's signature, the job
    // completed, the lead moved on, and the payments feature's handler posting the revenue.
    const cp = j.completed;
    const completedOn = jobEndOn(startOn, s.durationDays);
    const completedAt = this.instantOn(b, completedOn, cp.at);
    if (completedAt.getTime() >= this.now.getTime())
      throw new Error(`demo scenario: ${d.key} completes in the future`);
    const checklist = Object.fromEntries(
      COMPLETION_CHECKLIST_ITEMS.map((i) => [i.key, !(cp.checklistNo ?? []).includes(i.key)]),
    );
    if ((cp.checklistNo ?? []).length && !cp.note)
      throw new Error(`demo-scenario.json: ${d.key} leaves checklist items undone without a note`);
    await t('job_completions').insert({
      job_id: jobId,
      branch_id: b.id,
      checklist: JSON.stringify(checklist),
      homeowner_name: d.homeowner,
      signature_png: await signaturePng(`${d.homeowner} (completion)`),
      signed_at: completedAt,
      signed_ip: '198.51.100.61',
      completed_by: crewLead.id,
      note: cp.note ?? null,
    });
    const before = await t('survey_points')
      .where({ inspection_id: inspectionId, kind: 'inspection' })
      .orderBy('position')
      .select('label', 'x_ft', 'y_ft', 'elevation_in', 'is_reference');
    if (before.length < 3)
      throw new Error(`demo-scenario.json: ${d.key} is completed without an inspection survey to re-survey`);
    await t('job_survey_points').insert(
      before.map((p, position) => ({
        job_id: jobId,
        branch_id: b.id,
        position,
        label: p.label,
        x_ft: p.x_ft,
        y_ft: p.y_ft,
        elevation_in: p.is_reference
          ? '0.00'
          : toCents(money(p.elevation_in).times(cp.resurveyScale)).toFixed(2),
        is_reference: p.is_reference,
      })),
    );
    await t('jobs')
      .where({ id: jobId })
      .update({ status: 'completed', completed_at: completedAt, updated_at: completedAt });
    await move('completed', crewLead.id, completedAt);
    // PaymentsCompletionHandler: contract price is revenue, deposits held stop being owed, the rest receivable.
    const held = MoneyDecimal.max(0, MoneyDecimal.min(money(depositHeld), money(price)));
    await this.post(b, jobCompleted({ contractPrice: price, depositsHeld: held.toFixed(2) }), {
      key: `job.completed:${jobId}`,
      source: { kind: 'system', ref: 'job.completed' },
      effectiveOn: completedOn,
      postedAt: completedAt,
      leadId: lead.id,
      contractId,
      jobId,
    });

    if (j.warranty) {
      // WarrantyService.issue: numbered per branch.
      const wr = j.warranty;
      const issuedOn = addCalendarDays(completedOn, wr.daysAfter);
      const issuedAt = this.instantOn(b, issuedOn, '11:00');
      if (issuedAt.getTime() >= this.now.getTime())
        throw new Error(`demo scenario: ${d.key}'s warranty is issued in the future`);
      await t.raw(`select pg_advisory_xact_lock(hashtext('warranty-number:' || ?))`, [b.id]);
      const numbers: { number: string }[] = await t('warranties').where({ branch_id: b.id }).select('number');
      const last = Math.max(
        0,
        ...numbers.map((r) => Number(/^W-[A-Z0-9]+-(\d{4,})$/.exec(r.number)?.[1] ?? 0)),
      );
      await t('warranties').insert({
        job_id: jobId,
        branch_id: b.id,
        number: formatWarrantyNumber(b.code, last + 1),
        term_years: wr.termYears,
        covers: wr.covers,
        exclusions: wr.exclusions ?? null,
        transferable: wr.transferable,
        issued_on: issuedOn,
        issued_by: this.manager(b),
        created_at: issuedAt,
      });
    }

    const bal = d.balance;
    if (!bal) return;
    const balance = money(price).minus(depositHeld).toFixed(2);
    const paidOn = addCalendarDays(completedOn, bal.daysAfterCompletion);
    const paidAt = this.instantOn(b, paidOn, bal.at);
    if (paidAt.getTime() >= this.now.getTime())
      throw new Error(`demo scenario: ${d.key}'s balance is paid in the future`);
    if (bal.method === 'card') {
      await this.cardPayment(
        b,
        lead,
        contractId,
        'balance',
        balance,
        paidAt,
        bal.card ?? 'visa',
        `${d.key}:balance`,
      );
    } else {
      // PaymentsService.recordPayment: the bookkeeper records a cheque that reached the bank.
      const requestKey = randomUUID();
      let posting = balancePaidToBank({ amount: balance, method: 'cheque' });
      if (bal.reference) posting = { ...posting, memo: `${posting.memo} (${bal.reference})`.slice(0, 500) };
      const entryId = await this.post(b, posting, {
        key: `payment:${requestKey}`,
        source: { kind: 'user', userId: this.bookkeeperId },
        effectiveOn: paidOn,
        postedAt: paidAt,
        leadId: lead.id,
        contractId,
      });
      const [pay] = await t('payments')
        .insert({
          contract_id: contractId,
          branch_id: b.id,
          payment_request_id: null,
          kind: 'balance',
          method: 'cheque',
          amount: balance,
          fee: '0.00',
          net: balance,
          currency: 'usd',
          reference: bal.reference ?? null,
          received_on: paidOn,
          recorded_by: this.bookkeeperId,
          request_key: requestKey,
          journal_entry_id: entryId,
          created_at: paidAt,
        })
        .returning('id');
      await this.activity(
        lead,
        'payment',
        `Balance payment of ${formatUsd(balance)} received by cheque${bal.reference ? ` (${bal.reference})` : ''}.`,
        { paymentId: pay.id, kind: 'balance', amount: balance },
        this.bookkeeperId,
        paidAt,
      );
    }
    // Paid in full: nothing in the app moves a lead there yet (LeadFacts.paidInFull is not read from the
    // payments); the scenario puts the fully paid leads there, as the money says.
    await move('paid_in_full', null, new Date(paidAt.getTime() + 60_000));
  }

  private laterOf(a: Date, b: Date): Date {
    return a.getTime() > b.getTime() ? a : new Date(b.getTime() + 10 * 60_000);
  }

  private async installEntry(
    e: CheckedInstallEntry,
    jobId: string,
    branchId: string,
    by: string,
    at: Date,
  ): Promise<void> {
    await this.trx('install_entries').insert({
      job_id: jobId,
      branch_id: branchId,
      client_row_id: randomUUID(),
      kind: e.kind,
      number: e.number,
      location: e.location,
      location_ft: e.locationFt,
      depth_ft: e.depthFt,
      pounds: e.pounds,
      stop_reason: e.stopReason,
      final_pressure_psi: e.finalPressurePsi,
      torque_ft_lb: e.torqueFtLb,
      shaft: e.shaft,
      capacity_ultimate_lb: e.capacityUltimateLb,
      capacity_allowable_lb: e.capacityAllowableLb,
      design_load_lb: e.designLoadLb,
      below_design_load: e.belowDesignLoad,
      note: e.note,
      logged_by: by,
      logged_at: at,
      created_at: at,
    });
  }

  /** A card payment as ProcessorPostings.recordCharge records it: posting, payments row, timeline. */
  private async cardPayment(
    b: Branch,
    lead: { id: string; branchId: string },
    contractId: string,
    kind: 'deposit' | 'balance',
    gross: string,
    at: Date,
    cardName: 'visa' | 'mastercard',
    name: string,
  ): Promise<void> {
    const chargeId = processorId('ch', name);
    const fee = cardFee(gross);
    const net = money(gross).minus(fee).toFixed(2);
    const card = CARDS[cardName];
    const cardText = ` (${cardBrandName(card.brand)} •••• ${card.last4})`;
    const posting =
      kind === 'deposit'
        ? depositCapturedByCard({ gross, fee, memo: `Card deposit${cardText}, charge ${chargeId}` })
        : balancePaidByCard({ gross, fee, memo: `Card balance payment${cardText}, charge ${chargeId}` });
    const receivedOn = todayInZone(b.timezone, at);
    const entryId = await this.post(b, posting, {
      key: `charge:${chargeId}`,
      source: { kind: 'event', ref: processorId('evt', `${name}:succeeded`) },
      effectiveOn: receivedOn,
      postedAt: new Date(at.getTime() + 20_000),
      leadId: lead.id,
      contractId,
    });
    const balanceTransactionId = processorId('txn', name);
    const [pay] = await this.trx('payments')
      .insert({
        contract_id: contractId,
        branch_id: b.id,
        payment_request_id: null,
        kind,
        method: 'card',
        amount: gross,
        fee,
        net,
        currency: 'usd',
        processor_payment_intent_id: processorId('pi', name),
        processor_charge_id: chargeId,
        processor_balance_transaction_id: balanceTransactionId,
        card_brand: card.brand,
        card_last4: card.last4,
        reference: null,
        received_on: receivedOn,
        recorded_by: null,
        request_key: null,
        journal_entry_id: entryId,
        created_at: new Date(at.getTime() + 20_000),
      })
      .returning('id');
    this.charges.push({
      branchId: b.id,
      paymentId: pay.id,
      chargeId,
      balanceTransactionId,
      amount: gross,
      fee,
      net,
      at,
    });
    await this.activity(
      lead,
      'payment',
      `${kind === 'deposit' ? 'Deposit' : 'Balance payment'} of ${formatUsd(gross)} received by card${cardText}.`,
      { paymentId: pay.id, kind, amount: gross },
      null,
      new Date(at.getTime() + 20_000),
    );
  }

  /**
   * The processor's payouts (ProcessorPostings.recordPayout): each day's charges (UTC, as the processor
   * counts) paid out together the next morning and arriving the day after; one posting per branch,
   * bank / processor clearing. Payouts that have not arrived by today are left out: their charges are
   * still in processor clearing.
   */
  async payouts(): Promise<void> {
    const t = this.trx;
    const byDay = new Map<string, Charge[]>();
    for (const c of this.charges) {
      const day = c.at.toISOString().slice(0, 10);
      byDay.set(day, [...(byDay.get(day) ?? []), c]);
    }
    const todayUtc = this.now.toISOString().slice(0, 10);
    for (const [day, charges] of [...byDay].sort(([a], [b]) => a.localeCompare(b))) {
      const created = new Date(`${addCalendarDays(day, 1)}T10:00:00Z`);
      const arrival = addCalendarDays(day, 2);
      const arrived = new Date(`${arrival}T13:00:00Z`);
      if (arrival > todayUtc || arrived.getTime() >= this.now.getTime()) continue;
      const payoutId = processorId('po', day);
      const total = charges.reduce((s, c) => s.plus(c.net), new MoneyDecimal(0)).toFixed(2);
      const [payout] = await t('processor_payouts')
        .insert({
          processor_payout_id: payoutId,
          amount: total,
          currency: 'usd',
          arrival_date: arrival,
          status: 'paid',
          processor_balance_transaction_id: processorId('txn', `payout:${day}`),
          processor_created_at: created,
          created_at: arrived,
        })
        .returning('id');
      await t('processor_payout_items').insert(
        charges.map((c) => ({
          payout_id: payout.id,
          processor_balance_transaction_id: c.balanceTransactionId,
          type: 'charge',
          source_id: c.chargeId,
          amount: c.amount,
          fee: c.fee,
          net: c.net,
          currency: 'usd',
          branch_id: c.branchId,
          payment_id: c.paymentId,
          refund_id: null,
        })),
      );
      const perBranch = new Map<string, Charge[]>();
      for (const c of charges) perBranch.set(c.branchId, [...(perBranch.get(c.branchId) ?? []), c]);
      for (const [branchId, list] of [...perBranch].sort(([a], [b]) => a.localeCompare(b))) {
        const b = [...this.branches.values()].find((x) => x.id === branchId)!;
        const sum = (f: (c: Charge) => string) =>
          list.reduce((s, c) => s.plus(f(c)), new MoneyDecimal(0)).toFixed(2);
        const net = sum((c) => c.net);
        const entryId = await this.post(
          b,
          processorPayout({ amount: net, memo: `Processor payout ${payoutId}` }),
          {
            key: `payout:${payoutId}:${branchId}`,
            source: { kind: 'event', ref: processorId('evt', `payout:${day}:paid`) },
            effectiveOn: arrival,
            postedAt: arrived,
          },
        );
        await t('processor_payout_branches').insert({
          payout_id: payout.id,
          branch_id: branchId,
          gross: sum((c) => c.amount),
          fee: sum((c) => c.fee),
          net,
          item_count: list.length,
          journal_entry_id: entryId,
        });
      }
    }
  }
}

// ---- small pure helpers ---------------------------------------------------------------------------------

interface PlanLine extends Item {
  quantity: string;
}

function dateText(v: Date | string): string {
  if (typeof v === 'string') return v.slice(0, 10);
  // pg returns a date column as a local-midnight Date.
  return `${v.getFullYear()}-${String(v.getMonth() + 1).padStart(2, '0')}-${String(v.getDate()).padStart(2, '0')}`;
}

/** Survey rows with their elevations scaled (a house that settled more or less than the profile). */
function scaled(rows: SurveyRow[], factor: string) {
  return rows.map(([label, x, y, z], i) => ({
    label,
    xFt: money(String(x)).toFixed(2),
    yFt: money(String(y)).toFixed(2),
    elevationIn: i === 0 ? '0.00' : toCents(money(String(z)).times(factor)).toFixed(2),
  }));
}

/** The deposit asked with a proposal: a share of its lowest option's total, in whole dollars. */
function depositFor(pct: string | undefined, options: { totals: OptionTotals }[]): string | null {
  if (!pct) return null;
  const lowest = options.reduce(
    (m, o) => MoneyDecimal.min(m, money(o.totals.customerTotal)),
    money(options[0]!.totals.customerTotal),
  );
  return lowest.times(pct).dividedBy(100).toDecimalPlaces(0, MoneyDecimal.ROUND_DOWN).toFixed(2);
}

function highest(options: { totals: OptionTotals }[]): string {
  return options.reduce(
    (m, o) => (money(o.totals.customerTotal).greaterThan(m) ? o.totals.customerTotal : m),
    '0.00',
  );
}
