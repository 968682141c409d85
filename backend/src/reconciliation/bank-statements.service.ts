import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  centsToMoneyString,
  parseBankCsv,
  suggestColumnMapping,
  type BankAccount,
  type BankCsvAmountColumns,
  type BankCsvMapping,
  type BankCsvMappingSuggestion,
  type BankCsvRowError,
  type BankLine,
  type BankStatement,
  type BankStatementCheck,
  type BankStatementLine,
  type BankStatementPreview,
  type BankStatementRowErrors,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { cleanFileName, sha256, splitCsv, type CsvFile } from './csv-file';
import { isPgError, mayReconcile, reconciliationScope, translateError } from './reconciliation-access';
import { ReconciliationRepository } from './reconciliation.repository';

/** Rows shown in a preview. */
export const PREVIEW_ROWS = 20;
/** Rows the column guess looks at for the date format. */
const SAMPLE_ROWS = 50;
/** Row errors sent back at most (the count says how many there are). */
export const MAX_ROW_ERRORS = 500;

/** A row refused because its date is inside a locked period (it can be skipped like any bad row). */
export const DATE_LOCKED = 'BANK_STATEMENT.DATE_LOCKED';
/** A row dated outside the statement period the bookkeeper gave. */
export const OUTSIDE_PERIOD = 'BANK_STATEMENT.OUTSIDE_PERIOD';

const accountNotFound = () => notFound('bank account');
const statementNotFound = () => notFound('bank statement');

/** The rows the mapping reads into lines, with the rows it refuses; dates in locked periods refused too. */
interface ReadResult {
  lines: BankLine[];
  errors: BankCsvRowError[];
}

function sumCents(lines: BankLine[]): { moneyIn: string; moneyOut: string } {
  let inflow = 0n;
  let outflow = 0n;
  for (const l of lines) {
    const c = BigInt(l.amountCents);
    if (c > 0n) inflow += c;
    else outflow -= c;
  }
  return { moneyIn: centsToMoneyString(inflow), moneyOut: centsToMoneyString(outflow) };
}

function period(lines: BankLine[]): { from: string | null; to: string | null } {
  let from: string | null = null;
  let to: string | null = null;
  for (const l of lines) {
    if (from === null || l.date < from) from = l.date;
    if (to === null || l.date > to) to = l.date;
  }
  return { from, to };
}

/**
 * A mapping as the client sent it (a JSON text), in the canonical shape: only the known keys. The rules
 * in common check it (parseBankCsv refuses a malformed one with the field at fault).
 */
export function readMapping(text: string, columnCount: number | null): BankCsvMapping {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw invalid('mapping', 'The column mapping is not valid JSON.');
  }
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    throw invalid('mapping', 'Choose the columns.');
  }
  const m = raw as Record<string, unknown>;
  const a = (m.amount ?? {}) as Record<string, unknown>;
  const amount: BankCsvAmountColumns =
    a.kind === 'debit_credit'
      ? { kind: 'debit_credit', debitColumn: a.debitColumn as number, creditColumn: a.creditColumn as number }
      : ({ kind: a.kind, column: a.column } as BankCsvAmountColumns);
  const mapping: BankCsvMapping = {
    hasHeaderRow: m.hasHeaderRow as boolean,
    dateColumn: m.dateColumn as number,
    descriptionColumn: (m.descriptionColumn ?? null) as number | null,
    amount,
    dateFormat: m.dateFormat as BankCsvMapping['dateFormat'],
  };
  try {
    parseBankCsv([], mapping); // checks the mapping itself
  } catch (e) {
    translateError(e);
  }
  if (columnCount !== null) {
    const columns: [string, number | null][] = [
      ['mapping.dateColumn', mapping.dateColumn],
      ['mapping.descriptionColumn', mapping.descriptionColumn],
      ...(mapping.amount.kind === 'signed'
        ? ([['mapping.amount.column', mapping.amount.column]] as [string, number][])
        : ([
            ['mapping.amount.debitColumn', mapping.amount.debitColumn],
            ['mapping.amount.creditColumn', mapping.amount.creditColumn],
          ] as [string, number][])),
    ];
    for (const [field, c] of columns) {
      if (c !== null && c >= columnCount) {
        throw invalid(
          field,
          `The file has ${columnCount} column${columnCount === 1 ? '' : 's'}: choose one of them.`,
        );
      }
    }
  }
  return mapping;
}

function mappingFromSuggestion(s: BankCsvMappingSuggestion): BankCsvMapping | null {
  if (s.dateColumn === null || s.amount === null || s.dateFormat === null) return null;
  return {
    hasHeaderRow: s.hasHeaderRow,
    dateColumn: s.dateColumn,
    descriptionColumn: s.descriptionColumn,
    amount: s.amount,
    dateFormat: s.dateFormat,
  };
}

function fits(mapping: BankCsvMapping, columnCount: number): boolean {
  const cols = [
    mapping.dateColumn,
    mapping.descriptionColumn ?? 0,
    ...(mapping.amount.kind === 'signed'
      ? [mapping.amount.column]
      : [mapping.amount.debitColumn, mapping.amount.creditColumn]),
  ];
  return cols.every((c) => typeof c === 'number' && c < columnCount);
}

