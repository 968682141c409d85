// The postings of the money events, as pure functions: amounts in (strings), a balanced posting out.
// The debit and credit of each follow the usual postings table in shared/REFERENCE-VALUES.md ("Money",
// common practice); deposits are a contract liability until the work is done (ASC 606-10-45-2, published).
//
// The processing fee on a refund: the card processor keeps its fee on the original payment when the payment
// is refunded, and takes the whole refunded amount from the balance it holds, or from the bank when that
// balance is short (Stripe's "Refund and cancel payments" page, docs.stripe.com/refunds, published; the
// fee sentence was read in the page's zh-CN edition and is paraphrased here). So a refund of a card deposit after a
// cancellation debits customer deposits and credits processor clearing with the full amount refunded, and
// the fee booked when the deposit was captured stays in processing fees: it is a cost of the cancelled sale.
// Processor clearing is then short by that fee until the processor nets it from the next payout.
import { ACCOUNTS, chartAccount, type AccountCode } from './accounts';
import { LedgerError, nonNegativeAmount, positiveAmount, type Posting, type PostingLine } from './posting';
import { REASON_LABELS, reasonLabel } from './reasons';

export const BANK_METHODS = ['cash', 'cheque', 'transfer'] as const;
export type BankMethod = (typeof BANK_METHODS)[number];
export const BANK_METHOD_LABELS: Record<BankMethod, string> = {
  cash: 'cash',
  cheque: 'cheque',
  transfer: 'bank transfer',
};

/** Where a refund is paid from: back through the card processor, or out of the bank (cash, cheque). */
export type RefundVia = 'processor' | 'bank';

interface WithMemo {
  /** Replaces the default memo. */
  memo?: string;
}

export interface CardPaymentInput extends WithMemo {
  /** What the homeowner paid. */
  gross: string;
  /** What the processor kept (zero or more, less than the gross). */
  fee: string;
}

export interface BankPaymentInput extends WithMemo {
  amount: string;
  method: BankMethod;
}

export interface AmountInput extends WithMemo {
  amount: string;
}

export interface CommissionInput extends WithMemo {
  amount: string;
  salespersonId: string;
}

export interface JobCompletedInput extends WithMemo {
  /** The contract price: all of it becomes revenue at completion. */
  contractPrice: string;
  /** Deposits received and still held for this contract: they stop being owed back. Zero or more. */
  depositsHeld: string;
}

export interface RefundInput extends WithMemo {
  amount: string;
  via: RefundVia;
}

export interface OpeningBalanceInput extends WithMemo {
  account: AccountCode;
  amount: string;
  salespersonId?: string;
}

const line = (account: AccountCode, side: PostingLine['side'], amount: string): PostingLine => ({
  account,
  side,
  amount,
});

const withSalesperson = (l: PostingLine, salespersonId: string): PostingLine => ({ ...l, salespersonId });

function requireSalesperson(id: string): string {
  if (typeof id !== 'string' || id.trim() === '') {
    throw new LedgerError('LEDGER.SALESPERSON_REQUIRED', 'A commission posting must name the salesperson.');
  }
  return id;
}

function cardLines(input: CardPaymentInput, credit: AccountCode): PostingLine[] {
  const gross = positiveAmount(input.gross, 'gross amount');
  const fee = nonNegativeAmount(input.fee, 'processing fee');
  if (!fee.lessThan(gross)) {
    throw new LedgerError('LEDGER.INPUT_INVALID', 'The processing fee must be less than the amount paid.');
  }
  const net = gross.minus(fee);
  const lines = [line(ACCOUNTS.processorClearing, 'debit', net.toFixed(2))];
  if (!fee.isZero()) lines.push(line(ACCOUNTS.processingFees, 'debit', fee.toFixed(2)));
  lines.push(line(credit, 'credit', gross.toFixed(2)));
  return lines;
}

/** A deposit paid by card: clearing (net) + processing fees / customer deposits (gross). */
export function depositCapturedByCard(input: CardPaymentInput): Posting {
  return {
    reasonCode: 'deposit.card',
    lines: cardLines(input, ACCOUNTS.customerDeposits),
    memo: input.memo ?? REASON_LABELS['deposit.card'],
  };
}

