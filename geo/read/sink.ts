import type { AttributeName, FileRole, PointTable } from "../types";
import type { IssueCollector } from "../validate/issues";
import { TableBuilder, type CodedBuilder } from "./builder";
import type { ColumnPlan, ColumnRole } from "./columns";
import { normaliseFix, parseNumber, TimeReader } from "./values";

const ATTR_ROLES: readonly AttributeName[] = ["crop", "bed", "row", "cell", "arm", "fix", "method"];

/** Options shared by the readers. */
export interface SinkOptions {
  source: string;
  role: FileRole;
  timeZone?: string;
  decimalComma: boolean;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

/**
 * Parses the number written in `text[s, e)` without making a substring.
 * Plain decimals of at most 15 significant digits are computed as an exact integer divided by an
 * exact power of ten, which IEEE 754 rounds correctly (Clinger's fast path); anything else (exponents,
 * more digits) falls back to `parseNumber` on the substring. Blank → undefined, text → NaN.
 *
 * @example parseSpan("x,52.125,y", 2, 8, false) // 52.125
 */
export function parseSpan(text: string, s: number, e: number, decimalComma: boolean): number | undefined {
  while (s < e && text.charCodeAt(s) <= 32) s++;
  while (e > s && text.charCodeAt(e - 1) <= 32) e--;
  if (s === e) return undefined;
  let i = s;
  let neg = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    neg = c === 45;
    i++;
  }
  let m = 0, digits = 0, frac = 0, seenDot = false, any = false;
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
  if (i === e && any && digits <= 15 && (frac > 0 || digits > 0 || any)) {
    if (seenDot && frac === 0 && digits === 0) return neg ? -0 : 0;
    const v = frac === 0 ? m : m / POW10[frac];
    return neg ? -v : v;
  }
  return parseNumber(text.substring(s, e), decimalComma);
}

/**
 * Turns rows of cells into columns, reporting cell problems with file, line, column and value.
 * Rows come either as spans of one text (the CSV fast path: no per-row strings except ids) or as
 * arrays of strings (papaparse rows for quoted text, GeoJSON properties).
 */
export class RowSink {
  private readonly b: TableBuilder;
  private readonly ix: Record<ColumnRole, number>;
  private readonly names: string[];
  private readonly attrIdx: [AttributeName, number, CodedBuilder][] = [];
  private readonly times: TimeReader | null;
  private readonly fixCache = new Map<string, string>();
  private readonly decimalComma: boolean;
  readonly width: number;
  /** Highest column index any role needs (the fast path stops splitting after it). */
  readonly lastNeeded: number;
  private noZoneFirst = -1;
  private noZoneCount = 0;
  private missingIds: number[] = [];
  private missingIdCount = 0;

