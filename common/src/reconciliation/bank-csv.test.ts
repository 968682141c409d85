import { describe, expect, it } from 'vitest';
import { ReconciliationError } from './errors';
import {
  dateFormatsFitting,
  parseBankAmount,
  parseBankCsv,
  parseBankDate,
  suggestColumnMapping,
  type BankCsvMapping,
} from './bank-csv';

describe('parseBankAmount', () => {
  it.each([
    // cell, dollars, cents
    ['1,234.56', '1234.56', 1234_56n],
    ['$1,234.56', '1234.56', 1234_56n],
    ['US$1,234.56', '1234.56', 1234_56n],
    ['-$12.00', '-12.00', -12_00n],
    ['$-12.00', '-12.00', -12_00n],
    ['(12.00)', '-12.00', -12_00n], // accounting negative
    ['($1,000.00)', '-1000.00', -1000_00n],
    ['12.00-', '-12.00', -12_00n], // trailing minus
    ['\u221212.50', '-12.50', -12_50n], // U+2212 minus sign
    ['+7.5', '7.50', 7_50n],
    ['.50', '0.50', 50n],
    ['1234', '1234.00', 1234_00n],
    ['  42.10  ', '42.10', 42_10n],
    ['1,234,567.89', '1234567.89', 1_234_567_89n],
    ['-0.00', '0.00', 0n],
  ])('%j → %s', (cell, amount, cents) => {
    expect(parseBankAmount(cell)).toEqual({ kind: 'ok', amount, cents });
  });

  it.each(['', '   ', undefined])('%j is blank', (cell) => {
    expect(parseBankAmount(cell)).toEqual({ kind: 'blank' });
  });

  it.each([
    'twelve',
    '1,23.00', // thousands separators must group by three
    '12.345', // a bank line is whole cents
    '--12.00',
    '(-12.00)',
    '-12.00-',
    '1.2.3',
    '$',
    '1e3',
    '1234567890123.00', // 13 integer digits: beyond any bank line here
  ])('%j is invalid', (cell) => {
    expect(parseBankAmount(cell).kind).toBe('invalid');
  });
});

describe('parseBankDate', () => {
  it.each([
    ['2026-07-09', 'YYYY-MM-DD', '2026-07-09'],
    ['2026-7-9', 'YYYY-MM-DD', '2026-07-09'],
    ['07/09/2026', 'MM/DD/YYYY', '2026-07-09'],
    ['7/9/2026', 'MM/DD/YYYY', '2026-07-09'],
    ['07/09/2026', 'DD/MM/YYYY', '2026-09-07'], // the same cell, read the other way
    ['09.07.2026', 'DD/MM/YYYY', '2026-07-09'],
    ['02/29/2028', 'MM/DD/YYYY', '2028-02-29'], // 2028 is a leap year
    ['02/29/2026', 'MM/DD/YYYY', null], // 2026 is not
    ['13/01/2026', 'MM/DD/YYYY', null], // no 13th month
    ['07/09/26', 'MM/DD/YYYY', null], // two-digit year refused
    ['2026-07-09', 'MM/DD/YYYY', null],
    ['', 'YYYY-MM-DD', null],
  ] as const)('%j as %s → %s', (cell, format, expected) => {
    expect(parseBankDate(cell, format)).toBe(expected);
  });
});

const signed: BankCsvMapping = {
  hasHeaderRow: true,
  dateColumn: 0,
  descriptionColumn: 1,
  amount: { kind: 'signed', column: 2 },
  dateFormat: 'MM/DD/YYYY',
};

