import { describe, expect, it } from 'vitest';
import { ACCOUNTS, CHART_OF_ACCOUNTS, chartAccount, isAccountCode, normalSideOf } from './accounts';

describe('chart of accounts', () => {
  it('has every account the usual postings name, once (REFERENCE-VALUES.md "Money")', () => {
    const codes = CHART_OF_ACCOUNTS.map((a) => a.code);
    expect(new Set(codes).size).toBe(codes.length);
    expect(codes.sort()).toEqual(Object.values(ACCOUNTS).sort());
    for (const code of codes) expect(code).toMatch(/^[0-9]{4}$/);
  });

  it.each([
    // code, type, normal side — the usual sides: assets and expenses debit; liabilities, equity, revenue credit
    [ACCOUNTS.bank, 'asset', 'debit'],
    [ACCOUNTS.processorClearing, 'asset', 'debit'],
    [ACCOUNTS.accountsReceivable, 'asset', 'debit'],
    // ASC 606-10-45-2 (published): a deposit before the work is a contract liability
    [ACCOUNTS.customerDeposits, 'liability', 'credit'],
    [ACCOUNTS.commissionsPayable, 'liability', 'credit'],
    [ACCOUNTS.openingEquity, 'equity', 'credit'],
    [ACCOUNTS.contractRevenue, 'revenue', 'credit'],
    // a contra-revenue account sits on the debit side
    [ACCOUNTS.refunds, 'revenue', 'debit'],
    [ACCOUNTS.processingFees, 'expense', 'debit'],
    [ACCOUNTS.commissionExpense, 'expense', 'debit'],
  ] as const)('%s is a %s account, normally a %s balance', (code, type, side) => {
    const a = chartAccount(code);
    expect(a?.type).toBe(type);
    expect(a?.normalSide).toBe(side);
  });

  it('keeps the commission accounts per salesperson, and only those', () => {
    expect(
      CHART_OF_ACCOUNTS.filter((a) => a.salespersonSubledger)
        .map((a) => a.code)
        .sort(),
    ).toEqual([ACCOUNTS.commissionsPayable, ACCOUNTS.commissionExpense].sort());
  });

  it('every account but the contra-revenue one has the normal side of its type', () => {
    for (const a of CHART_OF_ACCOUNTS.filter((x) => x.code !== ACCOUNTS.refunds)) {
      expect(a.normalSide).toBe(normalSideOf(a.type));
    }
    expect(isAccountCode('1010')).toBe(true);
    expect(isAccountCode('1011')).toBe(false);
  });
});
