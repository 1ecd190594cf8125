import type { AttributeName, FileRole, InputIssue, PointTable } from "../types";
import type { IssueCollector } from "../validate/issues";
import { ColumnStore } from "./builder";
import type { ColumnPlan, ColumnRole } from "./columns";
import { type RecordedMissing, STATUS_VALUES_TEXT, statusOf } from "./status";
import { normaliseFix, parseNumber, TimeReader } from "./values";

const ATTR_ROLES: readonly AttributeName[] = ["crop", "bed", "row", "cell", "arm", "fix", "method"];

/** Options shared by the readers. */
export interface SinkOptions {
  source: string;
  role: FileRole;
  timeZone?: string;
  decimalComma: boolean;
}

/** Blank for ids: ASCII controls and space, no-break space, byte-order mark (what trim() removes in practice). */
function isSpace(c: number): boolean {
  return c <= 32 || c === 0xa0 || c === 0xfeff;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/** Outcome codes of `parseSpanTo` (small integers, so nothing is boxed on the hot path). */
export const NUM_OK = 0,
  NUM_BLANK = 1,
  NUM_TEXT = 2;

/**
 * Parses the number written in `text[s, e)` into `out[0]` without making a substring; returns
 * NUM_OK, NUM_BLANK (only spaces) or NUM_TEXT (not a number; `out[0]` = NaN).
 * Plain decimals of at most 15 significant digits are computed as an exact integer divided by an
 * exact power of ten, which IEEE 754 division rounds correctly (Clinger's fast path, W. D. Clinger,
 * "How to read floating point numbers accurately", PLDI 1990); anything else (exponents, more digits,
 * "Infinity") falls back to `parseNumber` on the substring. With `decimalComma` one comma is the decimal mark.
 *
 * @example const o = new Float64Array(1); parseSpanTo("x,52.125,y", 2, 8, false, o); o[0] // 52.125
 */
export function parseSpanTo(text: string, s: number, e: number, decimalComma: boolean, out: Float64Array): number {
  while (s < e && text.charCodeAt(s) <= 32) s++;
  while (e > s && text.charCodeAt(e - 1) <= 32) e--;
  if (s === e) {
    out[0] = NaN;
    return NUM_BLANK;
  }
  let i = s;
  let neg = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    neg = c === 45;
    i++;
  }
  let m = 0,
    digits = 0,
    frac = 0,
    seenDot = false,
    any = false;
  for (; i < e; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      any = true;
      if (m === 0 && c === 48 && !seenDot) continue; // leading zeros
      m = m * 10 + (c - 48);
      digits++;
      if (seenDot) frac++;
    } else if ((c === 46 || (c === 44 && decimalComma)) && !seenDot) {
      seenDot = true;
    } else break;
  }
  if (i === e && any && digits <= 15) {
    const v = frac === 0 ? m : m / POW10[frac];
    out[0] = neg ? -v : v;
    return NUM_OK;
  }
  const v = parseNumber(text.substring(s, e), decimalComma);
  out[0] = v === undefined ? NaN : v;
  return v === undefined ? NUM_BLANK : v === v ? NUM_OK : NUM_TEXT;
}

/**
 * Turns rows of cells into columns, reporting cell problems with file, line, column and value.
 * A row is given as spans of one text (the CSV fast path: no string per cell except ids), or as an
 * array of strings (papaparse rows of quoted text, GeoJSON properties), which is joined into one
 * text with spans so both take the same path.
 */
export class RowSink {
  private readonly store: ColumnStore;
  private readonly ix: Record<ColumnRole, number>;
  private readonly names: string[];
  private readonly attrCols: Int32Array;
  private readonly times: TimeReader | null;
  private readonly decimalComma: boolean;
  private readonly num = new Float64Array(1);
  readonly width: number;
  /** Highest column index any role needs (the fast path stops storing spans after it). */
  readonly lastNeeded: number;
  /** Span buffers: the fast path fills `starts[i]`/`ends[i]` for fields 0..n-1, then calls `addSpans`. */
  readonly starts: Int32Array;
  readonly ends: Int32Array;
  private noZoneFirst = -1;
  private noZoneCount = 0;
  private missingIds: number[] = [];
  private missingIdCount = 0;
  private readonly recordedRows: RecordedMissing[] = [];

