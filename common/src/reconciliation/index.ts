// Reconciliation rules: bank statement CSV rows to bank lines, a guess at the column mapping, matching
// ledger-side lines to bank lines by amount and date window, and the composition of a processor payout.
export { RECONCILIATION_ERROR_CODES, ReconciliationError, type ReconciliationErrorCode } from './errors';
export { centsKey, centsToBigInt, centsToMoneyString, type CentsInput } from './cents';
export {
  BANK_CSV_PARSE_OPTIONS,
  BANK_CSV_ROW_ERROR_CODES,
  BANK_DATE_FORMATS,
  dateFormatsFitting,
  parseBankAmount,
  parseBankCsv,
  parseBankDate,
  suggestColumnMapping,
  type BankAmountParse,
  type BankCsvAmountColumns,
  type BankCsvMapping,
  type BankCsvMappingSuggestion,
  type BankCsvRowError,
  type BankCsvRowErrorCode,
  type BankDateFormat,
  type BankLine,
  type ParsedBankCsv,
} from './bank-csv';
export {
  MAX_MATCH_WINDOW_DAYS,
  matchLines,
  type LineMatch,
  type MatchableLine,
  type MatchLinesResult,
  type MatchOptions,
} from './match-lines';
export { payoutBreakdown, type PayoutBreakdown, type PayoutTransaction } from './payout-breakdown';
export * from './api-types';
