import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { utcToZonedLocal, zonedLocalToUtc } from './local-time';

// US daylight saving time: starts 02:00 local on the second Sunday in March, ends 02:00 local on the
// first Sunday in November (15 U.S.C. 260a, memory). In 2026 those Sundays are 8 March and 1 November.
// Standard offsets: Eastern −5, Central −6, Mountain −7 (Arizona keeps it all year), Pacific −8,
// Hawaii −10 with no DST (memory). UK: BST from 01:00 UTC on the last Sunday in March (memory).

describe('zonedLocalToUtc', () => {
  it.each([
    // zone, local, UTC, offset, ambiguous
    ['America/Chicago', '2026-12-03T09:00', '2026-12-03T15:00:00.000Z', '-06:00', false], // CST
    ['America/Chicago', '2026-07-15T09:00', '2026-07-15T14:00:00.000Z', '-05:00', false], // CDT
    ['America/New_York', '2026-07-01T12:00', '2026-07-01T16:00:00.000Z', '-04:00', false],
    ['America/New_York', '2026-01-15T00:00', '2026-01-15T05:00:00.000Z', '-05:00', false], // midnight
    ['America/New_York', '2026-12-31T23:59', '2027-01-01T04:59:00.000Z', '-05:00', false], // crosses the year
    // Spring forward, New York: 01:59 EST is the last minute before the gap, 03:00 EDT the first after.
    ['America/New_York', '2026-03-08T01:59', '2026-03-08T06:59:00.000Z', '-05:00', false],
    ['America/New_York', '2026-03-08T03:00', '2026-03-08T07:00:00.000Z', '-04:00', false],
    // Fall back, New York: 01:00–01:59 happen twice; the earlier instant (still EDT) is taken.
    ['America/New_York', '2026-11-01T00:59', '2026-11-01T04:59:00.000Z', '-04:00', false],
    ['America/New_York', '2026-11-01T01:00', '2026-11-01T05:00:00.000Z', '-04:00', true],
    ['America/New_York', '2026-11-01T01:30', '2026-11-01T05:30:00.000Z', '-04:00', true],
    ['America/New_York', '2026-11-01T01:59', '2026-11-01T05:59:00.000Z', '-04:00', true],
    ['America/New_York', '2026-11-01T02:00', '2026-11-01T07:00:00.000Z', '-05:00', false],
    // No DST in Arizona or Hawaii: the New York gap time exists there.
    ['America/Phoenix', '2026-03-08T02:30', '2026-03-08T09:30:00.000Z', '-07:00', false],
    ['Pacific/Honolulu', '2026-06-01T08:00', '2026-06-01T18:00:00.000Z', '-10:00', false],
    ['America/Los_Angeles', '2026-11-01T01:30', '2026-11-01T08:30:00.000Z', '-07:00', true],
    ['UTC', '2026-03-08T02:30', '2026-03-08T02:30:00.000Z', '+00:00', false],
  ])('%s %s → %s (%s)', (zone, local, utc, offset, ambiguous) => {
    expect(zonedLocalToUtc(local, zone)).toEqual({ ok: true, utc, utcOffset: offset, ambiguous });
  });

  it.each([
    ['America/New_York', '2026-03-08T02:00', '03:00'],
    ['America/New_York', '2026-03-08T02:30', '03:30'],
    ['America/New_York', '2026-03-08T02:59', '03:59'],
    ['America/Chicago', '2026-03-08T02:15', '03:15'],
    ['Europe/London', '2026-03-29T01:30', '02:30'],
  ])('refuses %s %s: it falls in the hour the clocks skip', (zone, local, suggestion) => {
    const result = zonedLocalToUtc(local, zone);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.reason).toBe('nonexistent');
    expect(result.message).toContain(`${local} does not exist in ${zone}`);
    expect(result.message).toContain(`such as ${suggestion}`);
  });

  it.each([
    '2026-02-30T10:00', // no such date
    '2026-02-29T10:00', // 2026 is not a leap year
    '2026-12-03T24:00',
    '2026-12-03T09:60',
    '2026-12-03 09:00',
    '2026-12-03T9:00',
    '2026-12-03T09:00:00',
    '2026-12-03T09:00Z',
    '1999-12-31T09:00',
    '2101-01-01T09:00',
    '',
  ])('refuses the malformed %j', (local) => {
    const result = zonedLocalToUtc(local, 'America/Chicago');
    expect(result).toMatchObject({ ok: false, reason: 'malformed' });
  });

  it('accepts 29 February in a leap year', () => {
    expect(zonedLocalToUtc('2028-02-29T10:00', 'America/Chicago')).toMatchObject({
      ok: true,
      utc: '2028-02-29T16:00:00.000Z',
    });
  });

  it('refuses an unknown zone', () => {
    expect(zonedLocalToUtc('2026-12-03T09:00', 'Mars/Olympus_Mons')).toMatchObject({
      ok: false,
      reason: 'unknown_zone',
    });
  });
});

describe('utcToZonedLocal', () => {
  it.each([
    ['2026-12-03T15:00:00.000Z', 'America/Chicago', '2026-12-03T09:00', '-06:00'],
    // The two instants that read 01:30 in New York on 2026-11-01, told apart by the offset.
    ['2026-11-01T05:30:00.000Z', 'America/New_York', '2026-11-01T01:30', '-04:00'],
    ['2026-11-01T06:30:00.000Z', 'America/New_York', '2026-11-01T01:30', '-05:00'],
    ['2026-03-08T07:00:00.000Z', 'America/New_York', '2026-03-08T03:00', '-04:00'],
    ['2026-01-15T05:00:00.000Z', 'America/New_York', '2026-01-15T00:00', '-05:00'],
  ])('%s in %s → %s (%s)', (instant, zone, local, utcOffset) => {
    expect(utcToZonedLocal(instant, zone)).toEqual({ local, utcOffset });
    expect(utcToZonedLocal(new Date(instant), zone)).toEqual({ local, utcOffset });
  });

  it('round-trips every minute-aligned instant: back to the same instant, or to the earlier twin', () => {
    const zones = [
      'America/New_York',
      'America/Chicago',
      'America/Denver',
      'America/Phoenix',
      'Europe/London',
    ];
    const start = Date.UTC(2024, 0, 1);
    const minutes = (Date.UTC(2030, 0, 1) - start) / 60_000;
    fc.assert(
      fc.property(fc.integer({ min: 0, max: minutes }), fc.constantFrom(...zones), (m, zone) => {
        const instant = new Date(start + m * 60_000).toISOString();
        const { local, utcOffset } = utcToZonedLocal(instant, zone);
        const back = zonedLocalToUtc(local, zone);
        if (!back.ok) return false;
        if (back.utc === instant) return back.utcOffset === utcOffset;
        // Only an ambiguous time may map elsewhere, and then to the earlier instant one hour before.
        return back.ambiguous && Date.parse(instant) - Date.parse(back.utc) === 3_600_000;
      }),
      { numRuns: 2000 },
    );
  });
});
