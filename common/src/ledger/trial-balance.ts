// Balances and the trial balance, from the debit and credit totals of each account.
import { money, MoneyDecimal } from '../money';
import type { AccountType, Side } from './accounts';

/** An account's balance on its normal side: debits − credits for a debit-normal account, else the reverse. */
export function balanceOnNormalSide(normalSide: Side, debits: string, credits: string): string {
  const d = money(debits);
  const c = money(credits);
  const b = normalSide === 'debit' ? d.minus(c) : c.minus(d);
  return b.isZero() ? '0.00' : b.toFixed(2);
}

export interface AccountTotals {
  code: string;
  name: string;
  type: AccountType;
  normalSide: Side;
  /** Sum of the debit lines ("0.00" when none). */
  debitTotal: string;
  creditTotal: string;
}

export interface TrialBalanceRow extends AccountTotals {
  /** The net balance, shown in the debit column when debits exceed credits ("0.00" otherwise). */
  debitBalance: string;
  creditBalance: string;
}

export interface TrialBalanceTotals {
  debitTotal: string;
  creditTotal: string;
  debitBalance: string;
  creditBalance: string;
  /** creditTotal − debitTotal; "0.00" when the ledger balances. */
  difference: string;
  balanced: boolean;
}

export interface TrialBalanceFigures {
  rows: TrialBalanceRow[];
  totals: TrialBalanceTotals;
}

/**
 * The trial balance of a set of accounts: each account's net balance in the debit or the credit column,
 * and the column totals. Because every entry balances, the debit and credit totals are equal and so are the
 * balance columns; `balanced` says whether they are, so a screen can show the rare day they are not.
 */
export function trialBalance(accounts: readonly AccountTotals[]): TrialBalanceFigures {
  const zero = new MoneyDecimal(0);
  let dt = zero;
  let ct = zero;
  let db = zero;
  let cb = zero;
  const rows = accounts.map((a): TrialBalanceRow => {
    const d = money(a.debitTotal);
    const c = money(a.creditTotal);
    const net = d.minus(c);
    dt = dt.plus(d);
    ct = ct.plus(c);
    const debitBalance = net.isPositive() && !net.isZero() ? net : zero;
    const creditBalance = net.isNegative() && !net.isZero() ? net.negated() : zero;
    db = db.plus(debitBalance);
    cb = cb.plus(creditBalance);
    return {
      ...a,
      debitTotal: d.toFixed(2),
      creditTotal: c.toFixed(2),
      debitBalance: debitBalance.toFixed(2),
      creditBalance: creditBalance.toFixed(2),
    };
  });
  const difference = ct.minus(dt);
  return {
    rows,
    totals: {
      debitTotal: dt.toFixed(2),
      creditTotal: ct.toFixed(2),
      debitBalance: db.toFixed(2),
      creditBalance: cb.toFixed(2),
      difference: difference.isZero() ? '0.00' : difference.toFixed(2),
      balanced: difference.isZero() && db.equals(cb),
    },
  };
}
