import { randomBytes } from 'node:crypto';
import { expect } from 'vitest';
import { contractRules, todayInZone } from '@loambook/common';
import { Clock } from '../../src/signing/clock';
import { JobsService } from '../../src/jobs/jobs.service';
import { tokenFor, type TestApp } from './test-app';
import { makeItem } from './proposal-fixtures';
import { makeLead } from './selling-fixtures';
import { inkSignature, makeCompletedInspection } from './signing-fixtures';

/**
 * Fixtures for the field-job tests (issue #4): crews, and jobs made the real way — an approved proposal
 * signed in person through the API, so that the signing transaction makes the job and copies its plan.
 * Invented data only.
 */

const hex = () => randomBytes(3).toString('hex');

export interface CrewFixture {
  id: string;
  name: string;
  leadUserId: string;
}

/** A crew of the branch led by `crewLead` (a user with the crew_lead role), with two invented members. */
export async function makeCrew(
  t: TestApp,
  branchId: string,
  crewLead: { id: string },
  opts: { name?: string; members?: { name: string; phone?: string | null }[]; active?: boolean } = {},
): Promise<CrewFixture> {
  const name = opts.name ?? `Crew ${hex()}`;
  const [row] = await t
    .db('crews')
    .insert({ branch_id: branchId, name, lead_user_id: crewLead.id, active: opts.active ?? true })
    .returning('id');
  const members = opts.members ?? [
    { name: 'Rowan Testmember', phone: '555-0161' },
    { name: 'Alex Testhand', phone: '555-0162' },
  ];
  if (members.length) {
    await t.db('crew_members').insert(
      members.map((m, position) => ({
        crew_id: row.id,
        branch_id: branchId,
        name: m.name,
        phone: m.phone ?? null,
        position,
      })),
    );
  }
  return { id: row.id, name, leadUserId: crewLead.id };
}

/** One line of the option to sign: a new price-book item of the branch at this cost and price. */
export interface PlanLineSpec {
  code?: string;
  description: string;
  category: string;
  unit: string;
  quantity: string;
  unitCost: string;
  unitPrice: string;
}

/**
 * The default plan, by hand (no tax on the invoice under makeBranch's materials_cost treatment):
 *   240 lb × 11.50 = 2760.00 (cost 240 × 5.20 = 1248.00)
 *    12 points × 45 =  540.00 (cost 12 × 18 = 216.00)
 *    16 hours × 95 = 1520.00 (cost 16 × 55 = 880.00)
 *     1 mobilisation  600.00 (cost 300.00)
 *   price 5420.00, cost 2644.00, margin (5420 − 2644) / 5420 = 51.2 %.
 */
export const DEFAULT_PLAN: PlanLineSpec[] = [
  {
    description: 'Polyurethane foam, per lb',
    category: 'soil_stabilisation',
    unit: 'lb',
    quantity: '240',
    unitCost: '5.20',
    unitPrice: '11.50',
  },
  {
    description: 'Injection point',
    category: 'soil_stabilisation',
    unit: 'point',
    quantity: '12',
    unitCost: '18',
    unitPrice: '45',
  },
  {
    description: 'Injection crew labour',
    category: 'soil_stabilisation',
    unit: 'hour',
    quantity: '16',
    unitCost: '55',
    unitPrice: '95',
  },
  {
    description: 'Mobilisation',
    category: 'mobilisation',
    unit: 'lump_sum',
    quantity: '1',
    unitCost: '300',
    unitPrice: '600',
  },
];
export const DEFAULT_PLAN_PRICE = '5420.00';

export interface SignedJobOptions {
  branchId: string;
  /** The salesperson who sells it (signs in person on their device). */
  seller: { id: string; email: string };
  lines?: PlanLineSpec[];
  /** The deposit the contract asks for; default none ('0' counts as received). */
  depositAmount?: string;
  /** Marks the deposit received (contracts.deposit_received_at) and moves the lead along. */
  depositReceived?: boolean;
  /** Signs 14 days before the clock's now, so that the 16 CFR 429 window has closed. */
  windowClosed?: boolean;
  /** Signs at this instant instead (the contract's terms are frozen once written: this is the way). */
  signedAt?: Date;
  homeownerName?: string;
  /** The lead's state (FL by default: the Florida pack). */
  state?: string;
}

export interface SignedJob {
  jobId: string;
  number: string;
  contractId: string;
  leadId: string;
  proposalId: string;
  optionId: string;
  homeownerName: string;
  email: string;
  price: string;
  lastDayToCancel: string;
}

const DAY_MS = 86_400_000;

/** One sign-in per seller and app: signing in for every job would meet the sign-in rate limit. */
const tokens = new WeakMap<TestApp, Map<string, string>>();
async function cachedToken(t: TestApp, user: { email: string }): Promise<string> {
  let forApp = tokens.get(t);
  if (!forApp) tokens.set(t, (forApp = new Map()));
  const known = forApp.get(user.email);
  if (known) return known;
  const token = await tokenFor(t, user);
  forApp.set(user.email, token);
  return token;
}