/** A deposit paid in cash, by cheque or by transfer: bank / customer deposits. */
export function depositReceivedToBank(input: BankPaymentInput): Posting {
  const amount = positiveAmount(input.amount).toFixed(2);
  return {
    reasonCode: 'deposit.bank',
    lines: [line(ACCOUNTS.bank, 'debit', amount), line(ACCOUNTS.customerDeposits, 'credit', amount)],
    memo: input.memo ?? `Deposit paid by ${BANK_METHOD_LABELS[input.method] ?? 'bank'}`,
  };
}

/** The processor pays settled funds out to the bank: bank / processor clearing. */
export function processorPayout(input: AmountInput): Posting {
  const amount = positiveAmount(input.amount).toFixed(2);
  return {
    reasonCode: 'processor.payout',
    lines: [line(ACCOUNTS.bank, 'debit', amount), line(ACCOUNTS.processorClearing, 'credit', amount)],
    memo: input.memo ?? REASON_LABELS['processor.payout'],
  };
}

/**
 * The job is complete: the contract price is revenue (ASC 606, for a short job at completion); the deposits
 * held stop being a liability and the rest is owed by the homeowner.
 * customer deposits (held) + accounts receivable (price − held) / contract revenue (price).
 */
export function jobCompleted(input: JobCompletedInput): Posting {
  const price = positiveAmount(input.contractPrice, 'contract price');
  const held = nonNegativeAmount(input.depositsHeld, 'deposits held');
  if (held.greaterThan(price)) {
    throw new LedgerError(
      'LEDGER.INPUT_INVALID',
      'The deposits held are more than the contract price: refund the excess first.',
    );
  }
  const receivable = price.minus(held);
  const lines: PostingLine[] = [];
  if (!held.isZero()) lines.push(line(ACCOUNTS.customerDeposits, 'debit', held.toFixed(2)));
  if (!receivable.isZero()) lines.push(line(ACCOUNTS.accountsReceivable, 'debit', receivable.toFixed(2)));
  lines.push(line(ACCOUNTS.contractRevenue, 'credit', price.toFixed(2)));
  return { reasonCode: 'job.completed', lines, memo: input.memo ?? REASON_LABELS['job.completed'] };
}

/** The balance paid by card: clearing (net) + processing fees / accounts receivable (gross). */
export function balancePaidByCard(input: CardPaymentInput): Posting {
  return {
    reasonCode: 'balance.card',
    lines: cardLines(input, ACCOUNTS.accountsReceivable),
    memo: input.memo ?? REASON_LABELS['balance.card'],
  };
}

/** The balance paid in cash, by cheque or by transfer: bank / accounts receivable. */
export function balancePaidToBank(input: BankPaymentInput): Posting {
  const amount = positiveAmount(input.amount).toFixed(2);
  return {
    reasonCode: 'balance.bank',
    lines: [line(ACCOUNTS.bank, 'debit', amount), line(ACCOUNTS.accountsReceivable, 'credit', amount)],
    memo: input.memo ?? `Balance paid by ${BANK_METHOD_LABELS[input.method] ?? 'bank'}`,
  };
}

/** A commission earned: commission expense / commissions payable, both lines on the salesperson. */
export function commissionEarned(input: CommissionInput): Posting {
  const sp = requireSalesperson(input.salespersonId);
  const amount = positiveAmount(input.amount, 'commission').toFixed(2);
  return {
    reasonCode: 'commission.earned',
    lines: [
      withSalesperson(line(ACCOUNTS.commissionExpense, 'debit', amount), sp),
      withSalesperson(line(ACCOUNTS.commissionsPayable, 'credit', amount), sp),
    ],
    memo: input.memo ?? REASON_LABELS['commission.earned'],
  };
}

/** A commission paid: commissions payable (the salesperson's) / bank. */
export function commissionPaid(input: CommissionInput): Posting {
  const sp = requireSalesperson(input.salespersonId);
  const amount = positiveAmount(input.amount, 'commission').toFixed(2);
  return {
    reasonCode: 'commission.paid',
    lines: [
      withSalesperson(line(ACCOUNTS.commissionsPayable, 'debit', amount), sp),
      line(ACCOUNTS.bank, 'credit', amount),
    ],
    memo: input.memo ?? REASON_LABELS['commission.paid'],
  };
}

/**
 * A commission clawed back after a cancellation or refund: the earning the other way round,
 * commissions payable / commission expense. What was already paid out is recovered from the salesperson's
 * next statement, because the payable account goes below zero for them.
 */
