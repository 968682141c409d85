import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import PgBoss from 'pg-boss';
import { depositReceivedToBank, refundAfterCancellation, type Role } from '@loambook/common';
import { LedgerService } from '../src/ledger/ledger.service';
import { Clock } from '../src/signing/clock';
import { CommissionsService } from '../src/commissions/commissions.service';
import { EARNING_QUEUE, PGBOSS_SCHEMA } from '../src/commissions/commissions.scheduler';
import { pg } from '../scripts/lib/env.mjs';
import { expectTrialBalanceZero } from './support/ledger-assertions';
import {
  makeCrew,
  makeSignedJob,
  markDepositReceived,
  putJobOnCrew,
  type SignedJob,
} from './support/job-fixtures';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

/**
 * Commissions end to end through the API (issue #5 §5). All people, prices and rates are invented.
 *
 * Every contract below is signed from the fixtures' default plan (job-fixtures.ts DEFAULT_PLAN, worked by
 * hand there): net price 5,420.00, cost 2,644.00, so gross margin 2,776.00 = 51.22 % (2,776 / 5,420 =
 * 0.512177…, half-up to 2 decimals). Every commission figure is worked by hand in the comment beside it.
 *
 * The clock: contracts are signed on Thu 2026-07-02 in America/New_York. The last day to cancel is Wed
 * 2026-07-08 (REFERENCE-VALUES.md worked example: Fri 07-03 is the observed Independence Day, Sat 07-04 the
 * holiday itself, Sunday skipped — 16 CFR 429.0/429.1, published); the window closes at midnight at the
 * end of that day, branch time (EDT, UTC−4), i.e. 2026-07-09T04:00:00Z.
 */

const TZ_NOTE = 'America/New_York';
const SIGNED_AT = '2026-07-02T15:00:00Z'; // 11:00 EDT
const DEPOSIT_AT = '2026-07-02T16:30:00Z';
const JUST_BEFORE_CLOSE = '2026-07-09T03:59:00Z'; // Wed 07-08 23:59 EDT: the buyer may still cancel
const JUST_AFTER_CLOSE = '2026-07-09T04:01:00Z'; // Thu 07-09 00:01 EDT

