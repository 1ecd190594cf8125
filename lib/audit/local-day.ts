/**
 * Planting day: the local calendar date of a planting time in the field's IANA time zone (never the UTC date).
 */

/** One formatter per zone; throws a greppable error for an unknown zone. */
function dayFormatter(timeZone: string): Intl.DateTimeFormat {
  try {
    return new Intl.DateTimeFormat("en-US", {
      timeZone,
      calendar: "gregory",
      numberingSystem: "latn",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
    });
  } catch {
    throw new Error(`audit: unknown time zone "${timeZone}" (expected an IANA name such as "Europe/Amsterdam")`);
  }
}

function formatDay(formatter: Intl.DateTimeFormat, epochMs: number): string {
  let year = "";
  let month = "";
  let day = "";
  for (const part of formatter.formatToParts(epochMs)) {
    if (part.type === "year") year = part.value;
    else if (part.type === "month") month = part.value;
    else if (part.type === "day") day = part.value;
  }
  return `${year.padStart(4, "0")}-${month}-${day}`;
}

/**
 * True when `timeZone` is an IANA zone name this runtime knows.
 *
 * @example isKnownTimeZone("Europe/Amsterdam") // true
 */
export function isKnownTimeZone(timeZone: string): boolean {
  try {
    dayFormatter(timeZone);
    return true;
  } catch {
    return false;
  }
}

/**
 * Local calendar date "YYYY-MM-DD" of an instant (epoch milliseconds UTC) in an IANA time zone, via Intl.DateTimeFormat.
 *
 * Source: IANA time zone database as shipped with the JavaScript runtime (ECMA-402 Intl.DateTimeFormat).
 *
 * @example localDay(Date.UTC(2025, 4, 12, 23, 30), "Europe/Amsterdam") // "2025-05-13" (01:30 local, summer time)
 */
export function localDay(epochMs: number, timeZone: string): string {
  if (!Number.isFinite(epochMs)) throw new Error(`localDay: time must be finite epoch milliseconds, got ${epochMs}`);
  return formatDay(dayFormatter(timeZone), epochMs);
}

const MINUTE_MS = 60_000;

/**
 * Planting-day codes for selected rows of a time column: `codes[i]` indexes `values` (days sorted ascending) for
 * `times[rows[i]]`, −1 when the time is missing (NaN). One Intl call per distinct UTC minute (a minute's two ends are
 * checked to share the date, else each instant is formatted), so a million plants cost little. Inputs not modified.
 *
 * @example localDayCodes(Float64Array.of(Date.UTC(2025, 4, 12, 23, 30)), Int32Array.of(0), "Europe/Amsterdam")
 *   // { codes: Int32Array [0], values: ["2025-05-13"] }
 */
export function localDayCodes(
  times: Float64Array,
  rows: Int32Array,
  timeZone: string,
): { codes: Int32Array; values: string[] } {
  const formatter = dayFormatter(timeZone);
  const dayOfMinute = new Map<number, string | null>(); // null = minute straddles a date change
  const dayIndex = new Map<string, number>();
  const values: string[] = [];
  const raw = new Int32Array(rows.length);
  const codeFor = (day: string): number => {
    let c = dayIndex.get(day);
    if (c === undefined) {
      c = values.length;
      values.push(day);
      dayIndex.set(day, c);
    }
    return c;
  };
  for (let i = 0; i < rows.length; i++) {
    const t = times[rows[i]];
    if (!Number.isFinite(t)) {
      raw[i] = -1;
      continue;
    }
    const minute = Math.floor(t / MINUTE_MS);
    let day = dayOfMinute.get(minute);
    if (day === undefined) {
      const start = formatDay(formatter, minute * MINUTE_MS);
      const end = formatDay(formatter, minute * MINUTE_MS + MINUTE_MS - 1);
      day = start === end ? start : null;
      dayOfMinute.set(minute, day);
    }
    raw[i] = codeFor(day ?? formatDay(formatter, t));
  }
  // Renumber so codes follow the sorted day order (stable output whatever the row order).
  const sorted = [...values].sort();
  const rank = new Map(sorted.map((day, i) => [day, i] as const));
  const remap = new Int32Array(values.length);
  for (let c = 0; c < values.length; c++) remap[c] = rank.get(values[c]) ?? -1;
  const codes = new Int32Array(rows.length);
  for (let i = 0; i < rows.length; i++) codes[i] = raw[i] < 0 ? -1 : remap[raw[i]];
  return { codes, values: sorted };
}