export function commissionClawback(input: CommissionInput): Posting {
  const sp = requireSalesperson(input.salespersonId);
  const amount = positiveAmount(input.amount, 'clawback').toFixed(2);
  return {
    reasonCode: 'commission.clawback',
    lines: [
      withSalesperson(line(ACCOUNTS.commissionsPayable, 'debit', amount), sp),
      withSalesperson(line(ACCOUNTS.commissionExpense, 'credit', amount), sp),
    ],
    memo: input.memo ?? REASON_LABELS['commission.clawback'],
  };
}

/**
 * A deposit refunded after the homeowner cancelled (16 CFR 429: every payment is returned):
 * customer deposits / processor clearing (a card refund) or bank (cash or cheque). The card processing fee
 * is not part of this: see the note at the top of this file.
 */
export function refundAfterCancellation(input: RefundInput): Posting {
  const amount = positiveAmount(input.amount, 'refund').toFixed(2);
  const from = input.via === 'processor' ? ACCOUNTS.processorClearing : ACCOUNTS.bank;
  return {
    reasonCode: 'refund.cancellation',
    lines: [line(ACCOUNTS.customerDeposits, 'debit', amount), line(from, 'credit', amount)],
    memo:
      input.memo ??
      (input.via === 'processor'
        ? 'Deposit refunded to the card after cancellation (the processor keeps its fee)'
        : 'Deposit refunded from the bank after cancellation'),
  };
}

/** A refund on work already recognised as revenue: refunds and allowances (contra-revenue) / clearing or bank. */
export function refundOfRevenue(input: RefundInput): Posting {
  const amount = positiveAmount(input.amount, 'refund').toFixed(2);
  const from = input.via === 'processor' ? ACCOUNTS.processorClearing : ACCOUNTS.bank;
  return {
    reasonCode: 'refund.revenue',
    lines: [line(ACCOUNTS.refunds, 'debit', amount), line(from, 'credit', amount)],
    memo: input.memo ?? REASON_LABELS['refund.revenue'],
  };
}

/**
 * An opening balance brought in, on the account's normal side, against owner's equity — opening balances.
 * A branch that starts with money in the bank: bank / opening equity.
 */
export function openingBalance(input: OpeningBalanceInput): Posting {
  const account = chartAccount(input.account);
  if (!account || account.code === ACCOUNTS.openingEquity) {
    throw new LedgerError('LEDGER.UNKNOWN_ACCOUNT', 'Choose the account whose opening balance this is.');
  }
  const amount = positiveAmount(input.amount, 'opening balance').toFixed(2);
  const own: PostingLine = line(input.account, account.normalSide, amount);
  const ownLine = account.salespersonSubledger
    ? withSalesperson(own, requireSalesperson(input.salespersonId ?? ''))
    : own;
  const equity = line(ACCOUNTS.openingEquity, account.normalSide === 'debit' ? 'credit' : 'debit', amount);
  return {
    reasonCode: 'opening.balance',
    lines: account.normalSide === 'debit' ? [ownLine, equity] : [equity, ownLine],
    memo: input.memo ?? `Opening balance: ${account.name}`,
  };
}

/** What a reversal needs of the entry it reverses. */
export interface ReversibleEntry {
  reasonCode: string;
  lines: readonly PostingLine[];
  memo?: string | null;
}

/**
 * The entry that undoes another: every line on the other side, same account, amount and salesperson.
 * Posted entries are never changed; this is how a correction is made (and it names the original when posted).
 */
export function reversalOf(entry: ReversibleEntry, reason?: string): Posting {
  if (entry.lines.length < 2) {
    throw new LedgerError('LEDGER.TOO_FEW_LINES', 'A journal entry needs at least two lines.');
  }
  const lines = entry.lines.map((l): PostingLine => ({
    account: l.account,
    side: l.side === 'debit' ? 'credit' : 'debit',
    amount: positiveAmount(l.amount).toFixed(2),
    ...(l.salespersonId ? { salespersonId: l.salespersonId } : {}),
  }));
  const what = reasonLabel(entry.reasonCode);
  const why = reason?.trim();
  return {
    reasonCode: 'reversal',
    lines,
    memo: why ? `Reversal of “${what}”: ${why}` : `Reversal of “${what}”`,
  };
}
