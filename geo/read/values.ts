/**
 * Cell-value parsing shared by the CSV and GeoJSON readers: numbers (decimal point or decimal
 * comma), GNSS fix quality, and times.
 */

/**
 * Parses a numeric cell. Returns NaN for text and `undefined` for an empty cell.
 * With `decimalComma`, one comma is read as the decimal mark ("12,345" → 12.345); it is only
 * enabled for files whose delimiter is not a comma.
 *
 * @example parseNumber("512345.678", false) // 512345.678
 * @example parseNumber(" 12,5 ", true) // 12.5
 * @example parseNumber("", false) // undefined
 */
export function parseNumber(s: string, decimalComma: boolean): number | undefined {
  const v = +s;
  if (v === v) {
    if (v !== 0) return v;
    // +"" and +"  " are 0: treat blank as missing.
    return s.trim() === "" ? undefined : v;
  }
  if (decimalComma) {
    const c = s.indexOf(",");
    if (c >= 0 && s.indexOf(",", c + 1) < 0 && s.indexOf(".") < 0) return +(s.slice(0, c) + "." + s.slice(c + 1));
  }
  return NaN;
}

/** Canonical fix qualities. Other texts are kept as written (trimmed). */
export type FixQuality = "rtk-fixed" | "rtk-float" | "dgnss" | "autonomous";

/** NMEA 0183 GGA fix-quality field codes (from memory; see geo/read/values.test.ts). */
const NMEA_FIX: Record<string, FixQuality> = { "4": "rtk-fixed", "5": "rtk-float", "2": "dgnss", "1": "autonomous" };

const TEXT_FIX: Record<string, FixQuality> = {
  rtkfixed: "rtk-fixed",
  fixed: "rtk-fixed",
  rtkfix: "rtk-fixed",
  fix: "rtk-fixed",
  rtkint: "rtk-fixed",
  fixedrtk: "rtk-fixed",
  rtkfloat: "rtk-float",
  float: "rtk-float",
  floatrtk: "rtk-float",
  rtkflt: "rtk-float",
  dgnss: "dgnss",
  dgps: "dgnss",
  differential: "dgnss",
  diff: "dgnss",
  sbas: "dgnss",
  autonomous: "autonomous",
  single: "autonomous",
  standalone: "autonomous",
  gps: "autonomous",
  gnss: "autonomous",
  sps: "autonomous",
};

/**
 * Normalises a fix-quality cell to "rtk-fixed", "rtk-float", "dgnss" or "autonomous"; any other
 * text is returned trimmed as written, and a blank cell gives "".
 * Numbers follow the NMEA GGA fix-quality field: 4 RTK fixed, 5 RTK float, 2 differential, 1 autonomous.
 *
 * @example normaliseFix("4") // "rtk-fixed"
 * @example normaliseFix("RTK Float") // "rtk-float"
 * @example normaliseFix("PPP") // "PPP"
 */
export function normaliseFix(s: string): string {
  const t = s.trim();
  if (t === "") return "";
  const n = NMEA_FIX[t];
  if (n) return n;
  const key = t.toLowerCase().replace(/[\s_-]+/g, "");
  return TEXT_FIX[key] ?? t;
}

/** Outcome of parsing one time cell. */
export type TimeParse =
  | { ok: true; ms: number }
  | { ok: false; reason: "empty" | "not-a-time" | "no-zone" | "bad-zone" };

const ISO =
  /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|z|[+-]\d{2}(?::?\d{2})?)?$/;

/**
 * Parses ISO 8601 times to epoch milliseconds UTC.
 * - With "Z" or an offset ("+02:00", "+0200", "+02"): exact.
 * - Without an offset: read as wall-clock time in `timeZone` (an IANA name such as "Europe/Berlin",
 *   resolved with `Intl.DateTimeFormat`); without `timeZone` the result is `no-zone`.
 *   In a daylight-saving gap or overlap the offset valid just before the change is used.
 * - A plain number of 10 digits (optionally with decimals) is epoch seconds; of 13 digits, epoch milliseconds.
 *
 * Offsets of a zone are cached per 15 minutes of UTC time, so a million rows cost a few thousand
 * `Intl` calls. Pure: no clock is read.
 *
 * @example new TimeReader().parse("2025-05-03T08:00:00Z") // { ok: true, ms: 1746259200000 }
 * @example new TimeReader("Europe/Berlin").parse("2025-05-03 10:00") // { ok: true, ms: 1746259200000 }
 */