/**
 * A lead with a completed inspection and an approved one-option proposal, signed in person by the
 * homeowner through the API: the job exists, with its plan. Options for a deposit received and for a
 * window already closed (signed in the past by moving the app's Clock for the signing request only).
 */
export async function makeSignedJob(t: TestApp, o: SignedJobOptions): Promise<SignedJob> {
  const token = await cachedToken(t, o.seller);
  const auth = { Authorization: `Bearer ${token}` };
  const homeownerName = o.homeownerName ?? `Jordan Example ${hex()}`;
  const leadId = await makeLead(t.db, {
    branchId: o.branchId,
    salespersonId: o.seller.id,
    stage: 'inspected',
    homeownerName,
    state: o.state,
  });
  const inspectionId = await makeCompletedInspection(t.db, leadId, o.branchId);
  const lines = [];
  for (const l of o.lines ?? DEFAULT_PLAN) {
    const id = await makeItem(t.db, o.branchId, { ...l, code: l.code ? `${l.code}-${hex()}` : undefined });
    lines.push({ priceBookItemId: id, quantity: l.quantity });
  }
  const created = await t.http
    .post(`/api/leads/${leadId}/proposals`)
    .set(auth)
    .send({
      inspectionId,
      options: [{ title: 'Stabilise the slab', discount: { kind: 'none', value: '0' }, lines }],
    });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const proposalId: string = created.body.id;
  const submitted = await t.http.post(`/api/proposals/${proposalId}/submit`).set(auth).send({});
  expect(submitted.body.status, JSON.stringify(submitted.body)).toBe('approved');
  const option = submitted.body.options[0];
  const price: string = option.totals.customerTotal;
  const deposit = o.depositAmount ?? '0';
  const { state } = await t.db('leads').where({ id: leadId }).first('state');
  const notices = contractRules({ state, contractPrice: price, deposit }).notices.map((n) => n.code);

  const clock = t.app.get(Clock);
  const realNow = clock.now.bind(clock);
  const signAt = o.signedAt ?? (o.windowClosed ? new Date(realNow().getTime() - 14 * DAY_MS) : null);
  if (signAt) clock.now = () => new Date(signAt.getTime());
  let signed;
  try {
    signed = await t.http
      .post(`/api/proposals/${proposalId}/sign-in-person`)
      .set(auth)
      .send({
        optionId: option.id,
        signerName: homeownerName,
        signaturePng: await inkSignature(),
        acknowledgedNotices: notices,
        ...(deposit !== '0' ? { depositAmount: deposit } : {}),
      });
  } finally {
    if (signAt) clock.now = realNow;
  }
  expect(signed.status, JSON.stringify(signed.body)).toBe(201);
  const contractId: string = signed.body.id;
  const job = await t.db('jobs').where({ contract_id: contractId }).first('id', 'number');
  expect(job, 'the signing transaction makes the job').toBeTruthy();
  if (o.depositReceived) await markDepositReceived(t, contractId);
  const { email } = await t.db('leads').where({ id: leadId }).first('email');
  return {
    jobId: job.id,
    number: job.number,
    contractId,
    leadId,
    proposalId,
    optionId: option.id,
    homeownerName,
    email,
    price,
    lastDayToCancel: signed.body.lastDayToCancel,
  };
}

/** The deposit is in (as issue #5 will record it): the contract's deposit_received_at, the lead moved on. */
export async function markDepositReceived(t: TestApp, contractId: string, at?: Date): Promise<void> {
  const when = at ?? t.app.get(Clock).now();
  const c = await t.db('contracts').where({ id: contractId }).first('lead_id');
  await t.db.transaction(async (trx) => {
    await trx('contracts').where({ id: contractId }).update({ deposit_received_at: when });
    await t.app.get(JobsService).advanceLead(c.lead_id, null, trx);
  });
}

/**
 * Puts the job straight onto a crew (no checks, no e-mail) as `status`, with a locate ticket on file,
 * for tests of what comes after scheduling (the field log, completion). Moves the lead along.
 */
export async function putJobOnCrew(
  t: TestApp,
  jobId: string,
  crew: CrewFixture,
  opts: { startOn?: string; durationDays?: number; status?: 'scheduled' | 'in_progress' } = {},
): Promise<void> {
  const job = await t
    .db('jobs as j')
    .join('branches as b', 'b.id', 'j.branch_id')
    .where('j.id', jobId)
    .first('j.lead_id', 'b.timezone');
  const today = todayInZone(job.timezone, t.app.get(Clock).now());
  const status = opts.status ?? 'in_progress';
  await t.db.transaction(async (trx) => {
    await trx('jobs')
      .where({ id: jobId })
      .update({
        status,
        crew_id: crew.id,
        crew_lead_id: crew.leadUserId,
        start_on: opts.startOn ?? today,
        duration_days: opts.durationDays ?? 1,
        locate_ticket_number: `T-${hex()}`,
        started_at: status === 'in_progress' ? t.app.get(Clock).now() : null,
      });
    await t.app.get(JobsService).advanceLead(job.lead_id, null, trx);
  });
}
