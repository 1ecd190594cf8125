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
const HOUR_MS = 3_600_000;

/**
 * Planting-day codes for selected rows of a time column: `codes[i]` indexes `values` (days sorted ascending) for
 * `times[rows[i]]`, −1 when the time is missing (NaN). Cached so a million plants need few Intl calls: per UTC hour
 * when both ends of the hour fall on the same local date, else per UTC minute (same check), else per instant.
 * Inputs not modified.
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
  const dayIndex = new Map<string, number>();
  const values: string[] = [];
  const codeFor = (day: string): number => {
    let c = dayIndex.get(day);
    if (c === undefined) {
      c = values.length;
      values.push(day);
      dayIndex.set(day, c);
    }
    return c;
  };
  // Code of a whole span [start, start + length) when its two ends share the local date, else −1.
  const spanCode = (start: number, length: number): number => {
    const a = formatDay(formatter, start);
    return a === formatDay(formatter, start + length - 1) ? codeFor(a) : -1;
  };
  const hourCode = new Map<number, number>();
  const minuteCode = new Map<number, number>();
  const raw = new Int32Array(rows.length);
  let lastHour = Number.NaN;
  let lastHourCode = -1;
  for (let i = 0; i < rows.length; i++) {
    const t = times[rows[i]];
    if (!Number.isFinite(t)) {
      raw[i] = -1;
      continue;
    }
    const hour = Math.floor(t / HOUR_MS);
    let code: number;
    if (hour === lastHour) {
      code = lastHourCode;
    } else {
      const cached = hourCode.get(hour);
      code = cached ?? spanCode(hour * HOUR_MS, HOUR_MS);
      if (cached === undefined) hourCode.set(hour, code);
      lastHour = hour;
      lastHourCode = code;
    }
    if (code < 0) {
      // the local date changes within this hour: resolve per minute, then per instant
      const minute = Math.floor(t / MINUTE_MS);
      let m = minuteCode.get(minute);
      if (m === undefined) {
        m = spanCode(minute * MINUTE_MS, MINUTE_MS);
        minuteCode.set(minute, m);
      }
      code = m >= 0 ? m : codeFor(formatDay(formatter, t));
    }
    raw[i] = code;
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