describe('commissions', () => {
  let t: TestApp;
  let north: string; // flat 8 % of the net price, half at the first milestone
  let south: string; // gross margin, margin bands by bracket, 40 % at the first milestone
  let east: string; // monthly volume, step tiers
  let west: string; // no plan of its own
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  const jobs: Record<string, SignedJob> = {};
  const plans: Record<string, string> = {};
  const statementIds: Record<string, string> = {};

  const clock = () => t.app.get(Clock);
  const setClock = (iso: string) => {
    clock().now = () => new Date(iso);
  };
  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
      put: (url: string, body: object = {}) => t.http.put(url).set(auth).send(body),
      patch: (url: string, body: object = {}) => t.http.patch(url).set(auth).send(body),
    };
  };
  const run = async () => {
    const res = await as('bookkeeper').post('/api/commissions/run');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as { linesWritten: number; failures: unknown[] };
  };
  const linesOf = async (job: SignedJob) =>
    (await t
      .db('commission_lines')
      .where({ contract_id: job.contractId })
      .orderBy(['milestone', 'salesperson_id', 'kind'])
      .select(
        'salesperson_id',
        'milestone',
        'kind',
        'amount',
        'journal_entry_id',
        'idempotency_key',
        t.db.raw(`to_char(effective_on, 'YYYY-MM-DD') as effective_on`),
      )) as {
      salesperson_id: string;
      milestone: string;
      kind: string;
      amount: string;
      journal_entry_id: string;
      idempotency_key: string;
      effective_on: string;
    }[];
  const entryLines = async (entryId: string) =>
    (await t
      .db('journal_lines as l')
      .join('ledger_accounts as a', 'a.id', 'l.account_id')
      .join('journal_entries as e', 'e.id', 'l.entry_id')
      .where('l.entry_id', entryId)
      .orderBy('l.position')
      .select('a.code', 'l.side', 'l.amount', 'l.salesperson_id', 'e.reason_code', 'e.idempotency_key')
      .select(t.db.raw(`to_char(e.effective_on, 'YYYY-MM-DD') as effective_on`))) as {
      code: string;
      side: string;
      amount: string;
      salesperson_id: string | null;
      reason_code: string;
      idempotency_key: string;
      effective_on: string;
    }[];
  const statementFor = async (who: string, period: string) => {
    const res = await as('bookkeeper').get(
      `/api/commission-statements?salespersonId=${people[who]!.id}&period=${period}`,
    );
    expect(res.status).toBe(200);
    expect(res.body.length, `${who}'s statement for ${period}`).toBeLessThanOrEqual(1);
    return res.body[0];
  };
  const sign = async (name: string, branchId: string, seller: string, signedAt = SIGNED_AT) => {
    jobs[name] = await makeSignedJob(t, {
      branchId,
      seller: people[seller]!,
      depositAmount: '500',
      signedAt: new Date(signedAt),
    });
    expect(jobs[name]!.price).toBe('5420.00');
  };
  const completeJob = async (name: string, at: string) => {
    const job = jobs[name]!;
    const branchId = (await t.db('jobs').where({ id: job.jobId }).first('branch_id')).branch_id;
    const crew = await makeCrew(t, branchId, people.crewLead!);
    await putJobOnCrew(t, job.jobId, crew, { startOn: at.slice(0, 10) });
    // The crew's completion API (field.e2e-spec.ts) is tested there; here only the fact matters.
    await t.db('jobs').where({ id: job.jobId }).update({ status: 'completed', completed_at: at });
  };

  beforeAll(async () => {
    t = await startTestApp({
      NODE_ENV: 'test',
      TEST_NOW: SIGNED_AT,
      LOGIN_THROTTLE_LIMIT: '1000',
    });
    north = await makeBranch(t.db, { name: 'North Commission', timezone: TZ_NOTE });
    south = await makeBranch(t.db, { name: 'South Commission', timezone: TZ_NOTE });
    east = await makeBranch(t.db, { name: 'East Commission', timezone: TZ_NOTE });
    west = await makeBranch(t.db, { name: 'West Commission', timezone: TZ_NOTE });
    const roster: [string, Role, string[], string][] = [
      ['owner', 'owner', [], 'Oona Owner'],
      ['bookkeeper', 'bookkeeper', [], 'Bea Books'],
      ['managerN', 'branch_manager', [north], 'Nils Manager'],
      ['managerS', 'branch_manager', [south], 'Sade Manager'],
      ['ana', 'salesperson', [north], 'Ana Seller'],
      ['ben', 'salesperson', [north], 'Ben Seller'],
      ['cal', 'salesperson', [north], 'Cal Seller'],
      ['dee', 'salesperson', [north], 'Dee Seller'],
      ['sol', 'salesperson', [south], 'Sol Seller'],
      ['eve', 'salesperson', [east], 'Eve Seller'],
      ['wes', 'salesperson', [west], 'Wes Seller'],
      ['crewLead', 'crew_lead', [north, south, east, west], 'Cree Lead'],
    ];
    for (const [key, role, branches, name] of roster) {
      people[key] = await makeUser(t.db, role, branches, { name });
      tokens[key] = await tokenFor(t, people[key]!);
    }
  });
  afterEach(async () => {
    await expectTrialBalanceZero(t.db);
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('plans', () => {
    it('the owner sets plans; the bookkeeper reads them; nobody else changes them', async () => {
      const flat = {
        branchId: north,
        name: 'North flat',
        basis: 'net_price',
        rate: { kind: 'flat', ratePct: '8' },
        firstMilestonePct: '50',
        effectiveFrom: '2026-06-01',
      };
      const res = await as('owner').post('/api/commission-plans', flat);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ ...flat, active: true, inUse: false });
      plans.north = res.body.id;

      const margin = await as('owner').post('/api/commission-plans', {
        branchId: south,
        name: 'South margin bands',
        basis: 'gross_margin',
        rate: {
          kind: 'tiered',
          measure: 'margin_band',
          mode: 'bracket',
          tiers: [
            { from: '0', ratePct: '4' },
            { from: '30', ratePct: '6' },
            { from: '40', ratePct: '8' },
          ],
        },
        firstMilestonePct: '40',
        effectiveFrom: '2026-06-01',
      });
      expect(margin.status, JSON.stringify(margin.body)).toBe(201);
      plans.south = margin.body.id;

      const volume = await as('owner').post('/api/commission-plans', {
        branchId: east,
        name: 'East volume',
        basis: 'net_price',
        rate: {
          kind: 'tiered',
          measure: 'monthly_volume',
          mode: 'step',
          tiers: [
            { from: '0', ratePct: '5' },
            { from: '10000', ratePct: '7' },
          ],
        },
        firstMilestonePct: '50',
        effectiveFrom: '2026-06-01',
      });
      expect(volume.status, JSON.stringify(volume.body)).toBe(201);
      plans.east = volume.body.id;

      const list = await as('bookkeeper').get('/api/commission-plans');
      expect(list.status).toBe(200);
      expect(list.body.map((p: { id: string }) => p.id)).toEqual(
        expect.arrayContaining([plans.north, plans.south, plans.east]),
      );
      expect((await as('bookkeeper').post('/api/commission-plans', flat)).status).toBe(403);
      expect((await as('managerN').patch(`/api/commission-plans/${plans.north}`, { name: 'x' })).status).toBe(
        403,
      );
      expect((await as('ana').get('/api/commission-plans')).status).toBe(403);
    });

    it('refuses a malformed plan with 422 and the field at fault', async () => {
      const bad = await as('owner').post('/api/commission-plans', {
        branchId: west,
        name: 'Backwards tiers',
        basis: 'net_price',
        rate: {
          kind: 'tiered',
          measure: 'monthly_volume',
          mode: 'step',
          tiers: [
            { from: '10000', ratePct: '7' },
            { from: '5000', ratePct: '5' },
          ],
        },
        firstMilestonePct: '150',
        effectiveFrom: '2026-06-01',
      });
      expect(bad.status).toBe(422);
      expect(bad.body.code).toBe('COMMISSION.PLAN_INVALID');
      expect(bad.body.details).toEqual(
        expect.arrayContaining([
          expect.objectContaining({ field: 'firstMilestonePct' }),
          expect.objectContaining({ field: 'rate.tiers[1].from' }),
        ]),
      );
      const noKind = await as('owner').post('/api/commission-plans', {
        name: 'Nothing',
        basis: 'net_price',
        rate: { ratePct: '8' },
        firstMilestonePct: '50',
        effectiveFrom: '2026-06-01',
      });
      expect(noKind.status).toBe(422);
      expect(noKind.body.details[0].field).toBe('rate.kind');
      const badDate = await as('owner').post('/api/commission-plans', {
        name: 'Nothing',
        basis: 'net_price',
        rate: { kind: 'flat', ratePct: '8' },
        firstMilestonePct: '50',
        effectiveFrom: '2026-02-30',
      });
      expect(badDate.status).toBe(400);
      expect(badDate.body.details[0].field).toBe('effectiveFrom');
      const sameDay = await as('owner').post('/api/commission-plans', {
        branchId: north,
        name: 'North again',
        basis: 'net_price',
        rate: { kind: 'flat', ratePct: '9' },
        firstMilestonePct: '50',
        effectiveFrom: '2026-06-01',
      });
      expect(sameDay.status).toBe(409);
      expect(sameDay.body.code).toBe('COMMISSION.PLAN_DATE_TAKEN');
    });

    it('a company-wide plan applies where a branch has none; a branch plan wins over it', async () => {
      const westJob = await makeSignedJob(t, {
        branchId: west,
        seller: people.wes!,
        signedAt: new Date(SIGNED_AT),
      });
      jobs.west = westJob;
      const before = await as('managerN').get(`/api/contracts/${westJob.contractId}/commission-splits`);
      expect(before.status).toBe(404); // another branch's contract
      const none = await as('owner').get(`/api/contracts/${westJob.contractId}/commission-splits`);
      expect(none.body).toMatchObject({ plan: null, preview: null, stored: false });

      const company = await as('owner').post('/api/commission-plans', {
        branchId: null,
        name: 'Company default',
        basis: 'net_price',
        rate: { kind: 'flat', ratePct: '6' },
        firstMilestonePct: '50',
        effectiveFrom: '2026-01-01',
      });
      expect(company.status, JSON.stringify(company.body)).toBe(201);
      const west1 = await as('owner').get(`/api/contracts/${westJob.contractId}/commission-splits`);
      // 5,420.00 × 6 % = 325.20; half = 162.60
      expect(west1.body.plan).toEqual({ id: company.body.id, name: 'Company default' });
      expect(west1.body.preview).toMatchObject({
        total: '325.20',
        parts: [{ salespersonId: people.wes!.id, amount: '325.20' }],
      });
      // A north contract still reads the north plan.
      const northJob = await makeSignedJob(t, {
        branchId: north,
        seller: people.dee!,
        signedAt: new Date(SIGNED_AT),
      });
      jobs.northProbe = northJob;
      const n = await as('owner').get(`/api/contracts/${northJob.contractId}/commission-splits`);
      expect(n.body.plan.id).toBe(plans.north);
      // Switched off again so the company default earns nothing elsewhere in this run.
      const off = await as('owner').patch(`/api/commission-plans/${company.body.id}`, { active: false });
      expect(off.status).toBe(200);
      expect(off.body.active).toBe(false);
      expect(
        (await as('owner').get(`/api/contracts/${westJob.contractId}/commission-splits`)).body.plan,
      ).toBe(null);
    });
  });

  describe('earning, statements and payment', () => {
    beforeAll(async () => {
      setClock(SIGNED_AT);
      await sign('a1', north, 'ana');
      await sign('b1', north, 'ben');
      await sign('split', north, 'cal');
      await sign('noDeposit', north, 'dee'); // the deposit is asked for but never arrives
      await sign('s1', south, 'sol');
      await sign('e1', east, 'eve', '2026-07-02T14:00:00Z');
      await sign('e2', east, 'eve', '2026-07-02T15:00:00Z');
      for (const name of ['a1', 'b1', 'split', 's1', 'e1', 'e2']) {
        await markDepositReceived(t, jobs[name]!.contractId, new Date(DEPOSIT_AT));
      }
    });

    it('signs with the window of the worked example', () => {
      // REFERENCE-VALUES.md: signed Thu 2026-07-02 → last day to cancel Wed 2026-07-08 (16 CFR 429).
      expect(jobs.a1!.lastDayToCancel).toBe('2026-07-08');
    });

    it('the manager splits a contract three ways; shares must add up to 100', async () => {
      const url = `/api/contracts/${jobs.split!.contractId}/commission-splits`;
      const view = await as('managerN').get(url);
      expect(view.status).toBe(200);
      // The default until someone sets it: 100 % to the contract's salesperson; 5,420.00 × 8 % = 433.60.
      expect(view.body).toMatchObject({
        stored: false,
        earned: false,
        plan: { id: plans.north },
        splits: [{ salespersonId: people.cal!.id, sharePct: '100' }],
        preview: { total: '433.60' },
      });
      const ninety = await as('managerN').put(url, {
        splits: [
          { salespersonId: people.cal!.id, sharePct: '50' },
          { salespersonId: people.dee!.id, sharePct: '40' },
        ],
      });
      expect(ninety.status).toBe(422);
      expect(ninety.body.code).toBe('COMMISSION.SPLIT_SUM_NOT_100');
      expect(ninety.body.details).toEqual([expect.objectContaining({ field: 'splits' })]);
      const stranger = await as('managerN').put(url, {
        splits: [
          { salespersonId: people.cal!.id, sharePct: '50' },
          { salespersonId: people.sol!.id, sharePct: '50' },
        ],
      });
      expect(stranger.status).toBe(400);
      expect(stranger.body.details[0].field).toBe('splits[1].salespersonId');
      expect((await as('cal').put(url, { splits: [] })).status).toBe(403);
      expect((await as('managerS').put(url, { splits: [] })).status).toBe(404);

      const res = await as('managerN').put(url, {
        splits: [
          { salespersonId: people.cal!.id, sharePct: '33.34' },
          { salespersonId: people.dee!.id, sharePct: '33.33' },
          { salespersonId: people.managerN!.id, sharePct: '33.33' },
        ],
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      // 433.60 × 33.34 % = 144.56224 and × 33.33 % = 144.51888 (twice). Whole cents 144.56 + 144.51 + 144.51 =
      // 433.58; the 2 missing cents go to the largest remainders (.888, .888): 144.56, 144.52, 144.52.
      expect(res.body.stored).toBe(true);
      expect(res.body.preview.parts.map((p: { amount: string }) => p.amount)).toEqual([
        '144.56',
        '144.52',
        '144.52',
      ]);
    });

    it('the database keeps every split at exactly 100 %', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          await trx('contract_commission_splits')
            .where({ contract_id: jobs.split!.contractId, salesperson_id: people.cal!.id })
            .update({ share_pct: '30' });
        }),
      ).rejects.toThrow(/add up to 96\.66, not 100/);
    });

    it('earns nothing while the cancellation window is open, even with the deposit received', async () => {
      setClock(JUST_BEFORE_CLOSE);
      await run();
      for (const name of ['a1', 'b1', 'split', 's1', 'e1', 'e2', 'noDeposit']) {
        expect(await linesOf(jobs[name]!), name).toEqual([]);
      }
      const entries = await t
        .db('journal_entries')
        .whereIn(
          'contract_id',
          Object.values(jobs).map((j) => j.contractId),
        )
        .where('reason_code', 'like', 'commission.%');
      expect(entries).toEqual([]);
    });

    it('earns the first milestone once the window has closed, and posts it', async () => {
      setClock(JUST_AFTER_CLOSE);
      const result = await run();
      expect(result.failures).toEqual([]);

      // Flat 8 % of 5,420.00 = 433.60; half at the first milestone = 216.80.
      const a1 = await linesOf(jobs.a1!);
      expect(a1).toMatchObject([
        {
          salesperson_id: people.ana!.id,
          milestone: 'deposit_cleared_window_closed',
          kind: 'earning',
          amount: '216.80',
          effective_on: '2026-07-09',
          idempotency_key: `${jobs.a1!.contractId}:${people.ana!.id}:deposit_cleared_window_closed:earning`,
        },
      ]);
      expect(await entryLines(a1[0]!.journal_entry_id)).toEqual([
        {
          code: '5200',
          side: 'debit',
          amount: '216.80',
          salesperson_id: people.ana!.id,
          reason_code: 'commission.earned',
          idempotency_key: a1[0]!.idempotency_key,
          effective_on: '2026-07-09',
        },
        {
          code: '2300',
          side: 'credit',
          amount: '216.80',
          salesperson_id: people.ana!.id,
          reason_code: 'commission.earned',
          idempotency_key: a1[0]!.idempotency_key,
          effective_on: '2026-07-09',
        },
      ]);

      // The three-way split: half of 144.56 = 72.28; half of 144.52 = 72.26.
      const split = await linesOf(jobs.split!);
      expect(Object.fromEntries(split.map((l) => [l.salesperson_id, l.amount]))).toEqual({
        [people.cal!.id]: '72.28',
        [people.dee!.id]: '72.26',
        [people.managerN!.id]: '72.26',
      });

      // Margin basis, bands by bracket: margin 2,776.00 at 51.22 %. Slices 30 pts × 4 % + 10 pts × 6 % +
      // 11.22 pts × 8 % = 120 + 60 + 89.76 = 269.76 over 51.22 pts: 2,776.00 × 269.76 / 5,122 = 146.2034 →
      // 146.20. 40 % at the first milestone: 58.48 (the rest, 87.72, at completion).
      expect((await linesOf(jobs.s1!)).map((l) => l.amount)).toEqual(['58.48']);

      // Monthly volume, step tiers (0 → 5 %, 10,000 → 7 %). e1, the month's first sale: 5,420.00 → 5 % =
      // 271.00, half 135.50. e2, signed an hour later: 5,420.00 before + 5,420.00 = 10,840.00 → 7 % of
      // 5,420.00 = 379.40, half 189.70.
      expect((await linesOf(jobs.e1!)).map((l) => l.amount)).toEqual(['135.50']);
      expect((await linesOf(jobs.e2!)).map((l) => l.amount)).toEqual(['189.70']);
      const e2Split = await t
        .db('contract_commission_splits')
        .where({ contract_id: jobs.e2!.contractId })
        .first('month_volume_before', 'plan_id');
      expect(e2Split).toEqual({ month_volume_before: '5420.00', plan_id: plans.east });

      // The deposit never came: nothing, whatever the window.
      expect(await linesOf(jobs.noDeposit!)).toEqual([]);

      // Idempotent: a second run writes nothing.
      const again = await run();
      const ours = await t
        .db('commission_lines')
        .whereIn(
          'contract_id',
          Object.values(jobs).map((j) => j.contractId),
        )
        .count<{ count: string }[]>('* as count');
      expect(again.failures).toEqual([]);
      // a1, b1, s1, e1, e2, northProbe (no deposit asked: counts as received at signing), split × 3
      expect(ours[0]!.count).toBe('9');
    });

    it('a split no longer changes once a commission is earned', async () => {
      const res = await as('managerN').put(`/api/contracts/${jobs.split!.contractId}/commission-splits`, {
        splits: [{ salespersonId: people.cal!.id, sharePct: '100' }],
      });
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('COMMISSION.ALREADY_EARNED');
      await expect(
        t.db('contract_commission_splits').where({ contract_id: jobs.split!.contractId }).delete(),
      ).rejects.toThrow(/its split is kept/);
    });

    it('commission lines are never changed or deleted', async () => {
      const [line] = await linesOf(jobs.a1!);
      await expect(
        t.db('commission_lines').where({ idempotency_key: line!.idempotency_key }).update({ amount: '1.00' }),
      ).rejects.toThrow(/never changes/);
      await expect(
        t.db('commission_lines').where({ idempotency_key: line!.idempotency_key }).delete(),
      ).rejects.toThrow(/never deleted/);
    });

    it('builds the first half of July into draft statements', async () => {
      setClock('2026-07-16T14:00:00Z');
      const res = await as('bookkeeper').post('/api/commission-statements/build?period=2026-07-15');
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.period).toEqual({ start: '2026-07-01', end: '2026-07-15' });
      const ana = await statementFor('ana', '2026-07-01');
      expect(ana).toMatchObject({
        branchId: north,
        periodStart: '2026-07-01',
        periodEnd: '2026-07-15',
        status: 'draft',
        earned: '216.80',
        clawedBack: '0.00',
        carriedIn: '0.00',
        net: '216.80',
        payable: '216.80',
        lineCount: 1,
      });
      statementIds.ana1 = ana.id;
      statementIds.ben1 = (await statementFor('ben', '2026-07-01')).id;
      statementIds.sol1 = (await statementFor('sol', '2026-07-01')).id;
      // Eve: 135.50 + 189.70 = 325.20 on one statement.
      expect(await statementFor('eve', '2026-07-01')).toMatchObject({ earned: '325.20', lineCount: 2 });
      // Building again places nothing new.
      const again = await as('bookkeeper').post('/api/commission-statements/build?period=2026-07-15');
      expect(again.body.linesPlaced).toBe(0);
    });

    it('shows each person only what is theirs', async () => {
      const detail = await as('ana').get(`/api/commission-statements/${statementIds.ana1}`);
      expect(detail.status).toBe(200);
      expect(detail.body.lines).toEqual([
        expect.objectContaining({
          contractId: jobs.a1!.contractId,
          leadId: jobs.a1!.leadId,
          homeownerName: jobs.a1!.homeownerName,
          milestone: 'deposit_cleared_window_closed',
          kind: 'earning',
          amount: '216.80',
        }),
      ]);
      const own = await as('ana').get('/api/commission-statements');
      expect(own.body.map((s: { salespersonId: string }) => s.salespersonId)).toEqual([people.ana!.id]);
      expect((await as('ana').get(`/api/commission-statements/${statementIds.ben1}`)).status).toBe(404);
      const asked = await as('ana').get(`/api/commission-statements?salespersonId=${people.ben!.id}`);
      expect(asked.body).toEqual([]);

      const branch = await as('managerN').get('/api/commission-statements');
      expect(new Set(branch.body.map((s: { branchId: string }) => s.branchId))).toEqual(new Set([north]));
      expect((await as('managerN').get(`/api/commission-statements/${statementIds.sol1}`)).status).toBe(404);
      expect((await as('managerN').get(`/api/commission-statements/${statementIds.ben1}`)).status).toBe(200);
      expect(
        (await as('managerN').post(`/api/commission-statements/${statementIds.ben1}/approve`)).status,
      ).toBe(403);
      expect((await as('ana').post('/api/commissions/run')).status).toBe(403);
      expect((await as('managerN').post('/api/commission-statements/build?period=2026-07-15')).status).toBe(
        403,
      );
      expect((await as('crewLead').get('/api/commission-statements')).status).toBe(403);

      const all = await as('bookkeeper').get('/api/commission-statements?period=2026-07-10');
      const branches = new Set(all.body.map((s: { branchId: string }) => s.branchId));
      expect(branches.has(north) && branches.has(south) && branches.has(east)).toBe(true);
    });

    it('approves and pays: commissions payable / bank; then the statement is locked', async () => {
      const notYet = await as('bookkeeper').post(`/api/commission-statements/${statementIds.ana1}/pay`, {
        paidOn: '2026-07-17',
      });
      expect(notYet.status).toBe(409);
      expect(notYet.body.code).toBe('COMMISSION.STATEMENT_NOT_APPROVED');

      for (const key of ['ana1', 'ben1']) {
        const approved = await as('bookkeeper').post(
          `/api/commission-statements/${statementIds[key]}/approve`,
        );
        expect(approved.status, JSON.stringify(approved.body)).toBe(200);
        expect(approved.body.status).toBe('approved');
        expect(approved.body.approvedByName).toBe('Bea Books');
      }
      const paid = await as('bookkeeper').post(`/api/commission-statements/${statementIds.ana1}/pay`, {
        paidOn: '2026-07-17',
        reference: 'Cheque 1042',
      });
      expect(paid.status, JSON.stringify(paid.body)).toBe(200);
      expect(paid.body).toMatchObject({ status: 'paid', paidOn: '2026-07-17', paidReference: 'Cheque 1042' });
      const posting = await entryLines(paid.body.paidJournalEntryId);
      expect(
        posting.map(({ code, side, amount, salesperson_id }) => ({ code, side, amount, salesperson_id })),
      ).toEqual([
        { code: '2300', side: 'debit', amount: '216.80', salesperson_id: people.ana!.id },
        { code: '1010', side: 'credit', amount: '216.80', salesperson_id: null },
      ]);
      expect(posting[0]).toMatchObject({ reason_code: 'commission.paid', effective_on: '2026-07-17' });
      const benPaid = await as('bookkeeper').post(`/api/commission-statements/${statementIds.ben1}/pay`, {
        paidOn: '2026-07-17',
      });
      expect(benPaid.status).toBe(200);

      const twice = await as('bookkeeper').post(`/api/commission-statements/${statementIds.ana1}/pay`, {
        paidOn: '2026-07-18',
      });
      expect(twice.status).toBe(409);
      expect(twice.body.code).toBe('COMMISSION.STATEMENT_LOCKED');
      const reapprove = await as('bookkeeper').post(
        `/api/commission-statements/${statementIds.ana1}/approve`,
      );
      expect(reapprove.status).toBe(409);
      await expect(
        t
          .db('commission_statements')
          .where({ id: statementIds.ana1 })
          .update({ earned: '0', net: '0', payable: '0' }),
      ).rejects.toThrow(/locked/);
    });

    it('claws back after a cancellation, into the next statement, and carries the shortfall forward', async () => {
      // Ben's contract is cancelled on 07-18 after his 07-01 statement was paid (written straight to the
      // contract: the staff cancellation route is the signing tests' business).
      await t
        .db('contracts')
        .where({ id: jobs.b1!.contractId })
        .update({ cancelled_at: '2026-07-18T14:00:00Z', cancelled_by_kind: 'staff' });
      setClock('2026-07-19T14:00:00Z');
      await run();
      const lines = await linesOf(jobs.b1!);
      const claw = lines.find((l) => l.kind === 'clawback')!;
      // Equal and opposite to what was earned: 216.80, dated the day of the cancellation.
      expect(claw).toMatchObject({
        salesperson_id: people.ben!.id,
        milestone: 'deposit_cleared_window_closed',
        amount: '216.80',
        effective_on: '2026-07-18',
      });
      const posting = await entryLines(claw.journal_entry_id);
      expect(posting.map(({ code, side, amount }) => ({ code, side, amount }))).toEqual([
        { code: '2300', side: 'debit', amount: '216.80' },
        { code: '5200', side: 'credit', amount: '216.80' },
      ]);
      expect(posting[0]!.reason_code).toBe('commission.clawback');
      const again = await run();
      expect(again.failures).toEqual([]);
      expect(await linesOf(jobs.b1!)).toHaveLength(2);

      await as('bookkeeper').post('/api/commission-statements/build?period=2026-07-31');
      const ben2 = await statementFor('ben', '2026-07-16');
      // Nothing earned, 216.80 clawed back: net −216.80, nothing to pay, −216.80 carried forward.
      expect(ben2).toMatchObject({
        earned: '0.00',
        clawedBack: '216.80',
        carriedIn: '0.00',
        net: '-216.80',
        payable: '0.00',
        carriedOut: '-216.80',
      });
      expect((await as('bookkeeper').post(`/api/commission-statements/${ben2.id}/approve`)).status).toBe(200);
      const zero = await as('bookkeeper').post(`/api/commission-statements/${ben2.id}/pay`, {
        paidOn: '2026-08-03',
      });
      expect(zero.status).toBe(200);
      // A statement that pays 0.00 posts nothing.
      expect(zero.body).toMatchObject({ status: 'paid', paidJournalEntryId: null });
    });

    it('a later earning absorbs the carried shortfall', async () => {
      setClock('2026-08-03T15:00:00Z');
      await sign('b2', north, 'ben', '2026-08-03T15:00:00Z'); // Mon 08-03 → last day Thu 08-06
      expect(jobs.b2!.lastDayToCancel).toBe('2026-08-06');
      await markDepositReceived(t, jobs.b2!.contractId, new Date('2026-08-03T16:00:00Z'));
      setClock('2026-08-07T14:00:00Z');
      await run();
      expect((await linesOf(jobs.b2!)).map((l) => [l.amount, l.effective_on])).toEqual([
        ['216.80', '2026-08-07'],
      ]);
      setClock('2026-08-16T14:00:00Z');
      await as('bookkeeper').post('/api/commission-statements/build?period=2026-08-15');
      // Carried in −216.80 + earned 216.80 = net 0.00: nothing to pay.
      expect(await statementFor('ben', '2026-08-01')).toMatchObject({
        carriedIn: '-216.80',
        earned: '216.80',
        net: '0.00',
        payable: '0.00',
      });
      // The ledger agrees: Ben's commissions payable nets to zero (216.80 + 216.80 earned − 216.80 paid −
      // 216.80 clawed back).
      const bal = await t
        .db('journal_lines as l')
        .join('ledger_accounts as a', 'a.id', 'l.account_id')
        .where({ 'a.code': '2300', 'l.salesperson_id': people.ben!.id })
        .first(
          t.db.raw(
            `coalesce(sum(case when l.side = 'credit' then l.amount else -l.amount end), 0)::text as balance`,
          ),
        );
      expect(bal.balance).toBe('0.00');
    });

    it('earns the rest at completion and puts it on the statement of its period', async () => {
      await completeJob('a1', '2026-07-20T18:00:00Z');
      setClock('2026-08-16T15:00:00Z');
      await run();
      const a1 = await linesOf(jobs.a1!);
      expect(a1.map((l) => [l.milestone, l.amount, l.effective_on])).toEqual([
        ['deposit_cleared_window_closed', '216.80', '2026-07-09'],
        // the other half of 433.60, dated the day the job was completed
        ['job_completed', '216.80', '2026-07-20'],
      ]);
      await as('bookkeeper').post('/api/commission-statements/build?period=2026-08-15');
      expect(await statementFor('ana', '2026-07-16')).toMatchObject({
        status: 'draft',
        earned: '216.80',
        payable: '216.80',
      });
    });

    it('claws back after a refund of everything paid, even without a cancellation', async () => {
      // The deposit recorded and then refunded in full (rows as the payments module writes them).
      const ledger = t.app.get(LedgerService);
      const s1 = jobs.s1!;
      const paid = await ledger.post(depositReceivedToBank({ amount: '500.00', method: 'cheque' }), {
        branchId: south,
        idempotencyKey: `commission-test:${s1.contractId}:deposit`,
        source: { kind: 'user', userId: people.bookkeeper!.id },
        effectiveOn: '2026-07-02',
        contractId: s1.contractId,
      });
      const [payment] = await t
        .db('payments')
        .insert({
          contract_id: s1.contractId,
          branch_id: south,
          kind: 'deposit',
          method: 'cheque',
          amount: '500.00',
          net: '500.00',
          received_on: '2026-07-02',
          recorded_by: people.bookkeeper!.id,
          journal_entry_id: paid.entry.id,
        })
        .returning('id');
      const refund = await ledger.post(refundAfterCancellation({ amount: '500.00', via: 'bank' }), {
        branchId: south,
        idempotencyKey: `commission-test:${s1.contractId}:refund`,
        source: { kind: 'user', userId: people.bookkeeper!.id },
        effectiveOn: '2026-08-17',
        contractId: s1.contractId,
      });
      await t.db('refunds').insert({
        contract_id: s1.contractId,
        branch_id: south,
        payment_id: payment.id,
        amount: '500.00',
        status: 'succeeded',
        refunded_on: '2026-08-17',
        requested_by: people.bookkeeper!.id,
        journal_entry_id: refund.entry.id,
        created_at: '2026-08-17T15:00:00Z',
      });
      setClock('2026-08-18T15:00:00Z');
      await run();
      expect((await linesOf(jobs.s1!)).map((l) => [l.kind, l.amount, l.effective_on])).toEqual([
        ['clawback', '58.48', '2026-08-17'],
        ['earning', '58.48', '2026-07-09'],
      ]);
    });
  });

  describe('the schedule (pg-boss)', () => {
    const schedulerEnv = {
      NODE_ENV: 'test',
      TEST_NOW: '2026-09-01T15:00:00Z',
      LOGIN_THROTTLE_LIMIT: '1000',
      COMMISSIONS_SCHEDULER: 'on',
      COMMISSIONS_EARNING_CRON: '* * * * *',
      COMMISSIONS_SCHEDULER_POLL_SECONDS: '1',
    };
    const minute = (ms: number) => Math.floor(ms / 60_000);
    const until = async (what: () => Promise<boolean> | boolean, timeoutMs: number) => {
      const end = Date.now() + timeoutMs;
      while (Date.now() < end) {
        if (await what()) return;
        await new Promise((r) => setTimeout(r, 250));
      }
      throw new Error('timed out');
    };

    it('two app instances on one database run the scheduled check once per tick, and it earns', async () => {
      // Due when the schedule fires: e1's job completed (e1's rest: 271.00 − 135.50 = 135.50).
      await completeJob('e1', '2026-08-20T15:00:00Z');
      const apps = [await startTestApp(schedulerEnv), await startTestApp(schedulerEnv)];
      const calls: { app: number; at: number }[] = [];
      try {
        apps.forEach((app, i) => {
          const service = app.app.get(CommissionsService);
          const original = service.runEarning.bind(service);
          service.runEarning = async (asOf?: Date) => {
            calls.push({ app: i, at: Date.now() });
            return original(asOf);
          };
        });
        // Two ticks of the every-minute schedule, while both instances look for due work every second.
        await until(() => new Set(calls.map((c) => minute(c.at))).size >= 2, 140_000);
        await new Promise((r) => setTimeout(r, 3_000));
        const perMinute = new Map<number, number>();
        for (const c of calls) perMinute.set(minute(c.at), (perMinute.get(minute(c.at)) ?? 0) + 1);
        expect(perMinute.size).toBeGreaterThanOrEqual(2);
        expect([...perMinute.values()], JSON.stringify(calls)).toEqual([...perMinute.keys()].map(() => 1));
        const e1 = await linesOf(jobs.e1!);
        expect(e1.map((l) => [l.milestone, l.amount])).toEqual([
          ['deposit_cleared_window_closed', '135.50'],
          ['job_completed', '135.50'],
        ]);
        const schedules = await t.db.raw(`select name, cron from ${PGBOSS_SCHEMA}.schedule`);
        expect(schedules.rows).toEqual([{ name: EARNING_QUEUE, cron: '* * * * *' }]);
      } finally {
        for (const app of apps) await app.close();
      }
    }, 180_000);

    it('the schedule survives a restart: a new pg-boss, which schedules nothing, still gets the job', async () => {
      // Everyone stopped: the schedule is still in the database.
      const stored = await t.db.raw(`select name, cron, timezone from ${PGBOSS_SCHEMA}.schedule`);
      expect(stored.rows).toEqual([{ name: EARNING_QUEUE, cron: '* * * * *', timezone: 'UTC' }]);

      // e2's job completed meanwhile: its rest (379.40 − 189.70 = 189.70) is due.
      await completeJob('e2', '2026-08-21T15:00:00Z');
      setClock('2026-09-01T15:00:00Z');
      const boss = new PgBoss({
        host: pg.host,
        port: pg.port,
        user: pg.user,
        password: pg.password,
        database: inject('databaseName'),
        schema: PGBOSS_SCHEMA,
        cronMonitorIntervalSeconds: 1,
        cronWorkerIntervalSeconds: 1,
      });
      const service = t.app.get(CommissionsService);
      let ran = 0;
      try {
        await boss.start();
        await boss.work(EARNING_QUEUE, { pollingIntervalSeconds: 1 }, async () => {
          ran += 1;
          await service.runEarning();
        });
        await until(() => ran > 0, 75_000);
        await until(async () => (await linesOf(jobs.e2!)).length === 2, 10_000);
        expect((await linesOf(jobs.e2!)).map((l) => [l.milestone, l.amount])).toEqual([
          ['deposit_cleared_window_closed', '189.70'],
          ['job_completed', '189.70'],
        ]);
      } finally {
        await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
      }
    }, 120_000);

    it('approves statements in order: a later one waits for the earlier draft', async () => {
      // passport keeps one 'jwt' strategy per process: the last app started (the closed scheduler apps)
      // owns it. A fresh app owns it again.
      await t.close();
      t = await startTestApp({
        NODE_ENV: 'test',
        TEST_NOW: '2026-09-01T15:00:00Z',
        LOGIN_THROTTLE_LIMIT: '1000',
      });
      for (const key of Object.keys(people)) tokens[key] = await tokenFor(t, people[key]!);
      setClock('2026-09-01T15:00:00Z');
      await as('bookkeeper').post('/api/commission-statements/build?period=2026-08-31');
      // e1's rest (135.50, 08-20) and e2's (189.70, 08-21): 325.20 on Eve's 08-16 statement.
      const later = await statementFor('eve', '2026-08-16');
      expect(later).toMatchObject({
        status: 'draft',
        earned: '325.20',
        carriedIn: '0.00',
        payable: '325.20',
      });
      const early = await statementFor('eve', '2026-07-01');
      const refused = await as('bookkeeper').post(`/api/commission-statements/${later.id}/approve`);
      expect(refused.status).toBe(409);
      expect(refused.body.code).toBe('COMMISSION.EARLIER_STATEMENT_OPEN');
      expect((await as('bookkeeper').post(`/api/commission-statements/${early.id}/approve`)).status).toBe(
        200,
      );
      expect((await as('bookkeeper').post(`/api/commission-statements/${later.id}/approve`)).status).toBe(
        200,
      );
    });
  });
});
