import { describe, expect, it } from 'vitest';
import { formatInBranchZone, formatRecentInBranchZone } from './lead-format';

// US zone rules (15 U.S.C. 260a, memory; the runtime's zone data is what applies): 2026-03-08 02:00 local,
// clocks go forward — EST (UTC−5) → EDT (UTC−4), CST (UTC−6) → CDT (UTC−5).
const norm = (s: string) => s.replace(/\s/g, ' ');

describe('times on the branch’s clock', () => {
  it.each([
    ['2026-03-08T06:59:00Z', 'America/New_York', 'Mar 8, 2026, 1:59 AM EST'],
    ['2026-03-08T07:00:00Z', 'America/New_York', 'Mar 8, 2026, 3:00 AM EDT'],
    ['2026-03-08T07:00:00Z', 'America/Chicago', 'Mar 8, 2026, 1:00 AM CST'],
    // the same instant is another day in the branch than in UTC
    ['2026-12-01T03:30:00Z', 'America/Chicago', 'Nov 30, 2026, 9:30 PM CST'],
  ])('%s in %s → %s', (iso, zone, shown) => {
    expect(norm(formatInBranchZone(iso, zone))).toBe(shown);
  });

  it('leaves the year out in the branch’s current year only, by the branch’s calendar', () => {
    const now = new Date('2026-06-01T12:00:00Z');
    expect(norm(formatRecentInBranchZone('2026-03-04T15:15:00Z', 'America/Chicago', now))).toBe(
      'Mar 4, 9:15 AM CST',
    );
    expect(norm(formatRecentInBranchZone('2025-03-04T15:15:00Z', 'America/Chicago', now))).toBe(
      'Mar 4, 2025, 9:15 AM CST',
    );
    // Already 2027 in UTC, still 2026 in Chicago: the branch's current year, so no year
    const newYear = new Date('2027-01-01T03:00:00Z');
    expect(norm(formatRecentInBranchZone('2026-12-31T23:00:00Z', 'America/Chicago', newYear))).toBe(
      'Dec 31, 5:00 PM CST',
    );
  });

  it('keeps the fallback for a missing or unreadable instant', () => {
    expect(formatInBranchZone(null, 'America/Chicago')).toBe('—');
    expect(formatRecentInBranchZone('not a date', 'America/Chicago')).toBe('—');
  });
});
