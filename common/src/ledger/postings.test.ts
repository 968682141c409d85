import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { money, MoneyDecimal } from '../money';
import { ACCOUNTS, CHART_OF_ACCOUNTS } from './accounts';
import { assertBalanced, LedgerError, netByAccount, type Posting, type PostingLine } from './posting';
import {
  balancePaidByCard,
  balancePaidToBank,
  commissionClawback,
  commissionEarned,
  commissionPaid,
  depositCapturedByCard,
  depositReceivedToBank,
  jobCompleted,
  openingBalance,
  processorPayout,
  refundAfterCancellation,
  refundOfRevenue,
  reversalOf,
} from './postings';
import { trialBalance } from './trial-balance';

const { bank, processorClearing, accountsReceivable, customerDeposits, commissionsPayable } = ACCOUNTS;
const { contractRevenue, refunds, processingFees, commissionExpense, openingEquity } = ACCOUNTS;
const SP = '6f1d2c3b-0000-4000-8000-000000000001';

/** Lines as [account, side, amount, salesperson?] for compact tables. */
type L = [string, 'debit' | 'credit', string, string?];
const lines = (p: Posting): L[] =>
  p.lines.map((l) =>
    l.salespersonId ? [l.account, l.side, l.amount, l.salespersonId] : [l.account, l.side, l.amount],
  );

