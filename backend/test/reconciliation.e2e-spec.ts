import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  commissionPaid,
  depositCapturedByCard,
  processorPayout,
  refundAfterCancellation,
  type BankCsvMapping,
  type Role,
} from '@loambook/common';
import { LedgerService, type PostContext } from '../src/ledger/ledger.service';
import { expectTrialBalanceZero } from './support/ledger-assertions';
import { makeSignedJob, type SignedJob } from './support/job-fixtures';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';

const BUCKET = 'loambook-reconciliation-test';
const run = randomBytes(4).toString('hex');
const key = (name: string) => `reconciliation-test:${run}:${name}`;

// An invented operating account's November: three transfers from the card processor, the rent, and one
// commission paid. Amounts as a bank prints them: thousands separators, a parenthesised debit, a minus.
const NOVEMBER = [
  'Posting Date,Description,Amount,Balance',
  '11/04/2026,CARD PROCESSOR TRANSFER A,"2,129.80","12,129.80"',
  '11/10/2026,CARD PROCESSOR TRANSFER B,970.70,"13,100.50"',
  '11/14/2026,RENT - 1 CLAYFIELD ROW,"(1,800.00)","11,300.50"',
  '11/16/2026,COMMISSION T NORTHSALES,-296.40,"11,004.10"',
  '11/25/2026,CARD PROCESSOR TRANSFER C,500.00,"11,504.10"',
  '',
].join('\r\n');

const DECEMBER = [
  'Posting Date,Description,Amount,Balance',
  '12/02/2026,INTEREST,0.42,"11,504.52"',
  '12/03/2026,SUPPLIES - GROUT,-88.15,"11,416.37"',
  '',
].join('\n');

// A payroll account's export with debit and credit columns and three bad rows (3, 4 and 5; the header is 1).
const PAYROLL_BAD = [
  'Date,Memo,Debit,Credit',
  '2026-11-05,PAYROLL,1200.00,',
  '2026-13-05,NO SUCH MONTH,50.00,',
  '2026-11-07,BOTH SIDES,10.00,5.00',
  '2026-11-08,NOT A NUMBER,abc,',
  '2026-11-09,INTEREST,,0.42',
].join('\n');

const SIGNED_MAPPING: BankCsvMapping = {
  hasHeaderRow: true,
  dateColumn: 0,
  descriptionColumn: 1,
  amount: { kind: 'signed', column: 2 },
  dateFormat: 'MM/DD/YYYY',
};
const PAYROLL_MAPPING: BankCsvMapping = {
  hasHeaderRow: true,
  dateColumn: 0,
  descriptionColumn: 1,
  amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
  dateFormat: 'YYYY-MM-DD',
};

