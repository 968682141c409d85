// Wall-clock times in a branch's IANA time zone, converted to and from instants (UTC).
//
// A booking is typed as the time on the clock where the house is ('2026-12-03T09:00', the branch's
// zone) and stored as an instant. Two wall-clock times need a rule, because daylight saving time moves
// the clocks (in the US: forward at 02:00 on the second Sunday in March, back at 02:00 on the first
// Sunday in November — 15 U.S.C. 260a, memory; the zone data of the runtime is what is applied):
//   - a time inside the hour skipped in spring (America/New_York 2026-03-08T02:30) does not exist:
//     it is refused, with the time the clock shows at that moment after the change as a suggestion;
//   - a time inside the hour repeated in autumn (America/New_York 2026-11-01T01:30) happens twice:
//     the EARLIER instant is taken (still on daylight time, 05:30Z). Our choice: an appointment made for
//     "1:30" is kept at the first 1:30, so nobody turns up an hour after the homeowner expected them.
//     The result says it was ambiguous, and the UTC offset shown with every booking tells the two apart.
//
// Only the runtime's Intl (ICU zone data) is used: no package, no I/O.

export type LocalDateTime = string;

/** 'YYYY-MM-DDTHH:mm', 24-hour clock, no seconds, no offset. */
export const LOCAL_DATE_TIME_PATTERN = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/;

/** Years accepted for a booking; anything else is almost certainly a typing slip. */
export const LOCAL_TIME_MIN_YEAR = 2000;
export const LOCAL_TIME_MAX_YEAR = 2100;

export type LocalToUtcResult =
  | {
      ok: true;
      /** The instant, ISO-8601 in UTC ('2026-12-03T15:00:00.000Z'). */
      utc: string;
      /** The zone's offset from UTC at that instant, '-06:00'. */
      utcOffset: string;
      /** True when the wall-clock time happened twice that day; the earlier instant was taken. */
      ambiguous: boolean;
    }
  | { ok: false; reason: 'malformed' | 'unknown_zone' | 'nonexistent'; message: string };

const MS_PER_MINUTE = 60_000;
const MS_PER_DAY = 86_400_000;

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat | null {
  let f = formatters.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: '2-digit',
        day: '2-digit',
        hour: '2-digit',
        minute: '2-digit',
        second: '2-digit',
      });
    } catch {
      return null;
    }
    formatters.set(timeZone, f);
  }
  return f;
}

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function wallClock(ms: number, f: Intl.DateTimeFormat): WallClock {
  const parts: Record<string, number> = {};
  for (const p of f.formatToParts(new Date(ms))) {
    if (p.type !== 'literal') parts[p.type] = Number(p.value);
  }
  return {
    year: parts.year ?? NaN,
    month: parts.month ?? NaN,
    day: parts.day ?? NaN,
    // Some ICU versions write midnight as 24 even with h23.
    hour: (parts.hour ?? NaN) % 24,
    minute: parts.minute ?? NaN,
    second: parts.second ?? NaN,
  };
}

/** The zone's wall clock at `ms`, read as if it were UTC: the instant plus the zone's offset. */
function wallClockAsUtc(ms: number, f: Intl.DateTimeFormat): number {
  const w = wallClock(ms, f);
  return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
}

/** Offset from UTC at `ms`, in milliseconds (negative west of Greenwich). */
function offsetAt(ms: number, f: Intl.DateTimeFormat): number {
  const wholeSeconds = Math.floor(ms / 1000) * 1000;
  return wallClockAsUtc(wholeSeconds, f) - wholeSeconds;
}

function formatOffset(offsetMs: number): string {
  const minutes = Math.round(offsetMs / MS_PER_MINUTE);
  const sign = minutes < 0 ? '-' : '+';
  const abs = Math.abs(minutes);
  return `${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

const pad2 = (n: number) => String(n).padStart(2, '0');

function formatLocal(w: WallClock): LocalDateTime {
  return `${String(w.year).padStart(4, '0')}-${pad2(w.month)}-${pad2(w.day)}T${pad2(w.hour)}:${pad2(w.minute)}`;
}

/** Parse 'YYYY-MM-DDTHH:mm' into its wall-clock milliseconds (as if UTC), or null when not a real time. */
function parseLocal(local: string): number | null {
  const m = LOCAL_DATE_TIME_PATTERN.exec(local);
  if (!m) return null;
  const [year, month, day, hour, minute] = m.slice(1).map(Number) as [number, number, number, number, number];
  if (year < LOCAL_TIME_MIN_YEAR || year > LOCAL_TIME_MAX_YEAR) return null;
  if (hour > 23 || minute > 59) return null;
  const ms = Date.UTC(year, month - 1, day, hour, minute);
  const check = new Date(ms);
  if (check.getUTCMonth() !== month - 1 || check.getUTCDate() !== day) return null; // 2026-02-30
  return ms;
}

/**
 * The instant at which the clocks in `timeZone` show `local`. See the header for the two DST cases.
 */
export function zonedLocalToUtc(local: string, timeZone: string): LocalToUtcResult {
  const f = formatterFor(timeZone);
  if (!f) return { ok: false, reason: 'unknown_zone', message: `"${timeZone}" is not a known time zone.` };
  const target = typeof local === 'string' ? parseLocal(local) : null;
  if (target === null) {
    return {
      ok: false,
      reason: 'malformed',
      message:
        `Enter a date and time as YYYY-MM-DDTHH:mm on a 24-hour clock (e.g. 2026-12-03T09:00), ` +
        `a real date between ${LOCAL_TIME_MIN_YEAR} and ${LOCAL_TIME_MAX_YEAR}.`,
    };
  }
  // Every offset the zone uses within a day either side; a zone changes its offset at most once in
  // that span (true of every zone in the IANA database), so these are all the candidates.
  const offsets = new Set([
    offsetAt(target - MS_PER_DAY, f),
    offsetAt(target, f),
    offsetAt(target + MS_PER_DAY, f),
  ]);
  const instants = [...offsets]
    .map((o) => target - o)
    .filter((ms) => wallClockAsUtc(ms, f) === target)
    .sort((a, b) => a - b);
  const first = instants[0];
  if (first === undefined) {
    // In the gap: the clock jumped over this time. The same moment read with the offset in force
    // before the change is what the clock shows after it (02:30 EST → 03:30 EDT).
    const before = offsetAt(target - MS_PER_DAY, f);
    const suggestion = formatLocal(wallClock(target - before, f)).slice(11);
    return {
      ok: false,
      reason: 'nonexistent',
      message:
        `${local} does not exist in ${timeZone}: the clocks go forward that night and skip it. ` +
        `Choose another time, such as ${suggestion}.`,
    };
  }
  return {
    ok: true,
    utc: new Date(first).toISOString(),
    utcOffset: formatOffset(offsetAt(first, f)),
    ambiguous: instants.length > 1,
  };
}

/** The wall-clock time ('YYYY-MM-DDTHH:mm') and UTC offset in `timeZone` at an instant. */
export function utcToZonedLocal(
  instant: string | Date,
  timeZone: string,
): { local: LocalDateTime; utcOffset: string } {
  const f = formatterFor(timeZone);
  if (!f) throw new RangeError(`"${timeZone}" is not a known time zone`);
  const ms = typeof instant === 'string' ? Date.parse(instant) : instant.getTime();
  if (Number.isNaN(ms)) throw new RangeError(`"${String(instant)}" is not an instant`);
  return { local: formatLocal(wallClock(ms, f)), utcOffset: formatOffset(offsetAt(ms, f)) };
}
