import Papa from "papaparse";
import type { FileRole, InputIssue, PointTable } from "../types";
import { IssueCollector } from "../validate/issues";
import { planColumns, type ColumnGuess, type ColumnMapping } from "./columns";
import { RowSink, tallyIssues, type Tally } from "./sink";
import type { RecordedMissing } from "./status";
import { encodingIssue, NotTextError, textChunks, type TextInput, type TextReport } from "./text";
import { parseNumber } from "./values";

/** Options of the file readers. */
export interface ReadOptions {
  /** File name used in messages, e.g. "planted.csv". */
  source: string;
  role: FileRole;
  /** Explicit column mapping; overrides guessing role by role. */
  mapping?: ColumnMapping;
  /** IANA time zone for times written without a UTC offset. */
  timeZone?: string;
  /** CSV delimiter; detected from the header line when omitted. */
  delimiter?: "," | ";" | "\t" | "|";
  /** Issues of one kind kept per file (default 50). */
  issueCap?: number;
  /** Characters per parsing slice (default about 1 MB); small values exercise slice boundaries in tests. */
  sliceChars?: number;
}

/** What a reader returns. `table` is null when any error was found. */
export interface ReadResult {
  table: PointTable | null;
  issues: InputIssue[];
  columns: ColumnGuess;
  /** CRS named inside the file (GeoJSON legacy `crs` member), e.g. "EPSG:25832". */
  crsHint?: string;
  /** Counts behind the summary warnings (see `appendReadResults`). */
  tally?: Tally;
  /** Survey rows recording a planned point as dead or not found (geo/read/status.ts); not in `table`. */
  recordedMissing?: RecordedMissing[];
  /** CSV: physical lines read, and whether any double quote was seen (a quoted field may span lines). */
  linesRead?: number;
  sawQuote?: boolean;
}

function isBlank(text: string, s: number, e: number): boolean {
  for (let i = s; i < e; i++) if (text.charCodeAt(i) > 32) return false;
  return true;
}

/**
 * End of the header line (index of its newline), skipping blank lines before it and newlines inside
 * double quotes; -1 when the text does not hold a whole non-blank line.
 * @example headerEnd("\nid,lat\n1,2", "\n") // 7
 */
export function headerEnd(text: string, newline: string): number {
  let quoted = false;
  let lineStart = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) quoted = !quoted;
    else if (!quoted && text.startsWith(newline, i)) {
      if (!isBlank(text, lineStart, i)) return i;
      lineStart = i + newline.length;
      i = lineStart - 1;
    }
  }
  return -1;
}

/** A quoted field longer than this (unbalanced quote) stops reading. */
const MAX_PENDING = 32 << 20;

/** The longest field (cell) a file may hold, in characters; a longer one is an error naming line and column. */
export const MAX_FIELD_CHARS = 1000;
/** The longest line a file may hold, in characters; a longer one is an error naming the line. */
export const MAX_LINE_CHARS = 10_000;

const EMPTY_GUESS: ColumnGuess = { header: [], columns: {}, coordinates: null, rawCoordinates: null, unused: [] };

/**
 * Detects the delimiter from the header line: the most frequent of tab, semicolon, comma and pipe
 * outside double quotes (ties: tab, then semicolon, then comma).
 * @example detectDelimiter("plant_id;lat;lon") // ";"
 */
export function detectDelimiter(headerLine: string): "," | ";" | "\t" | "|" {
  const counts: Record<string, number> = { "\t": 0, ";": 0, ",": 0, "|": 0 };
  let quoted = false;
  for (let i = 0; i < headerLine.length; i++) {
    const c = headerLine[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && c in counts) counts[c]++;
  }
  let best: "," | ";" | "\t" | "|" = ",";
  let n = 0;
  for (const d of ["\t", ";", ",", "|"] as const) {
    if (counts[d] > n) {
      best = d;
      n = counts[d];
    }
  }
  return best;
}

