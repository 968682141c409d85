import { describe, expect, it } from 'vitest';
import { balanceOnNormalSide, trialBalance, type AccountTotals } from './trial-balance';

const acct = (
  code: string,
  normalSide: 'debit' | 'credit',
  debitTotal: string,
  creditTotal: string,
): AccountTotals => ({
  code,
  name: code,
  type: normalSide === 'debit' ? 'asset' : 'liability',
  normalSide,
  debitTotal,
  creditTotal,
});

describe('balanceOnNormalSide', () => {
  it.each([
    ['debit', '970.70', '0', '970.70'],
    ['debit', '970.70', '1000.00', '-29.30'], // clearing after a refunded card deposit: short by the fee
    ['credit', '1000.00', '1000.00', '0.00'],
    ['credit', '0', '4000.00', '4000.00'],
  ] as const)('%s-normal, debits %s, credits %s → %s', (side, d, c, b) => {
    expect(balanceOnNormalSide(side, d, c)).toBe(b);
  });
});

describe('trialBalance', () => {
  it('puts each net balance in its column and totals both (hand-checked)', () => {
    // deposit 1000 by card (fee 29.30), payout 970.70, completion 4000, balance 3000 by card (fee 87.30)
    const tb = trialBalance([
      acct('1010', 'debit', '970.70', '0'),
      acct('1050', 'debit', '3883.40', '970.70'),
      acct('1200', 'debit', '3000.00', '3000.00'),
      acct('2100', 'credit', '1000.00', '1000.00'),
      acct('4000', 'credit', '0', '4000.00'),
      acct('5100', 'debit', '116.60', '0'),
    ]);
    expect(tb.rows.map((r) => [r.code, r.debitBalance, r.creditBalance])).toEqual([
      ['1010', '970.70', '0.00'],
      ['1050', '2912.70', '0.00'],
      ['1200', '0.00', '0.00'],
      ['2100', '0.00', '0.00'],
      ['4000', '0.00', '4000.00'],
      ['5100', '116.60', '0.00'],
    ]);
    // 970.70 + 3883.40 + 3000 + 1000 + 116.60 = 8970.70 each side
    expect(tb.totals).toEqual({
      debitTotal: '8970.70',
      creditTotal: '8970.70',
      debitBalance: '4000.00',
      creditBalance: '4000.00',
      difference: '0.00',
      balanced: true,
    });
  });

  it('says so when the columns differ', () => {
    const tb = trialBalance([acct('1010', 'debit', '10.00', '0'), acct('2100', 'credit', '0', '9.99')]);
    expect(tb.totals.balanced).toBe(false);
    expect(tb.totals.difference).toBe('-0.01');
  });

  it('an empty ledger balances at zero', () => {
    expect(trialBalance([]).totals).toMatchObject({
      debitTotal: '0.00',
      creditTotal: '0.00',
      balanced: true,
    });
  });
});