// Fees in these examples follow Stripe's standard US card price, 2.9% + 30¢ per successful charge (Stripe
// pricing page, memory); the processor reports the fee it took, the builders only book it.
//   1000.00 × 2.9% = 29.00, + 0.30 = 29.30, net 970.70
//   3000.00 × 2.9% = 87.00, + 0.30 = 87.30, net 2912.70
//   1234.56 × 2.9% = 35.80224 → 35.80, + 0.30 = 36.10, net 1198.46
describe('posting builders: the usual postings (REFERENCE-VALUES.md "Money", common practice)', () => {
  it.each<[string, Posting, L[]]>([
    [
      'card deposit captured: clearing (net) + fees / customer deposits (gross)',
      depositCapturedByCard({ gross: '1000.00', fee: '29.30' }),
      [
        [processorClearing, 'debit', '970.70'],
        [processingFees, 'debit', '29.30'],
        [customerDeposits, 'credit', '1000.00'],
      ],
    ],
    [
      'card deposit with cents: 1234.56 less 36.10',
      depositCapturedByCard({ gross: '1234.56', fee: '36.10' }),
      [
        [processorClearing, 'debit', '1198.46'],
        [processingFees, 'debit', '36.10'],
        [customerDeposits, 'credit', '1234.56'],
      ],
    ],
    [
      'card deposit with no fee: no fee line (every line is more than zero)',
      depositCapturedByCard({ gross: '500', fee: '0' }),
      [
        [processorClearing, 'debit', '500.00'],
        [customerDeposits, 'credit', '500.00'],
      ],
    ],
    [
      'deposit by cheque: bank / customer deposits',
      depositReceivedToBank({ amount: '750.5', method: 'cheque' }),
      [
        [bank, 'debit', '750.50'],
        [customerDeposits, 'credit', '750.50'],
      ],
    ],
    [
      'payout: bank / processor clearing',
      processorPayout({ amount: '970.70' }),
      [
        [bank, 'debit', '970.70'],
        [processorClearing, 'credit', '970.70'],
      ],
    ],
    [
      'job completed: deposits held 1000 + receivable 3000 / revenue 4000',
      jobCompleted({ contractPrice: '4000.00', depositsHeld: '1000.00' }),
      [
        [customerDeposits, 'debit', '1000.00'],
        [accountsReceivable, 'debit', '3000.00'],
        [contractRevenue, 'credit', '4000.00'],
      ],
    ],
    [
      'job completed with no deposit: receivable / revenue',
      jobCompleted({ contractPrice: '2480.15', depositsHeld: '0' }),
      [
        [accountsReceivable, 'debit', '2480.15'],
        [contractRevenue, 'credit', '2480.15'],
      ],
    ],
    [
      'job completed, paid in full up front: deposits / revenue, no receivable',
      jobCompleted({ contractPrice: '1800.00', depositsHeld: '1800.00' }),
      [
        [customerDeposits, 'debit', '1800.00'],
        [contractRevenue, 'credit', '1800.00'],
      ],
    ],
    [
      'balance paid by card: clearing (net) + fees / receivable (gross)',
      balancePaidByCard({ gross: '3000.00', fee: '87.30' }),
      [
        [processorClearing, 'debit', '2912.70'],
        [processingFees, 'debit', '87.30'],
        [accountsReceivable, 'credit', '3000.00'],
      ],
    ],
    [
      'balance paid by transfer: bank / receivable',
      balancePaidToBank({ amount: '3000', method: 'transfer' }),
      [
        [bank, 'debit', '3000.00'],
        [accountsReceivable, 'credit', '3000.00'],
      ],
    ],
    [
      'commission earned: expense / payable, both on the salesperson',
      commissionEarned({ amount: '296.40', salespersonId: SP }),
      [
        [commissionExpense, 'debit', '296.40', SP],
        [commissionsPayable, 'credit', '296.40', SP],
      ],
    ],
    [
      'commission paid: payable / bank',
      commissionPaid({ amount: '296.40', salespersonId: SP }),
      [
        [commissionsPayable, 'debit', '296.40', SP],
        [bank, 'credit', '296.40'],
      ],
    ],
    [
      'commission clawed back: payable / expense (the earning reversed)',
      commissionClawback({ amount: '148.20', salespersonId: SP }),
      [
        [commissionsPayable, 'debit', '148.20', SP],
        [commissionExpense, 'credit', '148.20', SP],
      ],
    ],
    [
      'refund after cancellation, to the card: customer deposits / clearing (full amount)',
      refundAfterCancellation({ amount: '1000.00', via: 'processor' }),
      [
        [customerDeposits, 'debit', '1000.00'],
        [processorClearing, 'credit', '1000.00'],
      ],
    ],
    [
      'refund after cancellation, of a cheque deposit: customer deposits / bank',
      refundAfterCancellation({ amount: '750.50', via: 'bank' }),
      [
        [customerDeposits, 'debit', '750.50'],
        [bank, 'credit', '750.50'],
      ],
    ],
    [
      'refund on completed work: refunds and allowances (contra-revenue) / clearing',
      refundOfRevenue({ amount: '200', via: 'processor' }),
      [
        [refunds, 'debit', '200.00'],
        [processorClearing, 'credit', '200.00'],
      ],
    ],
    [
      'opening balance of the bank: bank / opening equity',
      openingBalance({ account: bank, amount: '10000' }),
      [
        [bank, 'debit', '10000.00'],
        [openingEquity, 'credit', '10000.00'],
      ],
    ],
    [
      'opening balance of a liability: opening equity / customer deposits',
      openingBalance({ account: customerDeposits, amount: '2500.00' }),
      [
        [openingEquity, 'debit', '2500.00'],
        [customerDeposits, 'credit', '2500.00'],
      ],
    ],
  ])('%s', (_name, posting, expected) => {
    expect(lines(posting)).toEqual(expected);
    expect(() => assertBalanced(posting)).not.toThrow();
  });

  it('names each event with its reason code', () => {
    expect(depositCapturedByCard({ gross: '1', fee: '0.01' }).reasonCode).toBe('deposit.card');
    expect(depositReceivedToBank({ amount: '1', method: 'cash' }).reasonCode).toBe('deposit.bank');
    expect(processorPayout({ amount: '1' }).reasonCode).toBe('processor.payout');
    expect(jobCompleted({ contractPrice: '1', depositsHeld: '0' }).reasonCode).toBe('job.completed');
    expect(balancePaidByCard({ gross: '1', fee: '0' }).reasonCode).toBe('balance.card');
    expect(commissionClawback({ amount: '1', salespersonId: SP }).reasonCode).toBe('commission.clawback');
    expect(refundAfterCancellation({ amount: '1', via: 'bank' }).reasonCode).toBe('refund.cancellation');
  });

  it.each<[string, () => unknown, string]>([
    [
      'a fee as large as the payment',
      () => depositCapturedByCard({ gross: '10', fee: '10' }),
      'LEDGER.INPUT_INVALID',
    ],
    ['a negative fee', () => depositCapturedByCard({ gross: '10', fee: '-1' }), 'LEDGER.AMOUNT_INVALID'],
    ['a zero payout', () => processorPayout({ amount: '0.00' }), 'LEDGER.AMOUNT_INVALID'],
    ['a third decimal', () => processorPayout({ amount: '10.005' }), 'LEDGER.AMOUNT_INVALID'],
    ['an exponent', () => processorPayout({ amount: '1e3' }), 'LEDGER.AMOUNT_INVALID'],
    [
      'deposits above the price',
      () => jobCompleted({ contractPrice: '100', depositsHeld: '100.01' }),
      'LEDGER.INPUT_INVALID',
    ],
    [
      'a commission with no salesperson',
      () => commissionEarned({ amount: '5', salespersonId: '' }),
      'LEDGER.SALESPERSON_REQUIRED',
    ],
    [
      'an opening balance on opening equity',
      () => openingBalance({ account: openingEquity, amount: '1' }),
      'LEDGER.UNKNOWN_ACCOUNT',
    ],
    [
      'an opening payable with no salesperson',
      () => openingBalance({ account: commissionsPayable, amount: '1' }),
      'LEDGER.SALESPERSON_REQUIRED',
    ],
  ])('refuses %s', (_name, build, code) => {
    expect(build).toThrow(LedgerError);
    try {
      build();
    } catch (e) {
      expect((e as LedgerError).code).toBe(code);
    }
  });
});

