import { randomBytes, randomUUID } from 'node:crypto';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import {
  abilityFromRules,
  ACCOUNTS,
  balancePaidByCard,
  CHART_OF_ACCOUNTS,
  commissionEarned,
  depositCapturedByCard,
  depositReceivedToBank,
  jobCompleted,
  processorPayout,
  type Posting,
  type Role,
} from '@loambook/common';
import { parse } from 'csv-parse/sync';
import type { SessionUser } from '../src/auth/session-user';
import { DomainError } from '../src/common/domain-error';
import { LedgerService, type PostContext } from '../src/ledger/ledger.service';
import { expectTrialBalanceZero } from './support/ledger-assertions';
import { makeLead } from './support/proposal-fixtures';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

/** A key nobody else in the run uses (idempotency keys are unique across the whole ledger). */
const run = randomBytes(4).toString('hex');
const key = (name: string) => `ledger-test:${run}:${name}`;

describe('the double-entry ledger', () => {
  let t: TestApp;
  let ledger: LedgerService;
  let north: string;
  let south: string;
  let east: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  /** north's account ids by code */
  const acct: Record<string, string> = {};
  const southAcct: Record<string, string> = {};

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
    };
  };

  const ctx = (
    branchId: string,
    name: string,
    effectiveOn: string,
    extra: Partial<PostContext> = {},
  ): PostContext => ({
    branchId,
    idempotencyKey: key(name),
    source: { kind: 'event', ref: `evt_${run}_${name}` },
    effectiveOn,
    ...extra,
  });

  const accountsOf = async (branchId: string) =>
    Object.fromEntries(
      (
        (await t.db('ledger_accounts').where({ branch_id: branchId }).select('id', 'code')) as {
          id: string;
          code: string;
        }[]
      ).map((r) => [r.code, r.id]),
    );

  /** Writes an entry and its lines straight to the database, as a script or a bug would. */
  const rawEntry = async (
    trx: Knex.Transaction,
    branchId: string,
    name: string,
    reasonCode = 'deposit.bank',
  ) => {
    const [row] = await trx('journal_entries')
      .insert({
        branch_id: branchId,
        reason_code: reasonCode,
        source_kind: 'system',
        source_ref: 'ledger-test',
        idempotency_key: key(name),
        effective_on: '2026-12-01',
      })
      .returning('id');
    return row.id as string;
  };
  const rawLine = (
    entryId: string,
    branchId: string,
    accountId: string,
    side: string,
    amount: string,
    position: number,
  ) => ({
    entry_id: entryId,
    branch_id: branchId,
    account_id: accountId,
    side,
    amount,
    position,
  });

  beforeAll(async () => {
    t = await startTestApp();
    ledger = t.app.get(LedgerService);
    north = await makeBranch(t.db, { name: 'North Ledger' });
    south = await makeBranch(t.db, { name: 'South Ledger' });
    east = await makeBranch(t.db, { name: 'East Ledger' });
    const roster: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['northManager', 'branch_manager', [north]],
      ['northSales', 'salesperson', [north]],
      ['crewLead', 'crew_lead', [north]],
    ];
    for (const [k, role, branches] of roster) {
      people[k] = await makeUser(t.db, role, branches, { name: k });
      tokens[k] = await tokenFor(t, people[k]!);
    }
    Object.assign(acct, await accountsOf(north));
    Object.assign(southAcct, await accountsOf(south));

    // North's month, hand-checked below: a $4,000 job with a $1,000 card deposit. Fees follow Stripe's
    // standard US card price, 2.9% + 30¢ (Stripe pricing page, memory): 1000 → 29.30, 3000 → 87.30.
    const sale: [string, Posting, string][] = [
      ['n-deposit', depositCapturedByCard({ gross: '1000.00', fee: '29.30' }), '2026-12-01'],
      ['n-payout', processorPayout({ amount: '970.70' }), '2026-12-03'],
      ['n-complete', jobCompleted({ contractPrice: '4000.00', depositsHeld: '1000.00' }), '2026-12-10'],
      ['n-balance', balancePaidByCard({ gross: '3000.00', fee: '87.30' }), '2026-12-12'],
      [
        'n-commission',
        commissionEarned({ amount: '296.40', salespersonId: people.northSales!.id }),
        '2026-12-15',
      ],
    ];
    for (const [name, posting, day] of sale) await ledger.post(posting, ctx(north, name, day));
    await ledger.post(depositReceivedToBank({ amount: '500.00', method: 'cheque' }), {
      ...ctx(south, 's-deposit', '2026-12-02'),
      source: { kind: 'user', userId: people.bookkeeper!.id },
    });
  });
  afterEach(() => expectTrialBalanceZero(t.db));
  afterAll(() => t.close());

  describe('chart of accounts', () => {
    it('opens the chart of common/src/ledger for every new branch (a trigger on branches)', async () => {
      const rows = (await t
        .db('ledger_accounts')
        .where({ branch_id: east })
        .orderBy('code')
        .select('code', 'name', 'type', 'normal_side', 'salesperson_subledger')) as Record<string, unknown>[];
      expect(rows).toEqual(
        [...CHART_OF_ACCOUNTS]
          .sort((a, b) => a.code.localeCompare(b.code))
          .map((a) => ({
            code: a.code,
            name: a.name,
            type: a.type,
            normal_side: a.normalSide,
            salesperson_subledger: a.salespersonSubledger,
          })),
      );
    });

    it('keeps an account: no change of meaning, no delete while its branch exists; an unused branch still goes', async () => {
      await expect(
        t.db('ledger_accounts').where({ id: acct[ACCOUNTS.bank] }).update({ type: 'expense' }),
      ).rejects.toThrow(/keeps its branch, code, type and side/);
      await expect(t.db('ledger_accounts').where({ id: acct[ACCOUNTS.bank] }).delete()).rejects.toThrow(
        /only with their branch/,
      );
      const spare = await makeBranch(t.db, { name: 'Spare' });
      expect(Object.keys(await accountsOf(spare))).toHaveLength(CHART_OF_ACCOUNTS.length);
      await t.db('branches').where({ id: spare }).delete();
      expect(await accountsOf(spare)).toEqual({});
      // A branch with entries cannot go: the entries hold it.
      await expect(t.db('branches').where({ id: north }).delete()).rejects.toThrow(
        /foreign key|ledger accounts/,
      );
    });

    it('lists a branch’s accounts over HTTP', async () => {
      const res = await as('bookkeeper').get(`/api/ledger/accounts?branchId=${north}`);
      expect(res.status).toBe(200);
      expect(res.body.map((a: { code: string }) => a.code)).toEqual(
        CHART_OF_ACCOUNTS.map((a) => a.code).sort(),
      );
      expect(res.body[0]).toMatchObject({
        branchId: north,
        code: '1010',
        type: 'asset',
        normalSide: 'debit',
      });
      expect((await as('bookkeeper').get('/api/ledger/accounts')).status).toBe(400);
      expect((await as('bookkeeper').get(`/api/ledger/accounts?branchId=${randomUUID()}`)).status).toBe(404);
    });
  });

  describe('what the database refuses', () => {
    it('checks entries by index at any table size (its trigger functions never plan a sequential scan)', async () => {
      // A session keeps a PL/pgSQL function's plans: one made on small tables (a sequential scan) would
      // read every line at each commit as the ledger grows (migration 20261203600000).
      const { rows } = await t.db.raw(
        `select proname, coalesce(array_to_string(proconfig, ','), '') as config from pg_proc
         where proname in ('journal_lines_guard', 'journal_entry_check') order by proname`,
      );
      expect(rows).toEqual([
        { proname: 'journal_entry_check', config: 'enable_seqscan=off' },
        { proname: 'journal_lines_guard', config: 'enable_seqscan=off' },
      ]);
    });

    it('refuses an unbalanced entry at commit, not before (a deferred constraint trigger)', async () => {
      let inserted = false;
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'unbalanced');
          await trx('journal_lines').insert([
            rawLine(id, north, acct[ACCOUNTS.bank]!, 'debit', '100.00', 1),
            rawLine(id, north, acct[ACCOUNTS.customerDeposits]!, 'credit', '99.99', 2),
          ]);
          inserted = true; // the statements themselves went through
        }),
      ).rejects.toThrow(/does not balance: debits 100\.00, credits 99\.99/);
      expect(inserted).toBe(true);
      expect(
        await t
          .db('journal_entries')
          .where({ idempotency_key: key('unbalanced') })
          .first(),
      ).toBeUndefined();
    });

    it('refuses an entry with one line, and an entry with none', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'one-line');
          await trx('journal_lines').insert(rawLine(id, north, acct[ACCOUNTS.bank]!, 'debit', '5.00', 1));
        }),
      ).rejects.toThrow(/has 1 line\(s\)/);
      await expect(t.db.transaction((trx) => rawEntry(trx, north, 'no-lines'))).rejects.toThrow(
        /has 0 line\(s\)/,
      );
    });

    it('refuses a zero or negative amount (check constraint)', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'zero');
          await trx('journal_lines').insert([
            rawLine(id, north, acct[ACCOUNTS.bank]!, 'debit', '0.00', 1),
            rawLine(id, north, acct[ACCOUNTS.customerDeposits]!, 'credit', '0.00', 2),
          ]);
        }),
      ).rejects.toThrow(/check constraint/);
    });

    it('commits a balanced entry written in any order inside its transaction', async () => {
      const id = await t.db.transaction(async (trx) => {
        const id = await rawEntry(trx, south, 'raw-balanced');
        await trx('journal_lines').insert(
          rawLine(id, south, southAcct[ACCOUNTS.customerDeposits]!, 'credit', '0.10', 1),
        );
        await trx('journal_lines').insert(rawLine(id, south, southAcct[ACCOUNTS.bank]!, 'debit', '0.07', 2));
        await trx('journal_lines').insert(rawLine(id, south, southAcct[ACCOUNTS.bank]!, 'debit', '0.03', 3));
        return id;
      });
      expect(await t.db('journal_lines').where({ entry_id: id }).count({ n: '*' })).toEqual([{ n: '3' }]);
    });

    it('refuses UPDATE and DELETE of posted lines and entries, and TRUNCATE (restrict_violation)', async () => {
      const entry = await t
        .db('journal_entries')
        .where({ idempotency_key: key('n-deposit') })
        .first('id');
      const line = await t.db('journal_lines').where({ entry_id: entry.id }).first('id');
      const refused = async (q: Promise<unknown>) => {
        const err = (await q.then(
          () => null,
          (e: unknown) => e,
        )) as { code?: string; message?: string } | null;
        expect(err?.code, err?.message).toBe('23001'); // restrict_violation
        expect(err?.message).toMatch(/never changed or deleted: post a reversing entry/);
      };
      await refused(t.db('journal_lines').where({ id: line.id }).update({ amount: '1.00' }));
      await refused(t.db('journal_lines').where({ id: line.id }).delete());
      await refused(t.db('journal_entries').where({ id: entry.id }).update({ memo: 'edited' }));
      await refused(t.db('journal_entries').where({ id: entry.id }).delete());
      await refused(t.db.raw('truncate journal_lines cascade'));
      const after = await t.db('journal_lines').where({ id: line.id }).first('amount');
      expect(after.amount).toBe('970.70');
    });

    it('refuses a line on another branch’s account, and a line whose branch is not its entry’s', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'cross-account');
          await trx('journal_lines').insert([
            rawLine(id, north, southAcct[ACCOUNTS.bank]!, 'debit', '10.00', 1),
            rawLine(id, north, acct[ACCOUNTS.customerDeposits]!, 'credit', '10.00', 2),
          ]);
        }),
      ).rejects.toThrow(/journal_lines_account_id_branch_id_fkey/);
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'cross-line');
          await trx('journal_lines').insert([
            rawLine(id, south, southAcct[ACCOUNTS.bank]!, 'debit', '10.00', 1),
            rawLine(id, south, southAcct[ACCOUNTS.customerDeposits]!, 'credit', '10.00', 2),
          ]);
        }),
      ).rejects.toThrow(/journal_lines_entry_id_branch_id_fkey/);
    });

    it('refuses lines added to an entry posted in an earlier transaction, even a balanced pair', async () => {
      const entry = await t
        .db('journal_entries')
        .where({ idempotency_key: key('n-payout') })
        .first('id');
      await expect(
        t
          .db('journal_lines')
          .insert([
            rawLine(entry.id, north, acct[ACCOUNTS.bank]!, 'debit', '1.00', 10),
            rawLine(entry.id, north, acct[ACCOUNTS.processorClearing]!, 'credit', '1.00', 11),
          ]),
      ).rejects.toThrow(/only when it is posted/);
    });

    it('refuses a commission line with no salesperson (the sub-ledger)', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          const id = await rawEntry(trx, north, 'no-salesperson', 'commission.earned');
          await trx('journal_lines').insert([
            rawLine(id, north, acct[ACCOUNTS.commissionExpense]!, 'debit', '10.00', 1),
            rawLine(id, north, acct[ACCOUNTS.commissionsPayable]!, 'credit', '10.00', 2),
          ]);
        }),
      ).rejects.toThrow(/names the salesperson/);
    });

    it('refuses a reversal that does not mirror its original, and one of another branch', async () => {
      const original = await t
        .db('journal_entries')
        .where({ idempotency_key: key('n-payout') })
        .first('id');
      await expect(
        t.db.transaction(async (trx) => {
          const [row] = await trx('journal_entries')
            .insert({
              branch_id: north,
              reason_code: 'reversal',
              reverses_entry_id: original.id,
              source_kind: 'system',
              source_ref: 'ledger-test',
              idempotency_key: key('bad-reversal'),
              effective_on: '2026-12-04',
            })
            .returning('id');
          // 970.70 was the payout; this "reversal" undoes only 900.00 of it
          await trx('journal_lines').insert([
            rawLine(row.id, north, acct[ACCOUNTS.processorClearing]!, 'debit', '900.00', 1),
            rawLine(row.id, north, acct[ACCOUNTS.bank]!, 'credit', '900.00', 2),
          ]);
        }),
      ).rejects.toThrow(/does not mirror the entry it reverses/);
      await expect(
        t.db.transaction(async (trx) => {
          await trx('journal_entries').insert({
            branch_id: south,
            reason_code: 'reversal',
            reverses_entry_id: original.id,
            source_kind: 'system',
            source_ref: 'ledger-test',
            idempotency_key: key('cross-reversal'),
            effective_on: '2026-12-04',
          });
        }),
      ).rejects.toThrow(/journal_entries_reverses_entry_id_branch_id_fkey/);
    });
  });

  describe('posting through the service', () => {
    it('posts a key once: the second call returns the same entry and writes nothing', async () => {
      const posting = depositCapturedByCard({ gross: '250.00', fee: '7.55' }); // 250 × 2.9% + 0.30 = 7.55
      const before = await t.db('journal_lines').count({ n: '*' });
      const first = await ledger.post(posting, ctx(south, 'twice', '2026-12-05'));
      const second = await ledger.post(posting, ctx(south, 'twice', '2026-12-05'));
      expect(first.created).toBe(true);
      expect(second.created).toBe(false);
      expect(second.entry.id).toBe(first.entry.id);
      const after = await t.db('journal_lines').count({ n: '*' });
      expect(Number(after[0]!.n) - Number(before[0]!.n)).toBe(3);
      expect(first.entry).toMatchObject({ reasonCode: 'deposit.card', total: '250.00', sourceKind: 'event' });
      expect(first.entry.lines.map((l) => [l.accountCode, l.side, l.amount])).toEqual([
        [ACCOUNTS.processorClearing, 'debit', '242.45'],
        [ACCOUNTS.processingFees, 'debit', '7.55'],
        [ACCOUNTS.customerDeposits, 'credit', '250.00'],
      ]);
    });

    it('posts a key once when two deliveries race', async () => {
      const posting = processorPayout({ amount: '12.34' });
      const results = await Promise.all([
        ledger.post(posting, ctx(south, 'race', '2026-12-06')),
        ledger.post(posting, ctx(south, 'race', '2026-12-06')),
        ledger.post(posting, ctx(south, 'race', '2026-12-06')),
      ]);
      expect(results.filter((r) => r.created)).toHaveLength(1);
      expect(new Set(results.map((r) => r.entry.id)).size).toBe(1);
      expect(
        await t
          .db('journal_entries')
          .where({ idempotency_key: key('race') })
          .count({ n: '*' }),
      ).toEqual([{ n: '1' }]);
    });

    it('refuses a different posting under a used key (409), an unbalanced one (422) and a bare reversal', async () => {
      const err = (p: Promise<unknown>) =>
        p.then(
          () => null,
          (e: unknown) => e as DomainError,
        );
      const reused = await err(
        ledger.post(processorPayout({ amount: '1.00' }), ctx(north, 'n-payout', '2026-12-03')),
      );
      expect(reused).toMatchObject({ kind: 'conflict', code: 'LEDGER.KEY_REUSED' });
      const unbalanced: Posting = {
        reasonCode: 'deposit.bank',
        memo: 'by hand',
        lines: [
          { account: ACCOUNTS.bank, side: 'debit', amount: '10.00' },
          { account: ACCOUNTS.customerDeposits, side: 'credit', amount: '10.01' },
        ],
      };
      expect(await err(ledger.post(unbalanced, ctx(north, 'svc-unbalanced', '2026-12-03')))).toMatchObject({
        kind: 'rule',
        code: 'LEDGER.UNBALANCED',
      });
      expect(
        await err(
          ledger.post({ ...unbalanced, reasonCode: 'reversal' }, ctx(north, 'svc-reversal', '2026-12-03')),
        ),
      ).toMatchObject({ code: 'LEDGER.REVERSAL_NEEDS_ORIGINAL' });
    });

    it('rolls back with the caller’s transaction', async () => {
      await expect(
        t.db.transaction(async (trx) => {
          await ledger.post(
            processorPayout({ amount: '5.00' }),
            ctx(south, 'rolled-back', '2026-12-06'),
            trx,
          );
          throw new Error('the caller failed later');
        }),
      ).rejects.toThrow('the caller failed later');
      expect(
        await t
          .db('journal_entries')
          .where({ idempotency_key: key('rolled-back') })
          .first(),
      ).toBeUndefined();
    });

    it('refuses to name a lead of another branch', async () => {
      const southLead = await makeLead(t.db, south, null);
      const res = await ledger
        .post(
          processorPayout({ amount: '5.00' }),
          ctx(north, 'other-lead', '2026-12-06', { leadId: southLead }),
        )
        .catch((e: unknown) => e);
      expect(res).toMatchObject({ kind: 'rule', code: 'LEDGER.RECORD_OUTSIDE_BRANCH' });
      const ok = await ledger.post(
        processorPayout({ amount: '5.00' }),
        ctx(south, 'own-lead', '2026-12-06', { leadId: southLead }),
      );
      expect(ok.entry.leadId).toBe(southLead);
    });
  });

  describe('reversal', () => {
    it('posts the mirror entry naming the original; the pair nets to zero on every account; once only', async () => {
      const { entry: original } = await ledger.post(
        commissionEarned({ amount: '120.00', salespersonId: people.northSales!.id }),
        ctx(east, 'to-reverse', '2026-12-08'),
      );
      const res = await as('bookkeeper').post(`/api/ledger/entries/${original.id}/reverse`, {
        reason: 'Earned on the wrong contract',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        reasonCode: 'reversal',
        reversesEntryId: original.id,
        branchId: east,
        sourceKind: 'user',
        sourceRef: people.bookkeeper!.id,
        postedBy: people.bookkeeper!.id,
        total: '120.00',
        memo: 'Reversal of “Commission earned”: Earned on the wrong contract',
      });
      expect(
        res.body.lines.map(
          (l: { accountCode: string; side: string; amount: string; salespersonId: string }) => [
            l.accountCode,
            l.side,
            l.amount,
            l.salespersonId,
          ],
        ),
      ).toEqual([
        [ACCOUNTS.commissionExpense, 'credit', '120.00', people.northSales!.id],
        [ACCOUNTS.commissionsPayable, 'debit', '120.00', people.northSales!.id],
      ]);
      const net = await t
        .db('journal_lines')
        .whereIn('entry_id', [original.id, res.body.id])
        .groupBy('account_id', 'salesperson_id')
        .select(t.db.raw(`sum(case when side = 'debit' then amount else -amount end)::text as net`));
      expect(net.map((r: { net: string }) => r.net)).toEqual(['0.00', '0.00']);

      const reread = await as('bookkeeper').get(`/api/ledger/entries/${original.id}`);
      expect(reread.body.reversedByEntryId).toBe(res.body.id);
      const again = await as('owner').post(`/api/ledger/entries/${original.id}/reverse`, { reason: 'Again' });
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('LEDGER.ALREADY_REVERSED');
      expect((await as('bookkeeper').post(`/api/ledger/entries/${original.id}/reverse`, {})).status).toBe(
        400,
      );
      expect(
        (await as('bookkeeper').post(`/api/ledger/entries/${randomUUID()}/reverse`, { reason: 'Nothing' }))
          .status,
      ).toBe(404);
    });
  });

  describe('trial balance', () => {
    it('North on 2026-12-31, hand-checked: every column agrees', async () => {
      const res = await as('bookkeeper').get(`/api/ledger/trial-balance?branchId=${north}&asOf=2026-12-31`);
      expect(res.status).toBe(200);
      const by = Object.fromEntries(
        res.body.rows.map((r: { code: string; debitBalance: string; creditBalance: string }) => [
          r.code,
          [r.debitBalance, r.creditBalance],
        ]),
      );
      expect(by).toEqual({
        [ACCOUNTS.bank]: ['970.70', '0.00'], // the payout
        [ACCOUNTS.processorClearing]: ['2912.70', '0.00'], // 970.70 − 970.70 + 2912.70
        [ACCOUNTS.accountsReceivable]: ['0.00', '0.00'], // 3000 owed, 3000 paid
        [ACCOUNTS.customerDeposits]: ['0.00', '0.00'], // 1000 held until completion
        [ACCOUNTS.commissionsPayable]: ['0.00', '296.40'],
        [ACCOUNTS.openingEquity]: ['0.00', '0.00'],
        [ACCOUNTS.contractRevenue]: ['0.00', '4000.00'],
        [ACCOUNTS.refunds]: ['0.00', '0.00'],
        [ACCOUNTS.processingFees]: ['116.60', '0.00'], // 29.30 + 87.30
        [ACCOUNTS.commissionExpense]: ['296.40', '0.00'],
      });
      // 970.70 + 2912.70 + 116.60 + 296.40 = 4296.40 = 296.40 + 4000.00
      // lines: 1000 + 970.70 + 4000 + 3000 + 296.40 = 9267.10 on each side
      expect(res.body.totals).toEqual({
        debitTotal: '9267.10',
        creditTotal: '9267.10',
        debitBalance: '4296.40',
        creditBalance: '4296.40',
        difference: '0.00',
        balanced: true,
      });
      expect(res.body.rows[0].accountId).toBe(acct[ACCOUNTS.bank]);
    });

    it('as of an earlier date leaves later entries out', async () => {
      const res = await as('bookkeeper').get(`/api/ledger/trial-balance?branchId=${north}&asOf=2026-12-05`);
      const nonzero = res.body.rows
        .filter(
          (r: { debitBalance: string; creditBalance: string }) =>
            r.debitBalance !== '0.00' || r.creditBalance !== '0.00',
        )
        .map((r: { code: string; debitBalance: string; creditBalance: string }) => [
          r.code,
          r.debitBalance,
          r.creditBalance,
        ]);
      expect(nonzero).toEqual([
        [ACCOUNTS.bank, '970.70', '0.00'],
        [ACCOUNTS.customerDeposits, '0.00', '1000.00'],
        [ACCOUNTS.processingFees, '29.30', '0.00'],
      ]);
      expect(res.body.totals).toMatchObject({
        debitBalance: '1000.00',
        creditBalance: '1000.00',
        balanced: true,
      });
    });

    it('every branch together balances too, and the whole ledger sums to zero', async () => {
      const res = await as('owner').get('/api/ledger/trial-balance?asOf=2026-12-31');
      expect(res.status).toBe(200);
      expect(res.body.branchId).toBeNull();
      expect(res.body.rows).toHaveLength(CHART_OF_ACCOUNTS.length);
      expect(res.body.rows[0].accountId).toBeNull();
      expect(res.body.totals.balanced).toBe(true);
      expect(res.body.totals.debitTotal).toBe(res.body.totals.creditTotal);
      await expectTrialBalanceZero(t.db);
    });

    it('exports as CSV with a header, a row per account and the total row', async () => {
      const res = await as('bookkeeper').get(
        `/api/ledger/trial-balance?branchId=${north}&asOf=2026-12-31&format=csv`,
      );
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      expect(res.headers['content-disposition']).toMatch(
        /attachment; filename="trial-balance-.+-2026-12-31\.csv"/,
      );
      const rows = parse(res.text) as string[][];
      expect(rows[0]).toEqual([
        'account_code',
        'account_name',
        'type',
        'total_debits',
        'total_credits',
        'debit_balance',
        'credit_balance',
      ]);
      expect(rows).toHaveLength(1 + CHART_OF_ACCOUNTS.length + 1);
      expect(rows.find((r) => r[0] === ACCOUNTS.processingFees)).toEqual([
        ACCOUNTS.processingFees,
        'Card processing fees',
        'expense',
        '116.60',
        '0.00',
        '116.60',
        '0.00',
      ]);
      expect(rows.at(-1)).toEqual(['TOTAL', 'balanced', '', '9267.10', '9267.10', '4296.40', '4296.40']);
    });
  });

  describe('journal', () => {
    it('filters by branch, dates and reason, newest first, with paging', async () => {
      const all = await as('bookkeeper').get(
        `/api/ledger/journal?branchId=${north}&from=2026-12-01&to=2026-12-31`,
      );
      expect(all.status).toBe(200);
      expect(all.body.items.every((e: { branchId: string }) => e.branchId === north)).toBe(true);
      expect(all.body.items.map((e: { reasonCode: string }) => e.reasonCode)).toEqual([
        'commission.earned',
        'balance.card',
        'job.completed',
        'processor.payout',
        'deposit.card',
      ]);
      expect(all.body).toMatchObject({ total: 5, page: 1, pageSize: 50 });
      const dep = all.body.items.at(-1);
      expect(dep).toMatchObject({
        effectiveOn: '2026-12-01',
        total: '1000.00',
        reasonLabel: 'Deposit paid by card',
      });
      expect(dep.lines).toHaveLength(3);

      const cards = await as('bookkeeper').get(
        `/api/ledger/journal?branchId=${north}&reasonCode=balance.card`,
      );
      expect(cards.body.items.map((e: { effectiveOn: string }) => e.effectiveOn)).toEqual(['2026-12-12']);
      const window = await as('bookkeeper').get(
        `/api/ledger/journal?branchId=${north}&from=2026-12-03&to=2026-12-10`,
      );
      expect(window.body.items.map((e: { reasonCode: string }) => e.reasonCode)).toEqual([
        'job.completed',
        'processor.payout',
      ]);
      const page2 = await as('bookkeeper').get(`/api/ledger/journal?branchId=${north}&pageSize=10&page=1`);
      expect(page2.body.items.length).toBeLessThanOrEqual(10);

      const south1 = await as('owner').get(
        `/api/ledger/journal?branchId=${south}&reasonCode=deposit.bank&from=2026-12-02&to=2026-12-02`,
      );
      expect(south1.body.items).toHaveLength(1);
      expect(south1.body.items[0]).toMatchObject({
        sourceKind: 'user',
        postedByName: 'bookkeeper',
        branchId: south,
      });
    });

    it('refuses bad filters: not a date, an impossible date, from after to, an unknown branch', async () => {
      expect((await as('bookkeeper').get('/api/ledger/journal?from=12/01/2026')).status).toBe(400);
      expect((await as('bookkeeper').get('/api/ledger/journal?from=2026-02-30')).status).toBe(400);
      const backwards = await as('bookkeeper').get('/api/ledger/journal?from=2026-12-31&to=2026-12-01');
      expect(backwards.status).toBe(400);
      expect(backwards.body.details).toEqual([
        { field: 'to', message: 'The end date is before the start date.' },
      ]);
      expect((await as('bookkeeper').get(`/api/ledger/journal?branchId=${randomUUID()}`)).status).toBe(404);
      expect((await as('bookkeeper').get('/api/ledger/journal?pageSize=7')).status).toBe(400);
    });

    it('exports every line as CSV: a header, then a row per line, oldest first', async () => {
      const res = await as('bookkeeper').get(
        `/api/ledger/journal?branchId=${north}&from=2026-12-01&to=2026-12-31&format=csv`,
      );
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      const rows = parse(res.text) as string[][];
      expect(rows[0]).toEqual([
        'entry_id',
        'effective_on',
        'posted_at',
        'branch',
        'reason_code',
        'reason',
        'memo',
        'source_kind',
        'source_ref',
        'reverses_entry_id',
        'line',
        'account_code',
        'account_name',
        'debit',
        'credit',
        'salesperson',
      ]);
      // 3 + 2 + 3 + 3 + 2 lines
      expect(rows).toHaveLength(1 + 13);
      expect(rows[1]!.slice(1, 2)).toEqual(['2026-12-01']);
      expect(rows.slice(1, 4).map((r) => [r[4], r[11], r[13], r[14]])).toEqual([
        ['deposit.card', ACCOUNTS.processorClearing, '970.70', ''],
        ['deposit.card', ACCOUNTS.processingFees, '29.30', ''],
        ['deposit.card', ACCOUNTS.customerDeposits, '', '1000.00'],
      ]);
      expect(rows.at(-1)!.slice(11)).toEqual([
        ACCOUNTS.commissionsPayable,
        'Commissions payable',
        '',
        '296.40',
        'northSales',
      ]);
    });
  });

  describe('account ledger', () => {
    it('runs the balance line by line on the account’s normal side', async () => {
      const res = await as('bookkeeper').get(
        `/api/ledger/accounts/${acct[ACCOUNTS.processorClearing]}/lines`,
      );
      expect(res.status).toBe(200);
      expect(
        res.body.lines.map((l: { side: string; amount: string; balance: string }) => [
          l.side,
          l.amount,
          l.balance,
        ]),
      ).toEqual([
        ['debit', '970.70', '970.70'],
        ['credit', '970.70', '0.00'],
        ['debit', '2912.70', '2912.70'],
      ]);
      expect(res.body).toMatchObject({ openingBalance: '0.00', closingBalance: '2912.70', total: 3 });
      const deposits = await as('bookkeeper').get(
        `/api/ledger/accounts/${acct[ACCOUNTS.customerDeposits]}/lines`,
      );
      // a credit-normal account: the credit raises the balance
      expect(deposits.body.lines.map((l: { balance: string }) => l.balance)).toEqual(['1000.00', '0.00']);
    });

    it('starts from the opening balance when a start date is given', async () => {
      const res = await as('bookkeeper').get(
        `/api/ledger/accounts/${acct[ACCOUNTS.processorClearing]}/lines?from=2026-12-02&to=2026-12-11`,
      );
      expect(res.body).toMatchObject({
        openingBalance: '970.70',
        closingBalance: '0.00',
        debitTotal: '0.00',
        creditTotal: '970.70',
        total: 1,
      });
      expect(
        res.body.lines.map((l: { balance: string; reasonCode: string }) => [l.reasonCode, l.balance]),
      ).toEqual([['processor.payout', '0.00']]);
    });

    it('exports as CSV with the running balance', async () => {
      const res = await as('bookkeeper').get(
        `/api/ledger/accounts/${acct[ACCOUNTS.processorClearing]}/lines?format=csv`,
      );
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      const rows = parse(res.text) as string[][];
      expect(rows[0]).toEqual([
        'effective_on',
        'posted_at',
        'entry_id',
        'reason',
        'memo',
        'salesperson',
        'debit',
        'credit',
        'balance',
      ]);
      expect(rows.slice(1).map((r) => [r[0], r[6], r[7], r[8]])).toEqual([
        ['2026-12-01', '970.70', '', '970.70'],
        ['2026-12-03', '', '970.70', '0.00'],
        ['2026-12-12', '2912.70', '', '2912.70'],
      ]);
    });

    it('answers 404 for an account that does not exist', async () => {
      expect((await as('bookkeeper').get(`/api/ledger/accounts/${randomUUID()}/lines`)).status).toBe(404);
    });
  });

  describe('who may see and do what', () => {
    const routes = () => [
      `/api/ledger/journal`,
      `/api/ledger/accounts?branchId=${north}`,
      `/api/ledger/accounts/${acct[ACCOUNTS.bank]}/lines`,
      `/api/ledger/trial-balance?branchId=${north}`,
      `/api/ledger/journal?format=csv`,
    ];

    it.each([
      ['bookkeeper', 200],
      ['owner', 200],
      // No JournalEntry rule for these roles (common/src/permissions/abilities.ts): the type-level check
      // refuses with 403 before any record is looked at.
      ['northManager', 403],
      ['northSales', 403],
      ['crewLead', 403],
    ] as const)('%s reads the ledger → %s', async (who, status) => {
      for (const url of routes()) {
        const res = await as(who).get(url);
        expect(res.status, `${who} ${url}`).toBe(status);
      }
    });

    it('a salesperson cannot reverse an entry (403); nothing is posted', async () => {
      const entry = await t
        .db('journal_entries')
        .where({ idempotency_key: key('n-balance') })
        .first('id');
      const res = await as('northSales').post(`/api/ledger/entries/${entry.id}/reverse`, {
        reason: 'Trying',
      });
      expect(res.status).toBe(403);
      expect(await t.db('journal_entries').where({ reverses_entry_id: entry.id }).first()).toBeUndefined();
    });

    it('a person whose rules reach one branch gets 404 for another branch’s entry, account and filter', async () => {
      // No role has such a rule today; a branch-limited JournalEntry rule (for example, if managers are
      // later let read their branch's ledger) must hide the other branches as if they did not exist.
      const southEntry = await t
        .db('journal_entries')
        .where({ idempotency_key: key('s-deposit') })
        .first('id');
      const northEntry = await t
        .db('journal_entries')
        .where({ idempotency_key: key('n-deposit') })
        .first('id');
      const limited = {
        ...people.northManager!,
        name: 'northManager',
        ability: abilityFromRules([
          { action: 'read', subject: 'JournalEntry', conditions: { branchId: { $in: [north] } } },
        ]),
      } as SessionUser;
      const fail = (p: Promise<unknown>) =>
        p.then(
          () => null,
          (e: unknown) => e as DomainError,
        );
      expect(await fail(ledger.entry(limited, southEntry.id))).toMatchObject({
        kind: 'not_found',
        code: 'JOURNAL_ENTRY.NOT_FOUND',
      });
      expect((await ledger.entry(limited, northEntry.id)).branchId).toBe(north);
      expect(await fail(ledger.accountLedger(limited, southAcct[ACCOUNTS.bank]!, {}))).toMatchObject({
        kind: 'not_found',
      });
      expect(await fail(ledger.journal(limited, { branchId: south }))).toMatchObject({ kind: 'not_found' });
      const mine = await ledger.journal(limited, {});
      expect(mine.items.every((e) => e.branchId === north)).toBe(true);
      expect(mine.total).toBeGreaterThanOrEqual(5);
      const tb = await ledger.trialBalance(limited, { asOf: '2026-12-31' });
      expect(tb.totals.debitBalance).toBe('4296.40'); // north's alone
    });
  });
});
