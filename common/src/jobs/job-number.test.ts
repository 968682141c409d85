import { describe, expect, it } from 'vitest';
import { formatJobNumber, jobNumberPrefix, parseJobNumber } from './job-number';

describe('job numbers', () => {
  it.each<[string, string, number, string]>([
    ['MRW', '2026-07-02', 1, 'MRW-J2607-001'],
    ['ALD', '2026-12-31', 42, 'ALD-J2612-042'],
    ['SBH2', '2027-01-01', 1000, 'SBH2-J2701-1000'],
  ])('%s, signed %s, #%i → %s', (code, signedOn, n, expected) => {
    expect(formatJobNumber(code, signedOn, n)).toBe(expected);
    expect(parseJobNumber(expected)).toEqual({
      branchCode: code,
      year: Number(signedOn.slice(0, 4)),
      month: Number(signedOn.slice(5, 7)),
      sequence: n,
    });
  });

  it('fits the column (3 to 24 characters) for the longest branch code', () => {
    expect(formatJobNumber('ABCDEFGH', '2026-07-02', 999).length).toBeLessThanOrEqual(24);
  });

  it('refuses what is not a branch code, a date or a sequence', () => {
    expect(() => jobNumberPrefix('mrw', '2026-07-02')).toThrow();
    expect(() => jobNumberPrefix('MRW', '07/02/2026')).toThrow();
    expect(() => formatJobNumber('MRW', '2026-07-02', 0)).toThrow();
    expect(parseJobNumber('MRW-J2613-001')).toBeNull();
    expect(parseJobNumber('not a number')).toBeNull();
  });
});