  constructor(
    plan: ColumnPlan,
    private readonly options: SinkOptions,
    private readonly issues: IssueCollector,
  ) {
    this.ix = plan.index;
    this.names = plan.guess.header;
    this.width = plan.guess.header.length;
    this.starts = new Int32Array(this.width + 1);
    this.ends = new Int32Array(this.width + 1);
    this.decimalComma = options.decimalComma;
    const attrs = ATTR_ROLES.filter((a) => this.ix[a] >= 0);
    this.attrCols = Int32Array.from(attrs.map((a) => this.ix[a]));
    this.store = new ColumnStore({
      id: this.ix.id >= 0,
      attrs,
      time: this.ix.time >= 0,
      hdop: this.ix.hdop >= 0,
      precision: this.ix.precision >= 0,
      raw: this.ix.rawX >= 0 && this.ix.rawY >= 0,
      normalise: { fix: normaliseFix },
    });
    this.lastNeeded = Math.max(...Object.values(this.ix));
    this.times = this.ix.time >= 0 ? new TimeReader(options.timeZone) : null;
    if (this.times && options.timeZone && !this.times.zoneValid) {
      issues.add({
        severity: "error",
        code: "time-zone-unknown",
        file: options.source,
        value: options.timeZone,
        message: `"${options.timeZone}" is not a known time zone; expected an IANA name such as Europe/Berlin`,
      });
    }
  }

  get rows(): number {
    return this.store.n;
  }

  /** Adds a row of string cells. `gx`/`gy` (GeoJSON geometry) replace the x/y cells when given. */
  add(row: readonly string[], line: number, gx?: number, gy?: number): boolean {
    const n = Math.min(row.length, this.lastNeeded + 1);
    let pos = 0;
    for (let i = 0; i < n; i++) {
      this.starts[i] = pos;
      pos += row[i].length;
      this.ends[i] = pos;
    }
    const text = n === 1 ? row[0] : row.slice(0, n).join("");
    return this.addSpans(text, n, line, gx === undefined ? row.length : this.width, gx, gy);
  }

  /**
   * A row with no position at all (a GeoJSON feature without geometry): true when its status records the point as
   * missing (or the status is wrong, reported), so the caller does not report the missing position.
   */
  addWithoutPosition(row: readonly string[], line: number): boolean {
    if (this.ix.status < 0) return false;
    const n = Math.min(row.length, this.lastNeeded + 1);
    let pos = 0;
    for (let i = 0; i < n; i++) {
      this.starts[i] = pos;
      pos += row[i].length;
      this.ends[i] = pos;
    }
    return this.recordedStatus(row.slice(0, n).join(""), n, line, false);
  }

  /** Rows that recorded a planned point as dead or not found (not in the table). */
  recorded(): RecordedMissing[] {
    return this.recordedRows.slice();
  }

  /**
   * The status column of a survey row: false for a measured row (read on as usual); true when the row is a report of
   * a missing point (kept in `recorded`) or its status is wrong (an error is added). `hasGeometry` is the GeoJSON
   * geometry's presence; for CSV the coordinate cells are looked at.
   */
  private recordedStatus(text: string, nFields: number, line: number, hasGeometry?: boolean): boolean {
    const col = this.ix.status;
    const raw = this.cell(text, nFields, col);
    const status = statusOf(raw);
    if (status === "measured") return false;
    if (status === null) {
      this.issues.add({
        severity: "error",
        code: "status-unknown",
        file: this.options.source,
        line,
        column: this.names[col],
        value: raw,
        message: `"${raw.trim()}" is not a status Plotproof knows; expected ${STATUS_VALUES_TEXT}`,
      });
      return true;
    }
    const idCol = this.ix.id;
    const id = idCol >= 0 ? this.cell(text, nFields, idCol).trim() : "";
    if (id === "") {
      this.issues.add({
        severity: "error",
        code: "status-without-id",
        file: this.options.source,
        line,
        column: idCol >= 0 ? this.names[idCol] : this.names[col],
        value: raw,
        message: `the row records a point as "${status}" but names no point${idCol >= 0 ? "" : " (the file has no point name or plant id column)"}; write the plan's point name or the plant id so the plan can count it`,
      });
      return true;
    }
    const hasPosition =
      hasGeometry ??
      (this.cell(text, nFields, this.ix.x).trim() !== "" || this.cell(text, nFields, this.ix.y).trim() !== "");
    if (hasPosition) {
      this.issues.add({
        severity: "warning",
        code: "status-position-unused",
        file: this.options.source,
        line,
        column: this.names[col],
        value: raw,
        message: `the point is recorded "${status}", so its position is not used as a checkpoint`,
      });
    }
    this.recordedRows.push({ line, id, status });
    return true;
  }