describe('parseBankCsv', () => {
  it('reads a signed-amount statement, with row numbers for the bad rows', () => {
    // Rows as csv-parse gives them with BANK_CSV_PARSE_OPTIONS (invented bank, invented lines).
    const rows = [
      ['Posting Date', 'Description', 'Amount', 'Balance'],
      ['07/09/2026', 'PAYOUT FAKE PROCESSOR', '$1,234.56', '5,000.00'], // row 2
      [''], // row 3: a blank line, skipped
      ['07/10/2026', 'CHEQUE 101', '(12.00)'], // row 4: short row (no balance) is fine
      ['07/31/2026', 'INTEREST', '0.00'], // row 5: a zero line is what the bank says
      ['07/32/2026', 'BAD DATE', '5.00'], // row 6
      ['07/11/2026', 'BAD AMOUNT', '12.345'], // row 7
      ['', 'NO DATE, NO AMOUNT', ''], // row 8: two errors
      ['07/12/2026'], // row 9: amount column missing
    ];
    const { lines, errors } = parseBankCsv(rows, signed);
    expect(lines).toEqual([
      {
        rowNumber: 2,
        date: '2026-07-09',
        description: 'PAYOUT FAKE PROCESSOR',
        amount: '1234.56',
        amountCents: '123456',
      },
      { rowNumber: 4, date: '2026-07-10', description: 'CHEQUE 101', amount: '-12.00', amountCents: '-1200' },
      { rowNumber: 5, date: '2026-07-31', description: 'INTEREST', amount: '0.00', amountCents: '0' },
    ]);
    expect(errors.map((e) => [e.rowNumber, e.field, e.code])).toEqual([
      [6, 'date', 'BANK_CSV.DATE_INVALID'],
      [7, 'amount', 'BANK_CSV.AMOUNT_INVALID'],
      [8, 'date', 'BANK_CSV.DATE_MISSING'],
      [8, 'amount', 'BANK_CSV.AMOUNT_MISSING'],
      [9, 'amount', 'BANK_CSV.AMOUNT_MISSING'],
    ]);
    expect(errors[0]?.message).toContain('MM/DD/YYYY');
  });

  it('reads debit and credit columns: a debit is money out whatever its printed sign', () => {
    const mapping: BankCsvMapping = {
      hasHeaderRow: false,
      dateColumn: 0,
      descriptionColumn: null,
      amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
      dateFormat: 'DD/MM/YYYY',
    };
    const rows = [
      ['09/07/2026', 'payout', '', '1,234.56'], // row 1 (no header)
      ['10/07/2026', 'commission paid', '296.40', ''], // row 2
      ['11/07/2026', 'fee', '-3.00', '0.00'], // row 3: printed negative, still a debit
      ['12/07/2026', 'both', '1.00', '2.00'], // row 4
      ['13/07/2026', 'neither', '', ''], // row 5
      ['14/07/2026', 'bad credit', '', 'abc'], // row 6
    ];
    const { lines, errors } = parseBankCsv(rows, mapping);
    expect(lines.map((l) => [l.rowNumber, l.date, l.description, l.amount, l.amountCents])).toEqual([
      [1, '2026-07-09', '', '1234.56', '123456'],
      [2, '2026-07-10', '', '-296.40', '-29640'],
      [3, '2026-07-11', '', '-3.00', '-300'],
    ]);
    expect(errors.map((e) => [e.rowNumber, e.field, e.code])).toEqual([
      [4, 'amount', 'BANK_CSV.DEBIT_AND_CREDIT'],
      [5, 'amount', 'BANK_CSV.AMOUNT_MISSING'],
      [6, 'credit', 'BANK_CSV.AMOUNT_INVALID'],
    ]);
  });

  it.each([
    [{ ...signed, dateColumn: -1 }, 'mapping.dateColumn'],
    [{ ...signed, dateColumn: 1.5 }, 'mapping.dateColumn'],
    [{ ...signed, descriptionColumn: 0 }, 'mapping.descriptionColumn'],
    [
      { ...signed, amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 2 } },
      'mapping.amount.creditColumn',
    ],
    [{ ...signed, dateFormat: 'DD.MM.YY' }, 'mapping.dateFormat'],
    [{ ...signed, amount: { kind: 'other' } }, 'mapping.amount'],
  ])('refuses the mapping %j', (mapping, field) => {
    try {
      parseBankCsv([], mapping as BankCsvMapping);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ReconciliationError);
      expect((e as ReconciliationError).code).toBe('RECONCILIATION.INVALID_MAPPING');
      expect((e as ReconciliationError).field).toBe(field);
    }
  });
});