describe('reconciliation: bank statements, matching payouts and commission payments, locking', () => {
  let t: TestApp;
  let s3: S3rver;
  let s3Dir: string;
  let ledger: LedgerService;
  let north: string;
  let south: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  let operating: string;
  let payroll: string;
  let novemberId: string;
  const payouts: Record<string, string> = {};
  let northCommission: string;
  let southCommission: string;
  let jobs: SignedJob[] = [];

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
      delete: (url: string) => t.http.delete(url).set(auth),
      upload: (url: string, csv: string, fileName: string, fields: Record<string, string>) => {
        const req = t.http.post(url).set(auth);
        for (const [k, v] of Object.entries(fields)) req.field(k, v);
        return req.attach('file', Buffer.from(csv, 'utf8'), { filename: fileName, contentType: 'text/csv' });
      },
    };
  };
  const view = (who: string, account: string, from: string, to: string) =>
    as(who).get(`/api/reconciliation?bankAccountId=${account}&from=${from}&to=${to}`);

  const ctx = (branchId: string, name: string, effectiveOn: string, extra: Partial<PostContext> = {}) => ({
    branchId,
    idempotencyKey: key(name),
    source: { kind: 'event' as const, ref: `evt_${run}_${name}` },
    effectiveOn,
    ...extra,
  });

  async function insertPayout(
    name: string,
    amount: string,
    arrival: string,
    status = 'paid',
  ): Promise<string> {
    const [row] = await t
      .db('processor_payouts')
      .insert({
        processor_payout_id: `po_${run}_${name}`,
        amount,
        currency: 'usd',
        arrival_date: arrival,
        status,
        processor_created_at: `${arrival}T00:00:00Z`,
      })
      .returning('id');
    return row.id as string;
  }

  /** A card payment recorded as P1's webhook would: the deposit posting, then the payment row. */
  async function cardPayment(job: SignedJob, name: string, gross: string, fee: string, net: string) {
    const { entry } = await ledger.post(
      depositCapturedByCard({ gross, fee }),
      ctx(north, name, '2026-11-01', { contractId: job.contractId, leadId: job.leadId }),
    );
    const [row] = await t
      .db('payments')
      .insert({
        contract_id: job.contractId,
        branch_id: north,
        kind: 'deposit',
        method: 'card',
        amount: gross,
        fee,
        net,
        processor_charge_id: `ch_${run}_${name}`,
        processor_balance_transaction_id: `txn_${run}_${name}`,
        received_on: '2026-11-01',
        journal_entry_id: entry.id,
      })
      .returning('id');
    return row.id as string;
  }

  async function paidStatement(
    salesperson: TestUser,
    branchId: string,
    periodStart: string,
    periodEnd: string,
    payable: string,
    paidOn: string,
  ): Promise<string> {
    const { entry } = await ledger.post(
      commissionPaid({ amount: payable, salespersonId: salesperson.id }),
      ctx(branchId, `commission-${salesperson.id}-${periodStart}`, paidOn),
    );
    const [row] = await t
      .db('commission_statements')
      .insert({
        branch_id: branchId,
        salesperson_id: salesperson.id,
        period_start: periodStart,
        period_end: periodEnd,
        status: 'paid',
        earned: payable,
        net: payable,
        payable,
        approved_by: people.bookkeeper!.id,
        approved_at: `${paidOn}T12:00:00Z`,
        paid_by: people.bookkeeper!.id,
        paid_at: `${paidOn}T15:00:00Z`,
        paid_on: paidOn,
        paid_journal_entry_id: entry.id,
      })
      .returning('id');
    return row.id as string;
  }

  beforeAll(async () => {
    s3Dir = await mkdtemp(path.join(tmpdir(), 'loambook-s3-'));
    s3 = new S3rver({
      port: 0,
      address: '127.0.0.1',
      silent: true,
      directory: s3Dir,
      configureBuckets: [{ name: BUCKET }],
    });
    const { port } = await s3.run();
    t = await startTestApp({ S3_ENDPOINT: `http://127.0.0.1:${port}`, S3_BUCKET: BUCKET });
    ledger = t.app.get(LedgerService);
    north = await makeBranch(t.db, { name: 'North Reconcile' });
    south = await makeBranch(t.db, { name: 'South Reconcile' });
    const roster: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['manager', 'branch_manager', [north]],
      ['northSales', 'salesperson', [north]],
      ['southSales', 'salesperson', [south]],
      ['crewLead', 'crew_lead', [north]],
    ];
    for (const [k, role, branches] of roster) {
      people[k] = await makeUser(t.db, role, branches, { name: `T ${k}` });
      tokens[k] = await tokenFor(t, people[k]!);
    }

    // Payouts as P1's webhook handler records them (processor_payouts), inserted directly.
    payouts.a = await insertPayout('a', '2129.80', '2026-11-03');
    payouts.b = await insertPayout('b', '970.70', '2026-11-10');
    payouts.c = await insertPayout('c', '500.00', '2026-11-20');
    payouts.failed = await insertPayout('failed', '300.00', '2026-11-12', 'failed');

    // Payout A is made of two deposits and one refund. Fees follow Stripe's standard US card price,
    // 2.9% + 30¢ (Stripe pricing page, memory): 1,500.00 → 43.80; 900.00 → 26.40. The refund is −200.00
    // with no fee. Net 1,500.00 + 900.00 − 200.00 − 70.20 = 2,129.80 = the payout (hand-checked).
    jobs = [
      await makeSignedJob(t, {
        branchId: north,
        seller: people.northSales!,
        homeownerName: 'Avery Fieldstone',
      }),
      await makeSignedJob(t, { branchId: north, seller: people.northSales!, homeownerName: 'Rowan Marlpit' }),
    ];
    const p1 = await cardPayment(jobs[0]!, 'pay1', '1500.00', '43.80', '1456.20');
    const p2 = await cardPayment(jobs[1]!, 'pay2', '900.00', '26.40', '873.60');
    const { entry: refundEntry } = await ledger.post(
      refundAfterCancellation({ amount: '200.00', via: 'processor' }),
      ctx(north, 'refund1', '2026-11-02', { contractId: jobs[1]!.contractId }),
    );
    const [refund] = await t
      .db('refunds')
      .insert({
        contract_id: jobs[1]!.contractId,
        branch_id: north,
        payment_id: p2,
        amount: '200.00',
        processor_refund_id: `re_${run}_1`,
        processor_balance_transaction_id: `txn_${run}_re1`,
        status: 'succeeded',
        refunded_on: '2026-11-02',
        journal_entry_id: refundEntry.id,
      })
      .returning('id');
    const item = (txn: string, type: string, amount: string, fee: string, net: string, extra: object) => ({
      payout_id: payouts.a,
      processor_balance_transaction_id: `txn_${run}_${txn}`,
      type,
      amount,
      fee,
      net,
      currency: 'usd',
      branch_id: north,
      ...extra,
    });
    await t
      .db('processor_payout_items')
      .insert([
        item('pay1', 'charge', '1500.00', '43.80', '1456.20', { payment_id: p1 }),
        item('pay2', 'charge', '900.00', '26.40', '873.60', { payment_id: p2 }),
        item('re1', 'refund', '-200.00', '0.00', '-200.00', { refund_id: refund.id }),
      ]);
    const { entry: payoutEntry } = await ledger.post(
      processorPayout({ amount: '2129.80' }),
      ctx(north, 'payout-a', '2026-11-03'),
    );
    await t.db('processor_payout_branches').insert({
      payout_id: payouts.a,
      branch_id: north,
      gross: '2200.00',
      fee: '70.20',
      net: '2129.80',
      item_count: 3,
      journal_entry_id: payoutEntry.id,
    });

    // Commission statements as P2 marks them paid (status paid, payable, paid_on), inserted directly.
    northCommission = await paidStatement(
      people.northSales!,
      north,
      '2026-11-01',
      '2026-11-15',
      '296.40',
      '2026-11-15',
    );
    southCommission = await paidStatement(
      people.southSales!,
      south,
      '2026-11-16',
      '2026-11-30',
      '150.00',
      '2026-12-01',
    );
  });

  afterAll(async () => {
    await expectTrialBalanceZero(t.db);
    await t?.close();
    await s3?.close();
    await rm(s3Dir, { recursive: true, force: true });
  });

  describe('bank accounts', () => {
    it('the bookkeeper opens a company-wide account and a branch account; names are unique per branch', async () => {
      const op = await as('bookkeeper').post('/api/bank-accounts', { name: 'Operating', last4: '0142' });
      expect(op.status, JSON.stringify(op.body)).toBe(201);
      expect(op.body).toMatchObject({
        branchId: null,
        name: 'Operating',
        last4: '0142',
        receivesPayouts: true,
      });
      expect(op.body.csvMapping).toBeNull();
      operating = op.body.id;

      const pr = await as('owner').post('/api/bank-accounts', {
        name: 'North payroll',
        last4: '7781',
        branchId: north,
        receivesPayouts: false,
      });
      expect(pr.status, JSON.stringify(pr.body)).toBe(201);
      expect(pr.body).toMatchObject({
        branchId: north,
        branchName: 'North Reconcile',
        receivesPayouts: false,
      });
      payroll = pr.body.id;

      const again = await as('bookkeeper').post('/api/bank-accounts', { name: 'Operating', last4: '9999' });
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('BANK_ACCOUNT.NAME_TAKEN');
      expect(again.body.details).toEqual([{ field: 'name', message: expect.any(String) }]);

      const bad = await as('bookkeeper').post('/api/bank-accounts', { name: 'X', last4: '12a4' });
      expect(bad.status).toBe(400);
      expect(bad.body.details.map((d: { field: string }) => d.field).sort()).toEqual(['last4', 'name']);

      const unknownBranch = await as('bookkeeper').post('/api/bank-accounts', {
        name: 'Nowhere',
        last4: '0000',
        branchId: randomUUID(),
      });
      expect(unknownBranch.status).toBe(404);

      const list = await as('bookkeeper').get('/api/bank-accounts');
      expect(list.status).toBe(200);
      expect(list.body.map((a: { name: string }) => a.name)).toEqual(
        expect.arrayContaining(['Operating', 'North payroll']),
      );
    });
  });

  describe('uploading a statement', () => {
    it('previews the first rows with a guessed mapping, read from multipart or a text/csv body', async () => {
      const res = await as('bookkeeper').upload('/api/bank-statements/preview', NOVEMBER, 'nov.csv', {
        bankAccountId: operating,
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.rows[0]).toEqual(['Posting Date', 'Description', 'Amount', 'Balance']);
      expect(res.body.rows[1]).toEqual(['11/04/2026', 'CARD PROCESSOR TRANSFER A', '2,129.80', '12,129.80']);
      expect(res.body.rowCount).toBe(6); // the header and five lines (a final line break ends the last record)
      expect(res.body.columnCount).toBe(4);
      expect(res.body.fileName).toBe('nov.csv');
      // "Balance" is never taken for the amount; 11/14 rules out DD/MM/YYYY.
      expect(res.body.suggestion).toMatchObject({
        hasHeaderRow: true,
        dateColumn: 0,
        descriptionColumn: 1,
        amount: { kind: 'signed', column: 2 },
        dateFormat: 'MM/DD/YYYY',
      });
      expect(res.body.mappingSource).toBe('suggested');
      expect(res.body.mapping).toEqual(SIGNED_MAPPING);
      expect(res.body.check).toMatchObject({
        lineCount: 5,
        errorCount: 0,
        periodFrom: '2026-11-04',
        periodTo: '2026-11-25',
        // in: 2,129.80 + 970.70 + 500.00 = 3,600.50; out: 1,800.00 + 296.40 = 2,096.40
        moneyIn: '3600.50',
        moneyOut: '2096.40',
      });
      expect(res.body.duplicateOf).toBeNull();

      const text = await t.http
        .post(`/api/bank-statements/preview?fileName=nov.csv&bankAccountId=${operating}`)
        .set('Authorization', `Bearer ${tokens.bookkeeper}`)
        .set('Content-Type', 'text/csv')
        .send(NOVEMBER);
      expect(text.status, JSON.stringify(text.body)).toBe(200);
      expect(text.body.sha256).toBe(res.body.sha256);
      expect(text.body.mapping).toEqual(SIGNED_MAPPING);
    });

    it('stores the statement with the chosen mapping and remembers it on the account', async () => {
      const res = await as('bookkeeper').upload('/api/bank-statements', NOVEMBER, 'nov.csv', {
        bankAccountId: operating,
        mapping: JSON.stringify(SIGNED_MAPPING),
        periodFrom: '2026-11-01',
        periodTo: '2026-11-30',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        bankAccountId: operating,
        fileName: 'nov.csv',
        periodFrom: '2026-11-01',
        periodTo: '2026-11-30',
        rowCount: 6,
        lineCount: 5,
        skippedRows: [],
        moneyIn: '3600.50',
        moneyOut: '2096.40',
      });
      novemberId = res.body.id;
      const lines = await as('bookkeeper').get(`/api/bank-statements/${novemberId}/lines`);
      expect(
        lines.body.map((l: { rowNumber: number; postedOn: string; amount: string; amountCents: string }) => [
          l.rowNumber,
          l.postedOn,
          l.amount,
          l.amountCents,
        ]),
      ).toEqual([
        [2, '2026-11-04', '2129.80', '212980'],
        [3, '2026-11-10', '970.70', '97070'],
        [4, '2026-11-14', '-1800.00', '-180000'],
        [5, '2026-11-16', '-296.40', '-29640'],
        [6, '2026-11-25', '500.00', '50000'],
      ]);
      const account = (await as('bookkeeper').get('/api/bank-accounts')).body.find(
        (a: { id: string }) => a.id === operating,
      );
      expect(account.csvMapping).toEqual(SIGNED_MAPPING);
      expect(account.statementsThrough).toBe('2026-11-30');
    });

    it('offers the remembered mapping on the next upload to that account', async () => {
      // A file whose header names nothing known: no guess, but the account's saved choice still applies.
      const headless = DECEMBER.replace('Posting Date,Description,Amount,Balance', 'A,B,C,D');
      const res = await as('bookkeeper').upload('/api/bank-statements/preview', headless, 'dec.csv', {
        bankAccountId: operating,
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.suggestion.dateColumn).toBeNull();
      expect(res.body.savedMapping).toEqual(SIGNED_MAPPING);
      expect(res.body.mappingSource).toBe('saved');
      expect(res.body.mapping).toEqual(SIGNED_MAPPING);
      expect(res.body.check).toMatchObject({
        lineCount: 2,
        errorCount: 0,
        moneyIn: '0.42',
        moneyOut: '88.15',
      });
      // Another account has no saved choice.
      const other = await as('bookkeeper').upload('/api/bank-statements/preview', headless, 'dec.csv', {
        bankAccountId: payroll,
      });
      expect(other.body.savedMapping).toBeNull();
      expect(other.body.mapping).toBeNull();
    });

    it('reports every bad row by number and stores nothing, unless told to skip them', async () => {
      const before = await t
        .db('bank_statements')
        .where({ bank_account_id: payroll })
        .count<{ count: string }[]>();
      const res = await as('bookkeeper').upload('/api/bank-statements', PAYROLL_BAD, 'payroll.csv', {
        bankAccountId: payroll,
        mapping: JSON.stringify(PAYROLL_MAPPING),
      });
      expect(res.status, JSON.stringify(res.body)).toBe(422);
      expect(res.body.code).toBe('BANK_STATEMENT.ROWS_INVALID');
      expect(res.body.details).toMatchObject({ errorCount: 3, invalidRowCount: 3, lineCount: 2 });
      expect(
        res.body.details.errors.map((e: { rowNumber: number; code: string; field: string }) => [
          e.rowNumber,
          e.field,
          e.code,
        ]),
      ).toEqual([
        [3, 'date', 'BANK_CSV.DATE_INVALID'],
        [4, 'amount', 'BANK_CSV.DEBIT_AND_CREDIT'],
        [5, 'debit', 'BANK_CSV.AMOUNT_INVALID'],
      ]);
      const after = await t
        .db('bank_statements')
        .where({ bank_account_id: payroll })
        .count<{ count: string }[]>();
      expect(after[0]!.count).toBe(before[0]!.count);
      expect(
        (await t.db('bank_accounts').where({ id: payroll }).first('csv_mapping')).csv_mapping,
      ).toBeNull();

      const skipped = await as('bookkeeper').upload('/api/bank-statements', PAYROLL_BAD, 'payroll.csv', {
        bankAccountId: payroll,
        mapping: JSON.stringify(PAYROLL_MAPPING),
        skipInvalidRows: 'true',
      });
      expect(skipped.status, JSON.stringify(skipped.body)).toBe(201);
      expect(skipped.body.lineCount).toBe(2);
      expect(skipped.body.skippedRows.map((e: { rowNumber: number }) => e.rowNumber)).toEqual([3, 4, 5]);
      // A debit is money out whatever sign the bank printed; a credit money in.
      const lines = await as('bookkeeper').get(`/api/bank-statements/${skipped.body.id}/lines`);
      expect(lines.body.map((l: { rowNumber: number; amount: string }) => [l.rowNumber, l.amount])).toEqual([
        [2, '-1200.00'],
        [6, '0.42'],
      ]);
    });

    it('refuses a malformed mapping on its field, and an unreadable file', async () => {
      const res = await as('bookkeeper').upload('/api/bank-statements', NOVEMBER, 'nov2.csv', {
        bankAccountId: payroll,
        mapping: JSON.stringify({ ...SIGNED_MAPPING, descriptionColumn: 0 }),
      });
      expect(res.status).toBe(400);
      expect(res.body.details[0].field).toBe('mapping.descriptionColumn');
      const wide = await as('bookkeeper').upload('/api/bank-statements', NOVEMBER, 'nov2.csv', {
        bankAccountId: payroll,
        mapping: JSON.stringify({ ...SIGNED_MAPPING, amount: { kind: 'signed', column: 7 } }),
      });
      expect(wide.status).toBe(400);
      expect(wide.body.details[0].field).toBe('mapping.amount.column');
      const quote = await as('bookkeeper').upload(
        '/api/bank-statements/preview',
        'Date,Amount\n"2026-11-01,5\n',
        'q.csv',
        {},
      );
      expect(quote.status).toBe(422);
      expect(quote.body.code).toBe('BANK_STATEMENT.CSV_UNREADABLE');
      const none = await as('bookkeeper').upload('/api/bank-statements', '', 'empty.csv', {
        bankAccountId: payroll,
        mapping: JSON.stringify(SIGNED_MAPPING),
      });
      expect(none.status).toBe(422);
      expect(none.body.code).toBe('BANK_STATEMENT.EMPTY_FILE');
    });

    it('refuses the same file twice on one account (also at the SQL level)', async () => {
      const preview = await as('bookkeeper').upload('/api/bank-statements/preview', NOVEMBER, 'again.csv', {
        bankAccountId: operating,
      });
      expect(preview.body.duplicateOf).toMatchObject({ statementId: novemberId, fileName: 'nov.csv' });
      const res = await as('bookkeeper').upload('/api/bank-statements', NOVEMBER, 'again.csv', {
        bankAccountId: operating,
        mapping: JSON.stringify(SIGNED_MAPPING),
      });
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('BANK_STATEMENT.DUPLICATE_FILE');
      expect(res.body.details.statementId).toBe(novemberId);
      const sha = (await t.db('bank_statements').where({ id: novemberId }).first('file_sha256')).file_sha256;
      await expect(
        t.db('bank_statements').insert({
          bank_account_id: operating,
          file_name: 'sneaky.csv',
          file_sha256: sha,
          file_bytes: 10,
          period_from: '2026-11-01',
          period_to: '2026-11-30',
          row_count: 1,
          line_count: 1,
          mapping: JSON.stringify(SIGNED_MAPPING),
          uploaded_by: people.bookkeeper!.id,
        }),
      ).rejects.toMatchObject({ code: '23505' });
      const listed = await as('bookkeeper').get(`/api/bank-statements?bankAccountId=${operating}`);
      expect(listed.body.map((s: { id: string }) => s.id)).toEqual([novemberId]);
    });
  });

  describe('matching', () => {
    const bankLineOn = async (day: string) =>
      (await t.db('bank_lines').where({ bank_account_id: operating, posted_on: day }).first('id'))
        .id as string;

    it('suggests payouts by amount within 3 days and a paid commission as a bank debit', async () => {
      const res = await as('bookkeeper').post(
        `/api/reconciliation/suggest?bankAccountId=${operating}&from=2026-11-01&to=2026-11-30`,
      );
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      // Bank: 5 lines. Books, 28 Oct – 3 Dec: payouts A, B, C (the failed one is never looked for) and the
      // two paid commission statements.
      // The API tests share one database: payouts and paid statements that other test files made in the same
      // dates (e.g. today's payouts in the payments tests) are considered too. Count those, and only those.
      const foreign = await t.db.raw(
        `select (select count(*) from processor_payouts
                  where arrival_date between '2026-10-29' and '2026-12-03'
                    and status not in ('failed', 'canceled', 'cancelled') and processor_payout_id not like ?)
              + (select count(*) from commission_statements
                  where status = 'paid' and payable > 0 and paid_on between '2026-10-29' and '2026-12-03'
                    and not (salesperson_id = any (?))) as n`,
        [`po_${run}_%`, Object.values(people).map((p) => p!.id)],
      );
      expect(res.body).toEqual({
        windowDays: 3,
        suggested: 3,
        bankLinesConsidered: 5,
        targetsConsidered: 5 + Number(foreign.rows[0].n),
      });

      const v = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      expect(v.status).toBe(200);
      const pairs = v.body.matched.map(
        (m: {
          status: string;
          targetKind: string;
          targetId: string;
          bankLine: { postedOn: string };
          daysApart: number;
        }) => [m.bankLine.postedOn, m.targetKind, m.targetId, m.daysApart, m.status],
      );
      expect(pairs).toEqual([
        ['2026-11-04', 'payout', payouts.a, 1, 'suggested'], // arrived 11-03, on the bank 11-04
        ['2026-11-10', 'payout', payouts.b, 0, 'suggested'],
        ['2026-11-16', 'commission_payment', northCommission, 1, 'suggested'], // paid 11-15 → −296.40 on 11-16
      ]);
      const commission = v.body.matched[2].commissionPayment;
      expect(commission).toMatchObject({
        payable: '296.40',
        bankAmountCents: '-29640',
        paidOn: '2026-11-15',
      });
      expect(commission.salespersonName).toBe('T northSales');
    });

    it('lists what is unmatched on both sides', async () => {
      const v = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      expect(
        v.body.unmatchedBankLines.map((l: { postedOn: string; amount: string }) => [l.postedOn, l.amount]),
      ).toEqual([
        ['2026-11-14', '-1800.00'],
        ['2026-11-25', '500.00'], // payout C arrived 11-20: 5 days, outside the 3-day window
      ]);
      expect(v.body.unmatchedPayouts.map((p: { id: string }) => p.id)).toEqual([payouts.c]);
      expect(v.body.unmatchedCommissionPayments).toEqual([]);
      expect(v.body.lockBlockers).toEqual({
        unmatchedBankLines: 2,
        unconfirmedMatches: 3,
        unmatchedPayouts: 1,
        unmatchedCommissionPayments: 0,
        uncoveredDays: 0,
      });
      expect(v.body.summary).toMatchObject({ bankLines: 5, suggested: 3, confirmed: 0, moneyIn: '3600.50' });

      // December: the south statement paid on 12-01 has no bank line yet; no statement covers December.
      const dec = await view('bookkeeper', operating, '2026-12-01', '2026-12-31');
      expect(dec.body.unmatchedCommissionPayments.map((c: { id: string }) => c.id)).toEqual([
        southCommission,
      ]);
      expect(dec.body.lockBlockers.uncoveredDays).toBe(31);

      // A branch's account only looks at its own branch's commission payments, and at no payouts.
      const pr = await view('bookkeeper', payroll, '2026-11-01', '2026-12-31');
      expect(pr.body.unmatchedPayouts).toEqual([]);
      expect(pr.body.unmatchedCommissionPayments).toEqual([]);
    });

    it('refuses to lock while anything is open', async () => {
      const res = await as('bookkeeper').post('/api/reconciliation/lock', {
        bankAccountId: operating,
        from: '2026-11-01',
        to: '2026-11-30',
      });
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('RECONCILIATION.PERIOD_NOT_RECONCILED');
      expect(res.body.details).toEqual({
        unmatchedBankLines: 2,
        unconfirmedMatches: 3,
        unmatchedPayouts: 1,
        unmatchedCommissionPayments: 0,
        uncoveredDays: 0,
      });
    });

    it('confirms a suggestion (once) and undoes another', async () => {
      const v = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      const [a, b] = v.body.matched as { id: string }[];
      const ok = await as('bookkeeper').post(`/api/reconciliation/matches/${a!.id}/confirm`);
      expect(ok.status).toBe(200);
      expect(ok.body).toMatchObject({ status: 'confirmed', matchedBy: { id: people.bookkeeper!.id } });
      const twice = await as('owner').post(`/api/reconciliation/matches/${a!.id}/confirm`);
      expect(twice.status).toBe(200);
      expect(twice.body.matchedBy.id).toBe(people.bookkeeper!.id); // unchanged

      expect((await as('bookkeeper').delete(`/api/reconciliation/matches/${b!.id}`)).status).toBe(204);
      const after = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      expect(after.body.unmatchedPayouts.map((p: { id: string }) => p.id)).toEqual([payouts.b, payouts.c]);
      expect(after.body.unmatchedBankLines.map((l: { postedOn: string }) => l.postedOn)).toContain(
        '2026-11-10',
      );
      expect((await as('bookkeeper').delete(`/api/reconciliation/matches/${b!.id}`)).status).toBe(404);

      // Suggesting again finds it again; a wider window finds payout C (5 days).
      const again = await as('bookkeeper').post(
        `/api/reconciliation/suggest?bankAccountId=${operating}&from=2026-11-01&to=2026-11-30`,
      );
      expect(again.body.suggested).toBe(1);
      const wide = await as('bookkeeper').post(
        `/api/reconciliation/suggest?bankAccountId=${operating}&from=2026-11-01&to=2026-11-30&windowDays=5`,
      );
      expect(wide.body).toMatchObject({ windowDays: 5, suggested: 1 });
      const bad = await as('bookkeeper').post(
        `/api/reconciliation/suggest?bankAccountId=${operating}&from=2026-11-30&to=2026-11-01`,
      );
      expect(bad.status).toBe(400);
    });

    it('matches by hand: "other" with a note; amounts must agree; one match per line and per target', async () => {
      const rent = await bankLineOn('2026-11-14');
      const noNote = await as('bookkeeper').post('/api/reconciliation/matches', {
        bankLineId: rent,
        targetKind: 'other',
      });
      expect(noNote.status).toBe(400);
      expect(noNote.body.details[0].field).toBe('note');
      const wrong = await as('bookkeeper').post('/api/reconciliation/matches', {
        bankLineId: rent,
        targetKind: 'payout',
        targetId: payouts.c,
      });
      expect(wrong.status).toBe(422);
      expect(wrong.body.code).toBe('RECONCILIATION.AMOUNT_MISMATCH');
      const ok = await as('bookkeeper').post('/api/reconciliation/matches', {
        bankLineId: rent,
        targetKind: 'other',
        note: 'Office rent, November',
      });
      expect(ok.status, JSON.stringify(ok.body)).toBe(201);
      expect(ok.body).toMatchObject({
        status: 'confirmed',
        targetKind: 'other',
        targetId: null,
        note: 'Office rent, November',
      });
      const twice = await as('bookkeeper').post('/api/reconciliation/matches', {
        bankLineId: rent,
        targetKind: 'other',
        note: 'Again',
      });
      expect(twice.status).toBe(409);
      expect(twice.body.code).toBe('RECONCILIATION.LINE_ALREADY_MATCHED');

      // Payout A is matched already: another line of the same amount cannot take it (SQL: unique target).
      const aLine = await bankLineOn('2026-11-04');
      const aMatch = await t.db('reconciliation_matches').where({ bank_line_id: aLine }).first('payout_id');
      expect(aMatch.payout_id).toBe(payouts.a);
      await expect(
        t.db('reconciliation_matches').insert({
          bank_line_id: rent,
          target_kind: 'payout',
          payout_id: payouts.a,
          amount_cents: '-180000',
          status: 'suggested',
          created_by: people.bookkeeper!.id,
        }),
      ).rejects.toMatchObject({ code: expect.stringMatching(/^(23505|23514)$/) });
      // The database checks the amounts too, whoever writes.
      const payroll1200 = await t
        .db('bank_lines')
        .where({ bank_account_id: payroll, amount_cents: '-120000' })
        .first('id');
      await expect(
        t.db('reconciliation_matches').insert({
          bank_line_id: payroll1200.id,
          target_kind: 'commission_payment',
          commission_statement_id: northCommission,
          amount_cents: '-120000',
          status: 'suggested',
          created_by: people.bookkeeper!.id,
        }),
      ).rejects.toMatchObject({ code: '23514', constraint: 'reconciliation_matches_amount' });
    });

    it('locks the period once every line is confirmed; overlapping locks are refused', async () => {
      const v = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      for (const m of v.body.matched as { id: string; status: string }[]) {
        if (m.status === 'suggested') {
          expect((await as('bookkeeper').post(`/api/reconciliation/matches/${m.id}/confirm`)).status).toBe(
            200,
          );
        }
      }
      const ready = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      expect(ready.body.lockBlockers).toEqual({
        unmatchedBankLines: 0,
        unconfirmedMatches: 0,
        unmatchedPayouts: 0,
        unmatchedCommissionPayments: 0,
        uncoveredDays: 0,
      });
      expect(ready.body.matched).toHaveLength(5);
      const res = await as('bookkeeper').post('/api/reconciliation/lock', {
        bankAccountId: operating,
        from: '2026-11-01',
        to: '2026-11-30',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        periodStart: '2026-11-01',
        periodEnd: '2026-11-30',
        lockedBy: { id: people.bookkeeper!.id },
      });
      const locked = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      expect(locked.body.locked).toBe(true);
      expect(locked.body.matched.every((m: { locked: boolean }) => m.locked)).toBe(true);

      const overlap = await as('bookkeeper').post('/api/reconciliation/lock', {
        bankAccountId: operating,
        from: '2026-11-30',
        to: '2026-12-05',
      });
      expect(overlap.status).toBe(409);
      expect(overlap.body.code).toBe('RECONCILIATION.PERIOD_OVERLAPS');
      const periods = await as('bookkeeper').get(`/api/reconciliation/periods?bankAccountId=${operating}`);
      expect(periods.body).toHaveLength(1);
    });

    it('refuses changes inside the locked period through the API', async () => {
      const v = await view('bookkeeper', operating, '2026-11-01', '2026-11-30');
      const undo = await as('bookkeeper').delete(`/api/reconciliation/matches/${v.body.matched[0].id}`);
      expect(undo.status).toBe(409);
      expect(undo.body.code).toBe('RECONCILIATION.PERIOD_LOCKED');
      // A later file with a line dated inside the locked month: that row is refused like any bad row.
      const late = `${DECEMBER}11/30/2026,LATE FEE REVERSAL,5.00,"11,421.37"\n`;
      const res = await as('bookkeeper').upload('/api/bank-statements', late, 'dec.csv', {
        bankAccountId: operating,
        mapping: JSON.stringify(SIGNED_MAPPING),
      });
      expect(res.status).toBe(422);
      expect(res.body.details.errors).toEqual([
        expect.objectContaining({ rowNumber: 4, code: 'BANK_STATEMENT.DATE_LOCKED', field: 'date' }),
      ]);
      const skipped = await as('bookkeeper').upload('/api/bank-statements', late, 'dec.csv', {
        bankAccountId: operating,
        mapping: JSON.stringify(SIGNED_MAPPING),
        skipInvalidRows: 'true',
      });
      expect(skipped.status, JSON.stringify(skipped.body)).toBe(201);
      expect(skipped.body).toMatchObject({ lineCount: 2, periodFrom: '2026-12-02', periodTo: '2026-12-03' });
    });

    it('refuses changes inside the locked period at the SQL level', async () => {
      const line = await bankLineOn('2026-11-10');
      const match = await t.db('reconciliation_matches').where({ bank_line_id: line }).first('id');
      const locked = { code: '23001', constraint: 'reconciliation_period_locked' };
      await expect(t.db('reconciliation_matches').where({ id: match.id }).delete()).rejects.toMatchObject(
        locked,
      );
      await expect(
        t.db('reconciliation_matches').where({ id: match.id }).update({ note: 'changed' }),
      ).rejects.toMatchObject({ code: '23001' });
      await expect(t.db('bank_lines').where({ id: line }).delete()).rejects.toMatchObject(locked);
      await expect(t.db('bank_lines').where({ id: line }).update({ description: 'x' })).rejects.toMatchObject(
        {
          code: '23001',
        },
      );
      await expect(
        t.db('bank_lines').insert({
          statement_id: novemberId,
          bank_account_id: operating,
          row_number: 99,
          posted_on: '2026-11-20',
          amount: '1.00',
          amount_cents: '100',
        }),
      ).rejects.toMatchObject(locked);
      await expect(
        t.db('reconciled_periods').where({ bank_account_id: operating }).delete(),
      ).rejects.toMatchObject({
        code: '23001',
      });
      // Outside the lock the same kinds of change go through: the December line can be matched and undone.
      const dec = await bankLineOn('2026-12-02');
      const made = await as('bookkeeper').post('/api/reconciliation/matches', {
        bankLineId: dec,
        targetKind: 'other',
        note: 'Interest',
      });
      expect(made.status).toBe(201);
      expect((await as('bookkeeper').delete(`/api/reconciliation/matches/${made.body.id}`)).status).toBe(204);
    });
  });

  describe('payout breakdown', () => {
    it('lists the charges (contract, homeowner), the refund and the fees, and says it balances', async () => {
      const res = await as('bookkeeper').get(`/api/payouts/${payouts.a}/breakdown`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.payout).toMatchObject({ amount: '2129.80', arrivalDate: '2026-11-03' });
      expect(res.body.breakdown).toMatchObject({
        chargeCount: 2,
        refundCount: 1,
        charges: '2400.00',
        refunds: '-200.00',
        fees: '70.20',
        net: '2129.80',
        payoutAmount: '2129.80',
        difference: '0.00',
        balanced: true,
      });
      expect(
        res.body.charges.map(
          (c: { homeownerName: string; contractId: string; amount: string; fee: string }) => [
            c.homeownerName,
            c.contractId,
            c.amount,
            c.fee,
          ],
        ),
      ).toEqual(
        expect.arrayContaining([
          ['Avery Fieldstone', jobs[0]!.contractId, '1500.00', '43.80'],
          ['Rowan Marlpit', jobs[1]!.contractId, '900.00', '26.40'],
        ]),
      );
      expect(res.body.refunds).toEqual([
        expect.objectContaining({
          amount: '-200.00',
          homeownerName: 'Rowan Marlpit',
          contractId: jobs[1]!.contractId,
        }),
      ]);
      expect(res.body.branches).toEqual([
        expect.objectContaining({
          branchId: north,
          gross: '2200.00',
          fee: '70.20',
          net: '2129.80',
          itemCount: 3,
        }),
      ]);
      expect(res.body.match).toMatchObject({ status: 'confirmed', bankAccountId: operating });
      expect(res.body.match.bankLine.postedOn).toBe('2026-11-04');
    });

    it('says so when a payout does not add up', async () => {
      // Payout B has no balance transactions recorded: net 0.00 against 970.70.
      const res = await as('bookkeeper').get(`/api/payouts/${payouts.b}/breakdown`);
      expect(res.body.breakdown).toMatchObject({ net: '0.00', difference: '970.70', balanced: false });
      expect((await as('bookkeeper').get(`/api/payouts/${randomUUID()}/breakdown`)).status).toBe(404);
    });
  });

  describe('at volume', () => {
    it('suggests 5,000 payouts against 5,000 bank lines through the API (a figure, not a benchmark)', async () => {
      const N = 5000;
      const acct = await as('bookkeeper').post('/api/bank-accounts', { name: 'Volume', last4: '5000' });
      const accountId: string = acct.body.id;
      // Invented data in 2027, away from the other cases: payout i of (100 + i).00 arriving on day i % 28 + 1
      // of January; its bank line one day later. Amounts are unique, so every pair is found.
      await t.db.raw(
        `insert into processor_payouts (processor_payout_id, amount, currency, arrival_date, status, processor_created_at)
         select 'po_vol_' || ? || '_' || i, (100 + i)::numeric(14,2), 'usd', date '2027-01-01' + (i % 28), 'paid', now()
         from generate_series(1, ?) as i`,
        [run, N],
      );
      const [st] = await t
        .db('bank_statements')
        .insert({
          bank_account_id: accountId,
          file_name: 'volume.csv',
          file_sha256: 'a'.repeat(64),
          file_bytes: 1,
          period_from: '2027-01-01',
          period_to: '2027-01-31',
          row_count: N + 1,
          line_count: N,
          mapping: JSON.stringify(SIGNED_MAPPING),
          uploaded_by: people.bookkeeper!.id,
        })
        .returning('id');
      await t.db.raw(
        `insert into bank_lines (statement_id, bank_account_id, row_number, posted_on, description, amount, amount_cents)
         select ?, ?, i + 1, date '2027-01-02' + (i % 28), 'TRANSFER ' || i, (100 + i)::numeric(14,2), (100 + i) * 100
         from generate_series(1, ?) as i`,
        [st.id, accountId, N],
      );
      const started = process.hrtime.bigint();
      const res = await as('bookkeeper').post(
        `/api/reconciliation/suggest?bankAccountId=${accountId}&from=2027-01-01&to=2027-01-31`,
      );
      const ms = Number((process.hrtime.bigint() - started) / 1_000_000n);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ suggested: N, bankLinesConsidered: N, targetsConsidered: N });
      const viewStarted = process.hrtime.bigint();
      const v = await view('bookkeeper', accountId, '2027-01-01', '2027-01-31');
      const viewMs = Number((process.hrtime.bigint() - viewStarted) / 1_000_000n);
      expect(v.body.matched).toHaveLength(N);
      expect(v.body.matched.every((m: { daysApart: number }) => m.daysApart === 1)).toBe(true);
      console.info(
        `[reconciliation] suggest ${N} × ${N} through the API: ${ms} ms; workspace view: ${viewMs} ms`,
      );
      expect(ms).toBeLessThan(30_000);
    });
  });

  describe('who may', () => {
    it('lets only the bookkeeper and the owner reconcile', async () => {
      const range = `bankAccountId=${operating}&from=2026-11-01&to=2026-11-30`;
      expect((await view('owner', operating, '2026-11-01', '2026-11-30')).status).toBe(200);
      for (const who of ['manager', 'northSales', 'crewLead']) {
        const calls = [
          await as(who).get('/api/bank-accounts'),
          await as(who).post('/api/bank-accounts', { name: 'Mine', last4: '1111' }),
          await as(who).get(`/api/reconciliation?${range}`),
          await as(who).post(`/api/reconciliation/suggest?${range}`),
          await as(who).post('/api/reconciliation/lock', {
            bankAccountId: operating,
            from: '2026-12-01',
            to: '2026-12-31',
          }),
          await as(who).get(`/api/bank-statements/${novemberId}/lines`),
          await as(who).get(`/api/payouts/${payouts.a}/breakdown`),
          await as(who).upload('/api/bank-statements/preview', NOVEMBER, 'n.csv', {}),
        ];
        expect(
          calls.map((c) => c.status),
          who,
        ).toEqual(calls.map(() => 403));
        expect(calls.every((c) => c.body.code === 'AUTH.FORBIDDEN')).toBe(true);
      }
      const unknown = await view('bookkeeper', randomUUID(), '2026-11-01', '2026-11-30');
      expect(unknown.status).toBe(404);
      expect(unknown.body.code).toBe('BANK_ACCOUNT.NOT_FOUND');
      const noMatch = await as('bookkeeper').post(`/api/reconciliation/matches/${randomUUID()}/confirm`);
      expect(noMatch.status).toBe(404);
      expect(noMatch.body.code).toBe('RECONCILIATION.MATCH_NOT_FOUND');
      expect((await as('bookkeeper').get(`/api/bank-statements/${randomUUID()}/lines`)).status).toBe(404);
    });
  });
});