describe('assertBalanced', () => {
  const ok: PostingLine[] = [
    { account: bank, side: 'debit', amount: '10.00' },
    { account: customerDeposits, side: 'credit', amount: '10.00' },
  ];
  it('returns the totals of a balanced posting', () => {
    expect(assertBalanced({ lines: ok })).toEqual({ debits: '10.00', credits: '10.00' });
  });
  it.each<[string, PostingLine[], string]>([
    ['one line', [ok[0]!], 'LEDGER.TOO_FEW_LINES'],
    ['no lines', [], 'LEDGER.TOO_FEW_LINES'],
    ['a cent out', [ok[0]!, { ...ok[1]!, amount: '9.99' }], 'LEDGER.UNBALANCED'],
    ['two debits', [ok[0]!, { ...ok[1]!, side: 'debit' }], 'LEDGER.UNBALANCED'],
    ['a zero line', [...ok, { account: bank, side: 'debit', amount: '0.00' }], 'LEDGER.AMOUNT_INVALID'],
    ['a negative line', [...ok, { account: bank, side: 'debit', amount: '-1.00' }], 'LEDGER.AMOUNT_INVALID'],
    ['three decimals', [{ ...ok[0]!, amount: '10.001' }, ok[1]!], 'LEDGER.AMOUNT_INVALID'],
    [
      'an account not in the chart',
      [{ ...ok[0]!, account: '9999' as typeof bank }, ok[1]!],
      'LEDGER.UNKNOWN_ACCOUNT',
    ],
    ['a side that is neither', [{ ...ok[0]!, side: 'left' as 'debit' }, ok[1]!], 'LEDGER.SIDE_INVALID'],
    [
      'a payable line with no salesperson',
      [
        { account: commissionExpense, side: 'debit', amount: '5.00', salespersonId: SP },
        { account: commissionsPayable, side: 'credit', amount: '5.00' },
      ],
      'LEDGER.SALESPERSON_REQUIRED',
    ],
  ])('refuses %s', (_name, bad, code) => {
    expect(() => assertBalanced({ lines: bad })).toThrow(expect.objectContaining({ code }));
  });
  it('adds exactly where binary floating point would not: 0.10 + 0.20 = 0.30', () => {
    expect(() =>
      assertBalanced({
        lines: [
          { account: bank, side: 'debit', amount: '0.10' },
          { account: bank, side: 'debit', amount: '0.20' },
          { account: customerDeposits, side: 'credit', amount: '0.30' },
        ],
      }),
    ).not.toThrow();
  });
});

describe('reversalOf', () => {
  it('puts every line on the other side and names the original', () => {
    const original = commissionEarned({ amount: '296.40', salespersonId: SP });
    const rev = reversalOf(original, 'wrong salesperson');
    expect(rev.reasonCode).toBe('reversal');
    expect(rev.memo).toBe('Reversal of “Commission earned”: wrong salesperson');
    expect(lines(rev)).toEqual([
      [commissionExpense, 'credit', '296.40', SP],
      [commissionsPayable, 'debit', '296.40', SP],
    ]);
  });
});

describe('a sale end to end, hand-checked', () => {
  const balances = (postings: Posting[]) => netByAccount(postings.flatMap((p) => p.lines));

  it('deposit by card, payout, completion, balance by card: deposits and receivable end at zero', () => {
    const net = balances([
      depositCapturedByCard({ gross: '1000.00', fee: '29.30' }),
      processorPayout({ amount: '970.70' }),
      jobCompleted({ contractPrice: '4000.00', depositsHeld: '1000.00' }),
      balancePaidByCard({ gross: '3000.00', fee: '87.30' }),
    ]);
    expect(net).toEqual({
      [processorClearing]: '2912.70', // 970.70 − 970.70 + 2912.70
      [processingFees]: '116.60', // 29.30 + 87.30
      [customerDeposits]: '0.00',
      [bank]: '970.70',
      [accountsReceivable]: '0.00',
      [contractRevenue]: '-4000.00', // a credit balance
    });
  });

  it('a cancelled card deposit: the refund takes the whole deposit out of clearing, the fee stays an expense', () => {
    const net = balances([
      depositCapturedByCard({ gross: '1000.00', fee: '29.30' }),
      refundAfterCancellation({ amount: '1000.00', via: 'processor' }),
    ]);
    // Clearing: 970.70 − 1000.00 = −29.30, the fee the processor kept, recovered from a later payout.
    expect(net).toEqual({
      [processorClearing]: '-29.30',
      [processingFees]: '29.30',
      [customerDeposits]: '0.00',
    });
  });
});