  // Current row: either `row` (array mode) or `text` + spans.
  private row: readonly string[] | null = null;
  private text = "";
  private starts: Int32Array;
  private ends: Int32Array;
  private nFields = 0;

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
    const attrs: AttributeName[] = [];
    for (const a of ATTR_ROLES) if (this.ix[a] >= 0) attrs.push(a);
    this.b = new TableBuilder({
      id: this.ix.id >= 0,
      attrs,
      time: this.ix.time >= 0,
      hdop: this.ix.hdop >= 0,
      precision: this.ix.precision >= 0,
      raw: this.ix.rawX >= 0 && this.ix.rawY >= 0,
    });
    for (const a of attrs) this.attrIdx.push([a, this.ix[a], this.b.attrs[a]!]);
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
    return this.b.length;
  }

  /** Span buffers for the fast path: fill `starts[i]`/`ends[i]` for fields 0..n-1, then call `addSpans`. */
  spanBuffers(): { starts: Int32Array; ends: Int32Array } {
    return { starts: this.starts, ends: this.ends };
  }

  /** Adds a row given as spans of `text` (fields 0..nFields-1 filled in the span buffers). */
  addSpans(text: string, nFields: number, line: number, fieldCount: number): boolean {
    this.row = null;
    this.text = text;
    this.nFields = nFields;
    return this.addCurrent(line, fieldCount);
  }

  /** Adds a row of string cells. `gx`/`gy` (GeoJSON geometry) replace the x/y cells when given. */
  add(row: readonly string[], line: number, gx?: number, gy?: number): boolean {
    this.row = row;
    this.nFields = row.length;
    return this.addCurrent(line, gx === undefined ? row.length : this.width, gx, gy);
  }

  private has(col: number): boolean {
    return col >= 0 && col < this.nFields;
  }

  private cell(col: number): string {
    if (!this.has(col)) return "";
    return this.row ? this.row[col] : this.text.substring(this.starts[col], this.ends[col]);
  }

  private num(col: number): number | undefined {
    if (!this.has(col)) return undefined;
    return this.row ? parseNumber(this.row[col], this.decimalComma) : parseSpan(this.text, this.starts[col], this.ends[col], this.decimalComma);
  }

  private addCurrent(line: number, fieldCount: number, gx?: number, gy?: number): boolean {
    const ix = this.ix;
    const file = this.options.source;
    if (fieldCount !== this.width) {
      this.issues.add({
        severity: "warning",
        code: "row-field-count",
        file,
        line,
        message: `row has ${fieldCount} fields, the header has ${this.width}; cells are matched by position`,
      });
    }
    let x: number | undefined, y: number | undefined;
    if (gx !== undefined && gy !== undefined) {
      x = gx;
      y = gy;
    } else {
      x = this.num(ix.x);
      y = this.num(ix.y);
      if (x !== x || y !== y) {
        if (x !== x) this.badNumber(line, ix.x);
        if (y !== y) this.badNumber(line, ix.y);
        return false;
      }
    }
    if (x === undefined || y === undefined) {
      this.issues.add({
        severity: "warning",
        code: "coordinate-missing",
        file,
        line,
        column: this.names[x === undefined ? ix.x : ix.y],
        message: "the row has no position; it is left out",
      });
      return false;
    }
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      const bad = !Number.isFinite(x) ? ix.x : ix.y;
      this.issues.add({
        severity: "error",
        code: "coordinate-not-finite",
        file,
        line,
        column: this.names[bad],
        value: gx === undefined ? this.cell(bad) : String(bad === ix.x ? x : y),
        message: "expected a finite number",
      });
      return false;
    }
    const b = this.b;
    b.x.push(x);
    b.y.push(y);
    b.line.push(line);
    if (b.id) {
      const id = this.cell(ix.id).trim();
      b.id.push(id);
      if (id === "") {
        this.missingIdCount++;
        if (this.missingIds.length < 20) this.missingIds.push(line);
      }
    }
    for (let k = 0; k < this.attrIdx.length; k++) {
      const a = this.attrIdx[k];
      const c = a[1];
      if (a[0] === "fix") {
        const v = this.cell(c);
        let f = this.fixCache.get(v);
        if (f === undefined) {
          f = normaliseFix(v);
          if (this.fixCache.size < 1000) this.fixCache.set(v, f);
        }
        a[2].pushValue(f);
      } else if (this.row) a[2].push(this.has(c) ? this.row[c] : "");
      else if (this.has(c)) a[2].pushSpan(this.text, this.starts[c], this.ends[c]);
      else a[2].push("");
    }
    if (b.hdop) b.hdop.push(this.optionalNumber(ix.hdop, line));
    if (b.precision) b.precision.push(this.optionalNumber(ix.precision, line));
    if (b.rawX && b.rawY) {
      b.rawX.push(this.optionalNumber(ix.rawX, line));
      b.rawY.push(this.optionalNumber(ix.rawY, line));
    }
    if (b.time && this.times) {
      const raw = this.cell(ix.time);
      const t = this.times.parse(raw);
      if (t.ok) b.time.push(t.ms);
      else {
        b.time.push(NaN);
        if (t.reason === "no-zone") {
          if (this.noZoneCount++ === 0) this.noZoneFirst = line;
        } else if (t.reason === "not-a-time") {
          this.issues.add({
            severity: "warning",
            code: "time-not-parseable",
            file,
            line,
            column: this.names[ix.time],
            value: raw,
            message: "expected an ISO 8601 time such as 2025-05-03T08:15:00+02:00; the time is left empty",
          });
        }
      }
    }
    return true;
  }

  private badNumber(line: number, col: number): void {
    this.issues.add({
      severity: "error",
      code: "coordinate-not-numeric",
      file: this.options.source,
      line,
      column: this.names[col],
      value: this.cell(col),
      message: this.decimalComma
        ? "expected a number (decimal point or decimal comma)"
        : "expected a number with a decimal point (this file is comma-separated, so a decimal comma cannot be read)",
    });
  }

  private optionalNumber(col: number, line: number): number {
    const v = this.num(col);
    if (v === undefined) return NaN;
    if (!Number.isFinite(v)) {
      this.issues.add({
        severity: "warning",
        code: "value-not-numeric",
        file: this.options.source,
        line,
        column: this.names[col],
        value: this.cell(col),
        message: "expected a number; the value is left empty",
      });
      return NaN;
    }
    return v;
  }

  /** Builds the table and adds the summary issues (missing ids, times without a zone). */
  finish(): PointTable {
    const file = this.options.source;
    if (this.missingIdCount > 0) {
      this.issues.add({
        severity: "warning",
        code: "id-missing",
        file,
        line: this.missingIds[0],
        column: this.names[this.ix.id],
        message: `${this.missingIdCount} row(s) have no plant id (lines ${this.missingIds.join(", ")}${this.missingIdCount > this.missingIds.length ? ", …" : ""}); they can only be paired by position`,
      });
    }
    if (this.noZoneCount > 0) {
      this.issues.add({
        severity: "warning",
        code: "time-without-zone",
        file,
        line: this.noZoneFirst,
        column: this.names[this.ix.time],
        message: `${this.noZoneCount} time(s) have no UTC offset; give the field's time zone (e.g. --timezone Europe/Berlin) to use them. Until then they are left empty`,
      });
    }
    return this.b.finish(file, this.options.role);
  }
}