describe('suggestColumnMapping', () => {
  it.each([
    [
      ['Posting Date', 'Description', 'Amount', 'Balance'],
      [
        ['07/09/2026', 'x', '1.00', '2.00'],
        ['07/29/2026', 'y', '3.00', '5.00'],
      ], // 29 can only be a day
      {
        dateColumn: 0,
        descriptionColumn: 1,
        amount: { kind: 'signed', column: 2 },
        dateFormat: 'MM/DD/YYYY',
      },
    ],
    [
      // posting date preferred to transaction date; "Running Balance" is never an amount
      ['Transaction Date', 'Posted Date', 'Memo', 'Running Balance', 'Transaction Amount'],
      [['2026-07-08', '2026-07-09', 'x', '1', '2']],
      {
        dateColumn: 1,
        descriptionColumn: 2,
        amount: { kind: 'signed', column: 4 },
        dateFormat: 'YYYY-MM-DD',
      },
    ],
    [
      ['Date', 'Details', 'Withdrawals', 'Deposits', 'Balance'],
      [['25/07/2026', 'x', '', '1.00', '2.00']], // 25 can only be a day → DD/MM/YYYY
      {
        dateColumn: 0,
        descriptionColumn: 1,
        amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
        dateFormat: 'DD/MM/YYYY',
      },
    ],
    [
      ['DATE', 'DEBIT AMOUNT', 'CREDIT AMOUNT', 'PAYEE'],
      [['07/09/2026'], ['07/10/2026']], // both readings possible → ask
      {
        dateColumn: 0,
        descriptionColumn: 3,
        amount: { kind: 'debit_credit', debitColumn: 1, creditColumn: 2 },
        dateFormat: null,
      },
    ],
    [
      ['Date', 'Description', 'Debit'], // a debit column alone is not a mapping
      [],
      { dateColumn: 0, descriptionColumn: 1, amount: null, dateFormat: null },
    ],
  ] as const)('%j', (header, samples, expected) => {
    expect(suggestColumnMapping(header, samples)).toMatchObject({ hasHeaderRow: true, ...expected });
  });

  it('says there is no header when nothing is recognised, and lists the date formats that fit', () => {
    const s = suggestColumnMapping(['07/09/2026', 'PAYOUT', '1234.56']);
    expect(s).toMatchObject({ hasHeaderRow: false, dateColumn: null, amount: null, descriptionColumn: null });
    expect(s.dateFormatCandidates).toEqual(['YYYY-MM-DD', 'MM/DD/YYYY', 'DD/MM/YYYY']);
    const ambiguous = suggestColumnMapping(['Date'], [['07/09/2026']]);
    expect(ambiguous.dateFormatCandidates).toEqual(['MM/DD/YYYY', 'DD/MM/YYYY']);
  });

  // The formats a column chosen by hand fits. Dates per ISO 8601 (YYYY-MM-DD) and the two slash orders
  // banks export; 31/12 can only be day-first, 12/31 only month-first, 07/09 either (common practice).
  it.each([
    [[['2026-11-04'], ['2026-11-30']], ['YYYY-MM-DD']],
    [[['11/04/2026'], ['11/30/2026']], ['MM/DD/YYYY']],
    [[['04/11/2026'], ['30/11/2026']], ['DD/MM/YYYY']],
    [
      [['12/06/2026'], ['12/07/2026']],
      ['MM/DD/YYYY', 'DD/MM/YYYY'],
    ],
    [
      [['12/06/2026'], [''], ['12/07/2026']],
      ['MM/DD/YYYY', 'DD/MM/YYYY'],
    ], // an empty cell reads as nothing
    [[['PAYOUT'], ['12/07/2026']], []],
    [[['02/30/2026']], []], // no 30 February in either order
    [
      [[''], ['']],
      ['YYYY-MM-DD', 'MM/DD/YYYY', 'DD/MM/YYYY'],
    ],
  ] as const)('dateFormatsFitting(%j)', (rows, expected) => {
    expect(dateFormatsFitting(rows, 0)).toEqual(expected);
  });
});
