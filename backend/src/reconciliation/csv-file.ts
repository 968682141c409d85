import { createHash } from 'node:crypto';
import { type ArgumentsHost, Catch, type ExceptionFilter, PayloadTooLargeException } from '@nestjs/common';
import type { Request, Response } from 'express';
import { parse } from 'csv-parse/sync';
import { BANK_CSV_PARSE_OPTIONS, type ApiErrorBody } from '@loambook/common';
import { DomainError } from '../common/domain-error';

/** The largest statement file taken: a year of a busy account is far smaller. */
export const BANK_CSV_MAX_BYTES = 5 * 1024 * 1024;
/** The most records one file may hold. */
export const BANK_CSV_MAX_ROWS = 100_000;

/** A file as multer keeps it in memory. */
export interface UploadedCsvFile {
  buffer: Buffer;
  size: number;
  originalname: string;
}

export interface CsvFile {
  fileName: string;
  bytes: Buffer;
}

export function sha256(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** A file name fit to show and store: no path, no control characters, at most 255 characters. */
export function cleanFileName(name: string | undefined, fallback = 'statement.csv'): string {
  const last = (name ?? '').split(/[\\/]/).pop() ?? '';
  const base = Array.from(last)
    .filter((ch) => ch.charCodeAt(0) > 0x1f && ch.charCodeAt(0) !== 0x7f)
    .join('')
    .trim();
  return (base || fallback).slice(0, 255);
}

/**
 * The file's text: UTF-8 when the bytes are valid UTF-8 (a byte-order mark is dropped by csv-parse),
 * otherwise Windows-1252, which many banks' exports still use.
 */
export function decodeText(bytes: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/** The file split into rows of cells by csv-parse (RFC 4180 quoting) with the bank statement options. */
export function splitCsv(file: CsvFile): string[][] {
  if (file.bytes.length === 0) {
    throw new DomainError('rule', 'BANK_STATEMENT.EMPTY_FILE', 'The file is empty.');
  }
  if (file.bytes.includes(0)) {
    throw new DomainError(
      'rule',
      'BANK_STATEMENT.NOT_CSV',
      'This is not a CSV text file. Export the statement from the bank as CSV and try again.',
    );
  }
  let rows: string[][];
  try {
    rows = parse(decodeText(file.bytes), {
      ...BANK_CSV_PARSE_OPTIONS,
      to: BANK_CSV_MAX_ROWS + 1,
    }) as string[][];
  } catch (e) {
    const err = e as { message?: string; lines?: number };
    throw new DomainError(
      'rule',
      'BANK_STATEMENT.CSV_UNREADABLE',
      `The file could not be read as CSV${err.lines ? ` (near line ${err.lines})` : ''}: ${err.message ?? 'unknown error'}`,
    );
  }
  if (rows.length > BANK_CSV_MAX_ROWS) {
    throw new DomainError(
      'rule',
      'BANK_STATEMENT.TOO_MANY_ROWS',
      `The file has more than ${BANK_CSV_MAX_ROWS.toLocaleString('en-US')} rows: upload a shorter period.`,
    );
  }
  if (rows.every((r) => r.every((c) => (c ?? '').trim() === ''))) {
    throw new DomainError('rule', 'BANK_STATEMENT.EMPTY_FILE', 'The file has no rows.');
  }
  return rows;
}

/** On the upload routes: multer's "file too large" answered as 413 in the common error shape. */
@Catch(PayloadTooLargeException)
export class CsvUploadErrorsFilter implements ExceptionFilter {
  catch(_exception: PayloadTooLargeException, host: ArgumentsHost): void {
    const ctx = host.switchToHttp();
    const req = ctx.getRequest<Request & { id?: string }>();
    const res = ctx.getResponse<Response>();
    res.status(413).json({
      code: 'UPLOAD.TOO_LARGE',
      message: `The file is larger than ${BANK_CSV_MAX_BYTES / (1024 * 1024)} MB. Upload a shorter period.`,
      details: null,
      requestId: String(req.id ?? ''),
    } satisfies ApiErrorBody);
  }
}
