import { describe, expect, it } from 'vitest';
import { cancellationWindowOpen, endOfDayInZone, todayInZone } from './zoned-today';
import { cancellationDeadline } from './cancellation-deadline';

describe('todayInZone', () => {
  it.each([
    // 22:30 EDT on Thu 2 July is 02:30 UTC on 3 July (EDT = UTC−4 in July: the zone data of the runtime).
    ['2026-07-03T02:30:00Z', 'America/New_York', '2026-07-02'],
    ['2026-07-03T02:30:00Z', 'UTC', '2026-07-03'],
    // 23:59 CST on 21 Nov (UTC−6 after the November change back) is 05:59 UTC on 22 Nov.
    ['2026-11-22T05:59:00Z', 'America/Chicago', '2026-11-21'],
    ['2026-11-22T06:00:00Z', 'America/Chicago', '2026-11-22'],
    // Hawaii has no daylight time: UTC−10 all year.
    ['2026-01-01T09:59:59Z', 'Pacific/Honolulu', '2025-12-31'],
    ['2026-01-01T10:00:00Z', 'Pacific/Honolulu', '2026-01-01'],
  ])('%s in %s is %s', (instant, zone, expected) => {
    expect(todayInZone(zone, new Date(instant))).toBe(expected);
  });

  it('defaults to this moment', () => {
    const utcToday = new Date().toISOString().slice(0, 10);
    expect(todayInZone('UTC')).toBe(utcToday);
  });

  it('refuses an unknown zone', () => {
    expect(() => todayInZone('Mars/Olympus_Mons', new Date())).toThrow(RangeError);
  });
});

describe('endOfDayInZone', () => {
  it.each([
    ['2026-07-08', 'America/New_York', '2026-07-09T04:00:00.000Z'], // EDT, UTC−4
    ['2026-11-25', 'America/New_York', '2026-11-26T05:00:00.000Z'], // EST, UTC−5
    // The day the clocks go back (1 Nov 2026, 02:00 EDT → 01:00 EST) is 25 hours long; it ends at EST midnight.
    ['2026-11-01', 'America/New_York', '2026-11-02T05:00:00.000Z'],
    ['2026-07-08', 'UTC', '2026-07-09T00:00:00.000Z'],
  ])('%s in %s ends at %s', (date, zone, expected) => {
    expect(endOfDayInZone(date, zone)).toBe(expected);
  });
});

describe('cancellationWindowOpen', () => {
  // Signed Thu 2026-07-02 → last day Wed 2026-07-08 (REFERENCE-VALUES.md worked example, 16 CFR 429.1(a)).
  const lastDayToCancel = cancellationDeadline({ signedOn: '2026-07-02' }).lastDayToCancel;
  it.each([
    ['2026-07-02T16:00:00Z', true], // the day of signing
    ['2026-07-09T03:59:59Z', true], // 23:59:59 EDT on the last day: still inside
    ['2026-07-09T04:00:00Z', false], // midnight at its end: closed
    ['2026-07-20T12:00:00Z', false],
  ])('at %s open = %s', (now, open) => {
    expect(lastDayToCancel).toBe('2026-07-08');
    expect(
      cancellationWindowOpen({ lastDayToCancel, timeZone: 'America/New_York', now: new Date(now) }),
    ).toBe(open);
  });
});