// Any positive amount up to 10^9, in cents: an integer of cents, written as a decimal string.
const cents = (min = 1) =>
  fc
    .bigInt({ min: BigInt(min), max: 100_000_000_000n })
    .map((c) => new MoneyDecimal(c.toString()).div(100).toFixed(2));

const anyPosting: fc.Arbitrary<Posting> = fc.oneof(
  fc.tuple(cents(2), fc.integer({ min: 0, max: 999 })).map(([gross, permille]) => {
    const fee = money(gross).times(permille).div(1000).toDecimalPlaces(2, MoneyDecimal.ROUND_DOWN);
    return depositCapturedByCard({ gross, fee: fee.toFixed(2) });
  }),
  fc.tuple(cents(2), fc.integer({ min: 0, max: 999 })).map(([gross, permille]) => {
    const fee = money(gross).times(permille).div(1000).toDecimalPlaces(2, MoneyDecimal.ROUND_DOWN);
    return balancePaidByCard({ gross, fee: fee.toFixed(2) });
  }),
  cents().map((amount) => depositReceivedToBank({ amount, method: 'cash' })),
  cents().map((amount) => balancePaidToBank({ amount, method: 'cheque' })),
  cents().map((amount) => processorPayout({ amount })),
  fc.tuple(cents(), fc.integer({ min: 0, max: 100 })).map(([price, pct]) => {
    const held = money(price).times(pct).div(100).toDecimalPlaces(2, MoneyDecimal.ROUND_DOWN);
    return jobCompleted({ contractPrice: price, depositsHeld: held.toFixed(2) });
  }),
  cents().map((amount) => commissionEarned({ amount, salespersonId: SP })),
  cents().map((amount) => commissionPaid({ amount, salespersonId: SP })),
  cents().map((amount) => commissionClawback({ amount, salespersonId: SP })),
  fc
    .tuple(cents(), fc.constantFrom('processor', 'bank') as fc.Arbitrary<'processor' | 'bank'>)
    .map(([amount, via]) => refundAfterCancellation({ amount, via })),
  fc
    .tuple(cents(), fc.constantFrom('processor', 'bank') as fc.Arbitrary<'processor' | 'bank'>)
    .map(([amount, via]) => refundOfRevenue({ amount, via })),
  fc
    .tuple(cents(), fc.constantFrom(...CHART_OF_ACCOUNTS.filter((a) => a.code !== openingEquity)))
    .map(([amount, a]) =>
      openingBalance({
        account: a.code as typeof bank,
        amount,
        ...(a.salespersonSubledger ? { salespersonId: SP } : {}),
      }),
    ),
);

describe('properties (fast-check)', () => {
  it('every builder balances, for any amounts, with every line above zero', () => {
    fc.assert(
      fc.property(anyPosting, (p) => {
        const totals = assertBalanced(p);
        expect(totals.debits).toBe(totals.credits);
        for (const l of p.lines) expect(money(l.amount).greaterThan(0)).toBe(true);
      }),
    );
  });

  it('an entry and its reversal net to zero on every account', () => {
    fc.assert(
      fc.property(anyPosting, (p) => {
        const rev = reversalOf(p);
        assertBalanced(rev);
        const net = netByAccount([...p.lines, ...rev.lines]);
        for (const v of Object.values(net)) expect(v).toBe('0.00');
      }),
    );
  });

  it('any sequence of postings gives a trial balance whose columns are equal', () => {
    fc.assert(
      fc.property(fc.array(anyPosting, { minLength: 1, maxLength: 30 }), (ps) => {
        const all = ps.flatMap((p) => p.lines);
        const tb = trialBalance(
          CHART_OF_ACCOUNTS.map((a) => {
            const mine = all.filter((l) => l.account === a.code);
            const sum = (side: string) =>
              mine
                .filter((l) => l.side === side)
                .reduce((s, l) => s.plus(l.amount), new MoneyDecimal(0))
                .toFixed(2);
            return { ...a, debitTotal: sum('debit'), creditTotal: sum('credit') };
          }),
        );
        expect(tb.totals.balanced).toBe(true);
        expect(tb.totals.debitTotal).toBe(tb.totals.creditTotal);
        expect(tb.totals.debitBalance).toBe(tb.totals.creditBalance);
      }),
    );
  });
});