/**
 * Bank accounts and their uploaded statements. An upload is all or nothing: if any row is invalid, nothing
 * is stored and every bad row comes back with its number (422 BANK_STATEMENT.ROWS_INVALID), unless the
 * bookkeeper chose to skip them (skipInvalidRows), in which case the valid rows are stored and the skipped
 * ones are kept on the statement with their errors. Rows dated inside a locked period count as invalid
 * (BANK_STATEMENT.DATE_LOCKED). The mapping used is remembered on the account once a statement is stored.
 */
@Injectable()
export class BankStatementsService {
  constructor(
    private readonly repo: ReconciliationRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  // ---- accounts ---------------------------------------------------------------------------------------

  async accounts(user: SessionUser): Promise<BankAccount[]> {
    return (await this.repo.accounts(reconciliationScope(user))).filter((a) =>
      mayReconcile(user, 'read', a.branchId),
    );
  }

  async readableAccount(user: SessionUser, id: string, db = this.knex): Promise<BankAccount> {
    const account = await this.repo.account(id, db);
    if (!account || !mayReconcile(user, 'read', account.branchId)) throw accountNotFound();
    return account;
  }

  async createAccount(
    user: SessionUser,
    dto: { name: string; last4: string; branchId?: string | null; receivesPayouts?: boolean },
  ): Promise<BankAccount> {
    const branchId = dto.branchId ?? null;
    if (branchId) {
      const branch = await this.repo.branch(branchId);
      if (!branch || !mayReconcile(user, 'read', branchId)) throw notFound('branch');
    }
    if (!mayReconcile(user, 'create', branchId)) {
      throw new DomainError('forbidden', 'AUTH.FORBIDDEN', 'Your role does not allow this.');
    }
    try {
      const id = await this.repo.insertAccount({
        branchId,
        name: dto.name,
        last4: dto.last4,
        receivesPayouts: dto.receivesPayouts ?? true,
        createdBy: user.id,
      });
      return (await this.repo.account(id))!;
    } catch (e) {
      if (isPgError(e, '23505')) {
        throw new DomainError('conflict', 'BANK_ACCOUNT.NAME_TAKEN', 'Some fields need attention.', [
          { field: 'name', message: 'An account of this name already exists here.' },
        ]);
      }
      throw e;
    }
  }

  // ---- reading a file ---------------------------------------------------------------------------------

  /** The mapping read over the rows; lines inside a locked period of the account become row errors. */
  private async read(
    rows: string[][],
    mapping: BankCsvMapping,
    accountId: string | null,
    statementPeriod: { from?: string; to?: string } = {},
  ): Promise<ReadResult> {
    let parsed: ReadResult;
    try {
      parsed = parseBankCsv(rows, mapping);
    } catch (e) {
      translateError(e);
    }
    const locked = accountId && parsed.lines.length > 0 ? await this.repo.periods(accountId, null) : [];
    const { from, to } = statementPeriod;
    if (locked.length === 0 && !from && !to) return parsed;
    const lockedOn = (day: string) => locked.some((p) => day >= p.periodStart && day <= p.periodEnd);
    const lines: BankLine[] = [];
    const errors = [...parsed.errors];
    for (const l of parsed.lines) {
      if ((from && l.date < from) || (to && l.date > to)) {
        errors.push({
          rowNumber: l.rowNumber,
          field: 'date',
          code: OUTSIDE_PERIOD as BankCsvRowError['code'],
          message: `${l.date} is outside the statement period ${from ?? '…'} to ${to ?? '…'}.`,
        });
      } else if (lockedOn(l.date)) {
        errors.push({
          rowNumber: l.rowNumber,
          field: 'date',
          code: DATE_LOCKED as BankCsvRowError['code'],
          message: `${l.date} is inside a reconciled period of this account, which is locked.`,
        });
      } else lines.push(l);
    }
    errors.sort((a, b) => a.rowNumber - b.rowNumber);
    return { lines, errors };
  }

  private summary(r: ReadResult): BankStatementCheck {
    const p = period(r.lines);
    return {
      lineCount: r.lines.length,
      errorCount: r.errors.length,
      errors: r.errors.slice(0, MAX_ROW_ERRORS),
      periodFrom: p.from,
      periodTo: p.to,
      ...sumCents(r.lines),
    };
  }

  async preview(
    user: SessionUser,
    file: CsvFile,
    opts: { bankAccountId?: string; mapping?: string },
  ): Promise<BankStatementPreview> {
    const account = opts.bankAccountId ? await this.readableAccount(user, opts.bankAccountId) : null;
    const rows = splitCsv(file);
    const columnCount = rows.reduce((n, r) => Math.max(n, r.length), 0);
    const suggestion = suggestColumnMapping(rows[0] ?? [], rows.slice(1, 1 + SAMPLE_ROWS));
    const saved = account?.csvMapping ?? null;
    const given = opts.mapping ? readMapping(opts.mapping, columnCount) : null;
    const guessed = mappingFromSuggestion(suggestion);
    const [mapping, mappingSource] = given
      ? [given, 'given' as const]
      : saved && fits(saved, columnCount)
        ? [saved, 'saved' as const]
        : guessed
          ? [guessed, 'suggested' as const]
          : [null, null];
    const hash = sha256(file.bytes);
    const duplicate = account ? await this.repo.statementBySha(account.id, hash) : null;
    return {
      fileName: file.fileName,
      fileBytes: file.bytes.length,
      sha256: hash,
      rowCount: rows.length,
      columnCount,
      rows: rows.slice(0, PREVIEW_ROWS),
      suggestion,
      savedMapping: saved,
      mapping,
      mappingSource,
      check: mapping ? this.summary(await this.read(rows, mapping, account?.id ?? null)) : null,
      duplicateOf: duplicate
        ? { statementId: duplicate.id, fileName: duplicate.fileName, uploadedAt: duplicate.uploadedAt }
        : null,
    };
  }

  async upload(
    user: SessionUser,
    file: CsvFile | null,
    dto: {
      bankAccountId: string;
      mapping: string;
      skipInvalidRows?: boolean;
      periodFrom?: string;
      periodTo?: string;
    },
  ): Promise<BankStatement> {
    if (dto.periodFrom && dto.periodTo && dto.periodFrom > dto.periodTo) {
      throw invalid('periodTo', 'The period ends before it starts.');
    }
    const account = await this.readableAccount(user, dto.bankAccountId);
    if (!mayReconcile(user, 'create', account.branchId)) {
      throw new DomainError('forbidden', 'AUTH.FORBIDDEN', 'Your role does not allow this.');
    }
    if (!file) throw invalid('file', 'Choose the CSV file to upload.');
    const hash = sha256(file.bytes);
    const duplicate = await this.repo.statementBySha(account.id, hash);
    if (duplicate) throw this.duplicate(duplicate);
    const rows = splitCsv(file);
    const columnCount = rows.reduce((n, r) => Math.max(n, r.length), 0);
    const mapping = readMapping(dto.mapping, columnCount);
    const result = await this.read(rows, mapping, account.id, { from: dto.periodFrom, to: dto.periodTo });
    if (result.errors.length > 0 && !dto.skipInvalidRows) {
      const details: BankStatementRowErrors = {
        errorCount: result.errors.length,
        invalidRowCount: new Set(result.errors.map((e) => e.rowNumber)).size,
        lineCount: result.lines.length,
        errors: result.errors.slice(0, MAX_ROW_ERRORS),
      };
      throw new DomainError(
        'rule',
        'BANK_STATEMENT.ROWS_INVALID',
        `${details.invalidRowCount} row${details.invalidRowCount === 1 ? '' : 's'} could not be read. ` +
          'Fix the file or the column choice, or skip those rows. Nothing was stored.',
        details as unknown as Record<string, unknown>,
      );
    }
    if (result.lines.length === 0) {
      throw new DomainError('rule', 'BANK_STATEMENT.NO_LINES', 'The file has no transaction rows to store.');
    }
    const p = period(result.lines);
    try {
      const id = await inTransaction(this.knex, async (trx) => {
        const statementId = await this.repo.insertStatement(
          {
            bankAccountId: account.id,
            fileName: cleanFileName(file.fileName),
            sha256: hash,
            fileBytes: file.bytes.length,
            periodFrom: dto.periodFrom ?? p.from!,
            periodTo: dto.periodTo ?? p.to!,
            rowCount: rows.length,
            mapping,
            skippedRows: result.errors,
            uploadedBy: user.id,
          },
          result.lines,
          trx,
        );
        await this.repo.saveMapping(account.id, mapping, trx);
        return statementId;
      });
      return (await this.repo.statement(id))!;
    } catch (e) {
      if (isPgError(e, '23505', 'bank_statements_bank_account_id_file_sha256_key')) {
        const theirs = await this.repo.statementBySha(account.id, hash);
        throw this.duplicate(theirs ?? { id: '', fileName: file.fileName, uploadedAt: '' });
      }
      translateError(e);
    }
  }

  private duplicate(d: { id: string; fileName: string; uploadedAt: string }) {
    return conflict(
      'BANK_STATEMENT.DUPLICATE_FILE',
      `This file was uploaded to this account already (${d.fileName}).`,
      { statementId: d.id, fileName: d.fileName, uploadedAt: d.uploadedAt },
    );
  }

  // ---- reading statements -----------------------------------------------------------------------------

  async statements(user: SessionUser, q: { bankAccountId?: string }): Promise<BankStatement[]> {
    if (q.bankAccountId) await this.readableAccount(user, q.bankAccountId);
    return this.repo.statements(reconciliationScope(user), q);
  }

  async lines(user: SessionUser, statementId: string): Promise<BankStatementLine[]> {
    const statement = await this.repo.statement(statementId);
    if (!statement || !mayReconcile(user, 'read', statement.branchId)) throw statementNotFound();
    return this.repo.statementLines(statementId);
  }
}