export class TimeReader {
  private readonly format: Intl.DateTimeFormat | null = null;
  private readonly cache = new Map<number, number>();
  readonly zoneValid: boolean;

  constructor(readonly timeZone?: string) {
    let valid = true;
    if (timeZone) {
      try {
        this.format = new Intl.DateTimeFormat("en-US", {
          timeZone,
          hourCycle: "h23",
          year: "numeric",
          month: "2-digit",
          day: "2-digit",
          hour: "2-digit",
          minute: "2-digit",
          second: "2-digit",
        });
      } catch {
        valid = false;
      }
    }
    this.zoneValid = valid;
  }

  parse(raw: string): TimeParse {
    const s = raw.trim();
    if (s === "") return { ok: false, reason: "empty" };
    const c0 = s.charCodeAt(0);
    if (c0 >= 48 && c0 <= 57 && s.length >= 10 && /^\d{10}(?:\.\d+)?$|^\d{13}$/.test(s)) {
      return { ok: true, ms: s.length === 13 ? +s : Math.round(+s * 1000) };
    }
    const m = ISO.exec(s);
    if (!m) return { ok: false, reason: "not-a-time" };
    const y = +m[1],
      mo = +m[2],
      d = +m[3];
    const h = m[4] ? +m[4] : 0,
      mi = m[5] ? +m[5] : 0,
      sec = m[6] ? +m[6] : 0;
    const frac = m[7] ? Math.round(+`0.${m[7]}` * 1000) : 0;
    if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 24 || mi > 59 || sec > 60)
      return { ok: false, reason: "not-a-time" };
    const wall = Date.UTC(y, mo - 1, d, h, mi, sec, frac);
    if (new Date(Date.UTC(y, mo - 1, d)).getUTCDate() !== d) return { ok: false, reason: "not-a-time" };
    const zone = m[8];
    if (zone) {
      if (zone === "Z" || zone === "z") return { ok: true, ms: wall };
      const sign = zone[0] === "-" ? -1 : 1;
      const digits = zone.slice(1).replace(":", "");
      const oh = +digits.slice(0, 2),
        om = digits.length > 2 ? +digits.slice(2, 4) : 0;
      if (oh > 18 || om > 59) return { ok: false, reason: "not-a-time" };
      return { ok: true, ms: wall - sign * (oh * 60 + om) * 60000 };
    }
    if (!this.timeZone) return { ok: false, reason: "no-zone" };
    if (!this.format) return { ok: false, reason: "bad-zone" };
    // Wall time → UTC: subtract the zone's offset at the guessed instant, then correct once.
    const o1 = this.offsetAt(wall);
    let t = wall - o1;
    const o2 = this.offsetAt(t);
    if (o2 !== o1) {
      const t2 = wall - o2;
      t = this.offsetAt(t2) === o2 ? t2 : Math.min(t, t2);
    }
    return { ok: true, ms: t };
  }

  /** Offset of the time zone from UTC at instant `t` (ms): local wall clock minus UTC. */
  offsetAt(t: number): number {
    const bucket = Math.floor(t / 900_000);
    const hit = this.cache.get(bucket);
    if (hit !== undefined) return hit;
    const parts = this.format!.formatToParts(new Date(bucket * 900_000));
    const get = (type: string) => +(parts.find((p) => p.type === type)?.value ?? 0);
    const local = Date.UTC(get("year"), get("month") - 1, get("day"), get("hour") % 24, get("minute"), get("second"));
    const off = local - bucket * 900_000;
    this.cache.set(bucket, off);
    return off;
  }
}