/**
 * Reads a CSV file of as-planted records or survey points into a column table.
 *
 * Streams: the input (a string or chunks of text/bytes) is read in slices of about 1 MB, carrying the
 * unfinished last row to the next slice, so neither the whole text nor per-row objects are kept.
 * Slices that contain a double quote go through papaparse's parser (`Papa.Parser`, the RFC 4180
 * state machine `Papa.parse` streams with); quote-free slices, the common case for machine exports,
 * are split by hand on newline and delimiter (what papaparse's own "fast mode" does) but without
 * making a string per field: only the cells a role needs are read, numbers straight from the text.
 * Handles comma, semicolon, tab or pipe delimiters (detected), decimal commas in files not delimited
 * by commas, a UTF-8 BOM, CRLF/LF/CR line ends, quoted fields (also with line breaks: line numbers
 * count the physical lines) and blank lines.
 *
 * Line numbers are 1-based with the header on line 1. Errors (missing coordinate columns, text or
 * non-finite numbers in coordinate cells, unreadable input) mean `table: null`.
 *
 * @example
 * const r = await readCsv("plant_id;lat;lon\nP1;52,1;9,2\n", { source: "p.csv", role: "planted" });
 * r.table!.y[0]; // 52.1
 */
export async function readCsv(input: TextInput, options: ReadOptions): Promise<ReadResult> {
  const issues = new IssueCollector(options.issueCap);
  const file = options.source;
  let columns: ColumnGuess = EMPTY_GUESS;
  let sink: RowSink | null = null;
  let parser: Papa.Parser | null = null;
  let newline = "\n";
  let delimiter: string = options.delimiter ?? ",";
  let pending = "";
  let line = 0;
  let stopped = false;
  let sawHeader = false;
  let sawQuote = false;
  const encoding: TextReport = { encoding: "utf-8", firstNonAsciiLine: -1, firstNonAsciiText: "" };

  /** A line or field over the limits: an error, the row is left out. */
  const tooLong = (at: number, lineChars: number, fieldIndex: number, fieldChars: number, sample: string): void => {
    if (fieldChars <= MAX_FIELD_CHARS) {
      issues.add({
        severity: "error",
        code: "line-too-long",
        file,
        line: at,
        value: `${sample.slice(0, 40)}…`,
        message: `the line is ${lineChars.toLocaleString("en")} characters long; lines may be at most ${MAX_LINE_CHARS.toLocaleString("en")}`,
      });
      return;
    }
    issues.add({
      severity: "error",
      code: "field-too-long",
      file,
      line: at,
      column: columns.header[fieldIndex] ?? `field ${fieldIndex + 1}`,
      value: `${sample.slice(0, 40)}…`,
      message: `the value is ${fieldChars.toLocaleString("en")} characters long; a value may be at most ${MAX_FIELD_CHARS.toLocaleString("en")}`,
    });
  };

  /** Index of the first field over MAX_FIELD_CHARS, or -1. */
  const longField = (row: readonly string[]): number => {
    for (let k = 0; k < row.length; k++) if (row[k].length > MAX_FIELD_CHARS) return k;
    return -1;
  };

  const start = (text: string): boolean => {
    // Decide newline and delimiter from the first line.
    const nl = text.indexOf("\n");
    const cr = text.indexOf("\r");
    newline = nl >= 0 ? (nl > 0 && text[nl - 1] === "\r" ? "\r\n" : "\n") : cr >= 0 ? "\r" : "\n";
    const end = text.indexOf(newline);
    const headerLine = end >= 0 ? text.slice(0, end) : text;
    delimiter = options.delimiter ?? detectDelimiter(headerLine);
    parser = new Papa.Parser({ delimiter, newline: newline as "\n", quoteChar: '"' });
    return true;
  };

  const handle = (rows: string[][], slowPath: boolean, errors: { row?: number; message: string }[]): void => {
    let first = 0;
    if (!sawHeader) {
      // Skip blank lines before the header.
      while (first < rows.length && rows[first].length === 1 && rows[first][0].trim() === "") {
        line++;
        first++;
      }
      if (first >= rows.length) return;
      const header = rows[first];
      line++;
      first++;
      sawHeader = true;
      const longHeader = longField(header);
      const headerChars = header.reduce((n, h) => n + h.length + 1, -1);
      if (longHeader >= 0 || headerChars > MAX_LINE_CHARS) {
        const k = Math.max(longHeader, 0);
        tooLong(1, headerChars, k, header[k].length, header[k]);
        stopped = true;
        return;
      }
      if (header.every((h) => h.trim() !== "" && Number.isFinite(parseNumber(h, delimiter !== ",") ?? NaN))) {
        issues.add({
          severity: "error",
          code: "header-missing",
          file,
          line: 1,
          value: header.join(delimiter),
          message: "the first line holds numbers, not column names; add a header line such as plant_id,lat,lon",
        });
        stopped = true;
        return;
      }
      const plan = planColumns(header, options.mapping, { role: options.role });
      columns = { ...plan.guess, delimiter, decimalComma: delimiter !== "," };
      for (const p of plan.problems) issues.add({ ...p, file, line: 1 });
      if (plan.problems.some((p) => p.severity === "error")) {
        stopped = true;
        return;
      }
      sink = new RowSink(
        plan,
        { source: file, role: options.role, timeZone: options.timeZone, decimalComma: delimiter !== "," },
        issues,
      );
    }
    const s = sink!;
    const errorRows = new Map<number, string>();
    for (const e of errors) if (e.row !== undefined) errorRows.set(e.row, e.message);
    for (let r = first; r < rows.length; r++) {
      const row = rows[r];
      line++;
      const at = line;
      if (slowPath)
        for (const cell of row) for (let k = cell.indexOf("\n"); k >= 0; k = cell.indexOf("\n", k + 1)) line++;
      if (row.length === 1 && row[0].trim() === "") continue;
      const long = longField(row);
      const rowChars = row.reduce((n, c) => n + c.length + 1, -1);
      if (long >= 0 || rowChars > MAX_LINE_CHARS) {
        tooLong(at, rowChars, Math.max(long, 0), long >= 0 ? row[long].length : 0, row[Math.max(long, 0)]);
        continue;
      }
      const err = errorRows.get(r);
      if (err !== undefined) {
        issues.add({
          severity: "error",
          code: "csv-malformed",
          file,
          line: at,
          message: `the row cannot be split into fields: ${err}`,
        });
        continue;
      }
      s.add(row, at);
    }
  };

  /**
   * Quote-free text: split rows and fields by hand, only the cells a role needs are read. Returns
   * where the unfinished last row starts (the text's length when none). The caller keeps that
   * tail: work done only once per slice stays out of this hot loop, so the optimised code of the
   * loop is not thrown away at the end of every slice for want of type feedback.
   */
  const fastParse = (text: string, last: boolean): number => {
    const s = sink!;
    const starts = s.starts,
      ends = s.ends;
    const lastNeeded = s.lastNeeded;
    const nlCode = newline === "\r" ? 13 : 10;
    const crlf = newline === "\r\n";
    const dc = delimiter.charCodeAt(0);
    const n = text.length;
    let pos = 0; // start of the current row
    for (;;) {
      if (pos >= n) break;
      // One pass over the row's characters: field boundaries up to the newline.
      let f = 0,
        a = pos,
        j = pos,
        longAt = -1;
      for (; j < n; j++) {
        const c = text.charCodeAt(j);
        if (c === dc) {
          if (f <= lastNeeded) {
            starts[f] = a;
            ends[f] = j;
          }
          if (j - a > MAX_FIELD_CHARS && longAt < 0) longAt = f;
          f++;
          a = j + 1;
        } else if (c === nlCode) break;
      }
      if (j >= n && !last) break; // unfinished row: carried to the next slice
      let end = j;
      if (crlf && end > a && text.charCodeAt(end - 1) === 13) end--;
      if (longAt >= 0 || end - a > MAX_FIELD_CHARS || end - pos > MAX_LINE_CHARS) {
        line++;
        const k = longAt >= 0 ? longAt : end - a > MAX_FIELD_CHARS ? f : -1;
        let fs = pos,
          fe = end;
        if (k >= 0) {
          for (let q = 0; q < k; q++) fs = text.indexOf(delimiter, fs) + 1;
          if (k < f) fe = text.indexOf(delimiter, fs);
        }
        tooLong(line, end - pos, Math.max(k, 0), k < 0 ? 0 : fe - fs, text.substring(fs, Math.min(fe, fs + 40)));
        pos = j + 1;
        continue;
      }
      if (f <= lastNeeded) {
        starts[f] = a;
        ends[f] = end;
      }
      f++;
      line++;
      if (end > pos && !(f === 1 && isBlank(text, pos, end))) s.addSpans(text, Math.min(f, lastNeeded + 1), line, f);
      pos = j + 1;
    }
    return pos;
  };

  const parse = (text: string, last: boolean): void => {
    if (sink === null && !stopped) {
      // The header line goes through papaparse (it may be quoted); the rest of the slice can then
      // take the fast path instead of papaparse's row arrays.
      const cut = headerEnd(text, newline);
      if (cut >= 0) {
        const head = text.substring(0, cut);
        const quotedHead = head.indexOf('"') >= 0;
        if (quotedHead) sawQuote = true;
        const res = parser!.parse(head, 0, false) as { data: string[][]; errors: { row?: number; message: string }[] };
        handle(res.data, quotedHead, res.errors);
        if (stopped || sink === null) {
          pending = "";
          return;
        }
        text = text.substring(cut + newline.length);
      }
    }
    const quoted = text.indexOf('"') >= 0;
    if (quoted) sawQuote = true;
    if (sink !== null && !quoted) {
      const pos = fastParse(text, last);
      pending = last || pos >= text.length ? "" : text.substring(pos);
      return;
    }
    const p = parser!;
    const res = p.parse(text, 0, !last) as {
      data: string[][];
      errors: { row?: number; message: string }[];
      meta: { cursor: number };
    };
    pending = last ? "" : text.substring(res.meta.cursor);
    handle(res.data, quoted, res.errors);
  };

  try {
    for await (const chunk of textChunks(input, options.sliceChars, encoding)) {
      if (stopped) break;
      let text = pending + chunk;
      if (parser === null) {
        // Wait for a whole first line; a lone "\r" at the end may be the first half of "\r\n".
        const cr = text.indexOf("\r");
        if (text.indexOf("\n") < 0 && (cr < 0 || cr === text.length - 1) && text.length < MAX_PENDING) {
          pending = text;
          continue;
        }
        start(text);
      }
      parse(text, false);
      text = "";
      if (pending.length > MAX_PENDING) {
        issues.add({
          severity: "error",
          code: "row-too-long",
          file,
          line: line + 1,
          message: 'a row is longer than 32 MB; probably a quote (") is not closed',
        });
        stopped = true;
      }
    }
    if (!stopped) {
      if (parser === null) {
        if (pending.trim() !== "") start(pending);
      }
      if (parser !== null) parse(pending, true);
    }
  } catch (e) {
    issues.add({
      severity: "error",
      code: e instanceof NotTextError ? e.code : "file-unreadable",
      file,
      line: e instanceof NotTextError ? e.line : undefined,
      message: e instanceof Error ? e.message : String(e),
    });
    return { table: null, issues: issues.finish(), columns };
  }
  const notUtf8 = encodingIssue(encoding, file);
  if (notUtf8) issues.add(notUtf8);

  if (!sawHeader && !issues.hasErrors()) {
    issues.add({
      severity: "error",
      code: "file-empty",
      file,
      message: "the file is empty; expected a header line and one row per point",
    });
  }
  if (sink === null) return { table: null, issues: issues.finish(), columns };
  const done = sink as RowSink;
  const table = done.finish();
  const tally = done.tally();
  issues.addAll(tallyIssues(tally, file));
  if (table.length === 0 && !issues.hasErrors()) {
    issues.add({
      severity: "error",
      code: "file-no-rows",
      file,
      message: "the file has a header but no rows with a position",
    });
  }
  const list = issues.finish();
  return {
    table: list.some((i) => i.severity === "error") ? null : table,
    issues: list,
    columns,
    tally,
    recordedMissing: done.recorded(),
    linesRead: line,
    sawQuote,
  };
}