  /** The cell `col` of the current row as a string ("" when absent). */
  private cell(text: string, nFields: number, col: number): string {
    return col >= 0 && col < nFields ? text.substring(this.starts[col], this.ends[col]) : "";
  }

  /**
   * Adds a row given as spans of `text` (fields 0..nFields-1 in the span buffers; `fieldCount` is the
   * row's real number of fields, for the ragged-row warning). `gx`/`gy` replace the x/y cells.
   */
  addSpans(text: string, nFields: number, line: number, fieldCount: number, gx?: number, gy?: number): boolean {
    const ix = this.ix,
      st = this.starts,
      en = this.ends,
      num = this.num,
      dc = this.decimalComma;
    if (fieldCount !== this.width) {
      this.issues.add({
        severity: "warning",
        code: "row-field-count",
        file: this.options.source,
        line,
        message: `row has ${fieldCount} fields, the header has ${this.width}; cells are matched by position`,
      });
    }
    if (ix.status >= 0 && this.recordedStatus(text, nFields, line, gx === undefined ? undefined : true)) return false;
    let x: number, y: number;
    if (gx !== undefined && gy !== undefined) {
      x = gx;
      y = gy;
    } else {
      const cx = ix.x,
        cy = ix.y;
      const kx = cx < nFields ? parseSpanTo(text, st[cx], en[cx], dc, num) : NUM_BLANK;
      x = num[0];
      const ky = cy < nFields ? parseSpanTo(text, st[cy], en[cy], dc, num) : NUM_BLANK;
      y = num[0];
      if (kx !== NUM_OK || ky !== NUM_OK) return this.badPosition(text, nFields, line, kx, ky);
    }
    if (!(x - x === 0) || !(y - y === 0)) return this.notFinite(text, nFields, line, x, y, gx !== undefined);

    const s = this.store;
    s.ensure();
    const r = s.n;
    s.x[r] = x;
    s.y[r] = y;
    s.line[r] = line;
    if (s.id) {
      const c = ix.id;
      let a = 0,
        b = 0;
      if (c < nFields) {
        a = st[c];
        b = en[c];
        while (a < b && isSpace(text.charCodeAt(a))) a++;
        while (b > a && isSpace(text.charCodeAt(b - 1))) b--;
      }
      s.id.add(text, a, b);
      if (a >= b) {
        this.missingIdCount++;
        if (this.missingIds.length < 20) this.missingIds.push(line);
      }
    }
    const cols = this.attrCols;
    for (let k = 0; k < cols.length; k++) {
      const c = cols[k];
      s.codes[k][r] = c < nFields ? s.dicts[k].codeOfSpan(text, st[c], en[c]) : -1;
    }
    if (s.hdop) s.hdop[r] = this.optionalNumber(text, nFields, ix.hdop, line);
    if (s.precision) s.precision[r] = this.optionalNumber(text, nFields, ix.precision, line);
    if (s.rawX && s.rawY) {
      s.rawX[r] = this.optionalNumber(text, nFields, ix.rawX, line);
      s.rawY[r] = this.optionalNumber(text, nFields, ix.rawY, line);
    }
    if (s.time && this.times) s.time[r] = this.timeOf(text, nFields, line);
    s.n = r + 1;
    return true;
  }

  private badPosition(text: string, nFields: number, line: number, kx: number, ky: number): false {
    const ix = this.ix;
    if (kx === NUM_TEXT || ky === NUM_TEXT) {
      for (const [k, c] of [
        [kx, ix.x],
        [ky, ix.y],
      ] as const) {
        if (k !== NUM_TEXT) continue;
        this.issues.add({
          severity: "error",
          code: "coordinate-not-numeric",
          file: this.options.source,
          line,
          column: this.names[c],
          value: this.cell(text, nFields, c),
          message: this.decimalComma
            ? "expected a number (decimal point or decimal comma)"
            : "expected a number with a decimal point (this file is comma-separated, so a decimal comma cannot be read)",
        });
      }
      return false;
    }
    this.issues.add({
      severity: "warning",
      code: "coordinate-missing",
      file: this.options.source,
      line,
      column: this.names[kx === NUM_BLANK ? ix.x : ix.y],
      message: "the row has no position; it is left out",
    });
    return false;
  }

