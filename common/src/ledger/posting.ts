// A posting is a journal entry as a value, before it is written: a reason code, lines and a memo. It is
// checked for balance here (assertBalanced) and again by the database when the transaction commits.
import { isDecimalString, money, MoneyDecimal, type Money } from '../money';
import { chartAccount, SIDES, type AccountCode, type Side } from './accounts';
import type { ReasonCode } from './reasons';

export interface PostingLine {
  account: AccountCode;
  side: Side;
  /** Positive, two decimals at most ("1234.50"). */
  amount: string;
  /** Required on the accounts kept per salesperson (commission expense, commissions payable). */
  salespersonId?: string;
}

export interface Posting {
  reasonCode: ReasonCode;
  lines: PostingLine[];
  memo: string;
}

export type LedgerErrorCode =
  | 'LEDGER.UNBALANCED'
  | 'LEDGER.TOO_FEW_LINES'
  | 'LEDGER.AMOUNT_INVALID'
  | 'LEDGER.UNKNOWN_ACCOUNT'
  | 'LEDGER.SIDE_INVALID'
  | 'LEDGER.SALESPERSON_REQUIRED'
  | 'LEDGER.INPUT_INVALID';

export class LedgerError extends Error {
  readonly code: LedgerErrorCode;
  constructor(code: LedgerErrorCode, message: string) {
    super(message);
    this.name = 'LedgerError';
    this.code = code;
  }
}

/** The largest amount a numeric(14,2) column holds. */
export const MAX_LEDGER_AMOUNT = money('999999999999.99');

/** Two decimals at most, nothing else: "12", "12.5", "12.50". */
const AMOUNT = /^\d{1,12}(\.\d{1,2})?$/;

/** A positive amount with at most two decimals, as a Decimal; `what` names it in the error. */
export function positiveAmount(value: string, what = 'amount'): Money {
  if (typeof value !== 'string' || !AMOUNT.test(value)) {
    throw new LedgerError(
      'LEDGER.AMOUNT_INVALID',
      `The ${what} must be a positive amount with at most two decimals (got ${JSON.stringify(value)}).`,
    );
  }
  const d = money(value);
  if (d.isZero()) throw new LedgerError('LEDGER.AMOUNT_INVALID', `The ${what} must be more than zero.`);
  return d;
}

/** Zero or more, two decimals at most. */
export function nonNegativeAmount(value: string, what = 'amount'): Money {
  if (typeof value !== 'string' || !AMOUNT.test(value)) {
    throw new LedgerError(
      'LEDGER.AMOUNT_INVALID',
      `The ${what} must be an amount with at most two decimals (got ${JSON.stringify(value)}).`,
    );
  }
  return money(value);
}

export interface PostingTotals {
  debits: string;
  credits: string;
}

function sumSide(lines: readonly PostingLine[], side: Side): Money {
  return lines
    .filter((l) => l.side === side)
    .reduce((acc, l) => acc.plus(money(l.amount)), new MoneyDecimal(0));
}

export function postingTotals(lines: readonly PostingLine[]): PostingTotals {
  return { debits: sumSide(lines, 'debit').toFixed(2), credits: sumSide(lines, 'credit').toFixed(2) };
}

/**
 * Refuses a posting that the database would refuse: fewer than two lines, an amount that is not positive
 * or has more than two decimals, an unknown account, a missing salesperson on a sub-ledger account, or
 * debits that do not equal credits. Returns the posting's totals when it balances.
 */
export function assertBalanced(posting: Pick<Posting, 'lines'>): PostingTotals {
  const { lines } = posting;
  if (!Array.isArray(lines) || lines.length < 2) {
    throw new LedgerError('LEDGER.TOO_FEW_LINES', 'A journal entry needs at least two lines.');
  }
  lines.forEach((line, i) => {
    const account = chartAccount(line.account);
    if (!account) {
      throw new LedgerError('LEDGER.UNKNOWN_ACCOUNT', `Line ${i + 1} names no account of the chart.`);
    }
    if (!(SIDES as readonly string[]).includes(line.side)) {
      throw new LedgerError('LEDGER.SIDE_INVALID', `Line ${i + 1} is neither a debit nor a credit.`);
    }
    if (!isDecimalString(line.amount)) {
      throw new LedgerError('LEDGER.AMOUNT_INVALID', `Line ${i + 1} has no amount.`);
    }
    const amount = positiveAmount(line.amount, `amount of line ${i + 1}`);
    if (amount.greaterThan(MAX_LEDGER_AMOUNT)) {
      throw new LedgerError('LEDGER.AMOUNT_INVALID', `Line ${i + 1} is larger than the ledger holds.`);
    }
    if (account.salespersonSubledger && !line.salespersonId) {
      throw new LedgerError(
        'LEDGER.SALESPERSON_REQUIRED',
        `Line ${i + 1} (${account.name}) must name the salesperson.`,
      );
    }
  });
  const totals = postingTotals(lines);
  if (totals.debits !== totals.credits) {
    throw new LedgerError(
      'LEDGER.UNBALANCED',
      `Debits (${totals.debits}) do not equal credits (${totals.credits}).`,
    );
  }
  return totals;
}

/**
 * Each account's net movement, debit positive ("-12.00" is a net credit), keyed by account code and, on the
 * sub-ledger accounts, salesperson ("2300:<id>"). Accounts that net to zero are kept, as "0.00".
 */
export function netByAccount(lines: readonly PostingLine[]): Record<string, string> {
  const net = new Map<string, Money>();
  for (const l of lines) {
    const key = l.salespersonId ? `${l.account}:${l.salespersonId}` : l.account;
    const signed = l.side === 'debit' ? money(l.amount) : money(l.amount).negated();
    net.set(key, (net.get(key) ?? new MoneyDecimal(0)).plus(signed));
  }
  return Object.fromEntries([...net].map(([k, v]) => [k, v.isZero() ? '0.00' : v.toFixed(2)]));
}