  private notFinite(text: string, nFields: number, line: number, x: number, y: number, geometry: boolean): false {
    const bad = Number.isFinite(x) ? this.ix.y : this.ix.x;
    this.issues.add({
      severity: "error",
      code: "coordinate-not-finite",
      file: this.options.source,
      line,
      column: geometry ? "geometry" : this.names[bad],
      value: geometry ? String(bad === this.ix.x ? x : y) : this.cell(text, nFields, bad),
      message: "expected a finite number",
    });
    return false;
  }

  private optionalNumber(text: string, nFields: number, col: number, line: number): number {
    if (col >= nFields) return NaN;
    const k = parseSpanTo(text, this.starts[col], this.ends[col], this.decimalComma, this.num);
    const v = this.num[0];
    if (k === NUM_OK && v - v === 0) return v;
    if (k !== NUM_BLANK) {
      this.issues.add({
        severity: "warning",
        code: "value-not-numeric",
        file: this.options.source,
        line,
        column: this.names[col],
        value: this.cell(text, nFields, col),
        message: "expected a finite number; the value is left empty",
      });
    }
    return NaN;
  }

  private timeOf(text: string, nFields: number, line: number): number {
    const col = this.ix.time;
    const raw = this.cell(text, nFields, col);
    const t = this.times!.parse(raw);
    if (t.ok) return t.ms;
    if (t.reason === "no-zone") {
      if (this.noZoneCount++ === 0) this.noZoneFirst = line;
    } else if (t.reason === "not-a-time") {
      this.issues.add({
        severity: "warning",
        code: "time-not-parseable",
        file: this.options.source,
        line,
        column: this.names[col],
        value: raw,
        message: "expected an ISO 8601 time such as 2025-05-03T08:15:00+02:00; the time is left empty",
      });
    }
    return NaN;
  }

  /** Counts behind the summary issues, so two parts of one file can be summarised together. */
  tally(): Tally {
    return {
      missingIdCount: this.missingIdCount,
      missingIdLines: this.missingIds.slice(),
      noZoneCount: this.noZoneCount,
      noZoneFirst: this.noZoneFirst,
      idColumn: this.names[this.ix.id],
      timeColumn: this.names[this.ix.time],
    };
  }

  /** Builds the table (summary issues are made from `tally()` with `tallyIssues`). */
  finish(): PointTable {
    return this.store.finish(this.options.source, this.options.role);
  }
}

/** Rows without ids and times without a zone, counted while reading. */
export interface Tally {
  missingIdCount: number;
  /** First (up to 20) lines without an id. */
  missingIdLines: number[];
  noZoneCount: number;
  noZoneFirst: number;
  idColumn?: string;
  timeColumn?: string;
}

/**
 * Adds two tallies; `lineOffset` is added to the second one's lines.
 * @example addTallies(a, b, 1000).missingIdCount // a.missingIdCount + b.missingIdCount
 */
export function addTallies(a: Tally, b: Tally, lineOffset: number): Tally {
  return {
    missingIdCount: a.missingIdCount + b.missingIdCount,
    missingIdLines: [...a.missingIdLines, ...b.missingIdLines.map((l) => l + lineOffset)].slice(0, 20),
    noZoneCount: a.noZoneCount + b.noZoneCount,
    noZoneFirst: a.noZoneCount > 0 ? a.noZoneFirst : b.noZoneCount > 0 ? b.noZoneFirst + lineOffset : -1,
    idColumn: a.idColumn ?? b.idColumn,
    timeColumn: a.timeColumn ?? b.timeColumn,
  };
}

/**
 * The summary warnings of a tally: rows without a plant id, times without a UTC offset.
 * @example tallyIssues({ missingIdCount: 2, missingIdLines: [3, 9], noZoneCount: 0, noZoneFirst: -1 }, "p.csv")[0].code // "id-missing"
 */
export function tallyIssues(t: Tally, file: string): InputIssue[] {
  const out: InputIssue[] = [];
  if (t.missingIdCount > 0) {
    out.push({
      severity: "warning",
      code: "id-missing",
      file,
      line: t.missingIdLines[0],
      column: t.idColumn,
      message: `${t.missingIdCount} row(s) have no plant id (lines ${t.missingIdLines.join(", ")}${t.missingIdCount > t.missingIdLines.length ? ", …" : ""}); they can only be paired by position`,
    });
  }
  if (t.noZoneCount > 0) {
    out.push({
      severity: "warning",
      code: "time-without-zone",
      file,
      line: t.noZoneFirst,
      column: t.timeColumn,
      message: `${t.noZoneCount} time(s) have no UTC offset; give the field's time zone (e.g. --timezone Europe/Berlin) to use them. Until then they are left empty`,
    });
  }
  return out;
}
