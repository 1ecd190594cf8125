/**
 * CSV reports: per-plant residuals, unpaired points and the summary as key/value rows.
 *
 * Writers are generators of string chunks (many rows per chunk) so a million rows never become one string.
 * Format: comma-separated, header row first, LF line ends, fields quoted per RFC 4180 when they contain a comma,
 * quote, CR or LF. Text cells (ids, attributes, notes) that start with "=", "+", "-", "@", tab or CR are neutralised
 * with a leading single quote so spreadsheets do not execute them (common practice, no source: the CSV-injection
 * advice of OWASP, from memory); numeric cells are written as plain numbers, so -0.012 stays a number.
 */
import type { AttributeName, Pairing, PointTable } from "@/geo/types";
import { PAIRED_BY_ID } from "@/geo/types";
import type { AuditResiduals, AuditSummary } from "./types";

/** Columns of the per-plant residuals CSV, in order. */
export const RESIDUALS_CSV_COLUMNS = [
  "plant_id",
  "survey_id",
  "crop",
  "bed",
  "row",
  "arm",
  "fix",
  "planted_e",
  "planted_n",
  "survey_e",
  "survey_n",
  "de_m",
  "dn_m",
  "along_m",
  "cross_m",
  "radial_m",
  "within_tolerance",
  "outlier",
  "paired_by",
] as const;

/** Columns of the unpaired-points CSV, in order. */
export const UNPAIRED_CSV_COLUMNS = [
  "kind",
  "id",
  "file",
  "line",
  "e",
  "n",
  "crop",
  "bed",
  "row",
  "arm",
  "fix",
] as const;

const DANGEROUS_FIRST = new Set(["=", "+", "-", "@", "\t", "\r"]);
const NEEDS_QUOTES = /[",\r\n]/;

/**
 * Neutralises one TEXT cell for spreadsheets: a leading "=", "+", "-", "@", tab or CR gets a single quote in front.
 * Does not quote for CSV (see {@link csvText}).
 *
 * Source: common practice, no source (CSV/formula injection guidance, from memory).
 *
 * @example neutraliseCell("=HYPERLINK(\"x\")") // "'=HYPERLINK(\"x\")"
 * @example neutraliseCell("B-12") // "B-12"
 */
export function neutraliseCell(text: string): string {
  return text.length > 0 && DANGEROUS_FIRST.has(text[0]) ? `'${text}` : text;
}

/** A text cell: neutralised, then quoted when needed (RFC 4180). */
export function csvText(text: string): string {
  const safe = neutraliseCell(text);
  return NEEDS_QUOTES.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * Formatter of numeric cells rounded to `decimals` places (0–10, half away from zero), trailing zeros dropped;
 * empty for NaN/±Infinity; plain decimal notation (no exponent) below 1e15 in magnitude. For up to 4 decimals the
 * fraction comes from a lookup table, so a million rows format quickly.
 *
 * @example csvNumberFormatter(4)(-0.01234) // "-0.0123"
 */
export function csvNumberFormatter(decimals: number): (v: number) => string {
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 10) {
    throw new Error(`residualsCsv: decimals must be an integer 0..10, got ${decimals}`);
  }
  const scale = 10 ** decimals;
  const slow = (v: number): string => {
    if (!Number.isFinite(v)) return "";
    const r = Math.round(Math.abs(v) * scale) / scale;
    if (r === 0) return "0";
    const text = r.toFixed(decimals);
    return `${v < 0 ? "-" : ""}${decimals > 0 ? text.replace(/\.?0+$/, "") : text}`;
  };
  if (decimals > 4) return slow;
  // fractions[f] = ".dddd" without trailing zeros ("" for 0)
  const fractions = new Array<string>(scale);
  for (let f = 0; f < scale; f++)
    fractions[f] = f === 0 ? "" : `.${String(f).padStart(decimals, "0").replace(/0+$/, "")}`;
  return (v: number): string => {
    if (!Number.isFinite(v)) return "";
    const q = Math.round(Math.abs(v) * scale);
    if (q > 9e15) return slow(v);
    if (q === 0) return "0";
    const whole = Math.floor(q / scale);
    return `${v < 0 ? "-" : ""}${whole}${fractions[q - whole * scale]}`;
  };
}

/** One attribute column ready for output: codes per row and the escaped text of each dictionary value. */
interface OutputColumn {
  codes: Int32Array | null;
  text: string[];
}

function outputColumn(table: PointTable, name: AttributeName): OutputColumn {
  const col = table.attrs[name];
  return col ? { codes: col.codes, text: col.values.map(csvText) } : { codes: null, text: [] };
}

function cellOf(col: OutputColumn, row: number): string {
  if (col.codes === null) return "";
  const code = col.codes[row];
  return code >= 0 ? col.text[code] : "";
}

/** Attribute of a pair: the planted record's value when the planted file has the column, else the survey point's. */
function pairColumn(
  planted: PointTable,
  survey: PointTable,
  name: AttributeName,
): { column: OutputColumn; fromPlanted: boolean } {
  const fromPlanted = planted.attrs[name] !== undefined;
  return { column: outputColumn(fromPlanted ? planted : survey, name), fromPlanted };
}

const PAIR_ATTRIBUTES: readonly AttributeName[] = ["crop", "bed", "row", "arm", "fix"];
const flag = (v: number): string => (v ? "true" : "false");

/**
 * Per-plant residuals CSV (columns {@link RESIDUALS_CSV_COLUMNS}), one row per pair in pairing order.
 * Coordinates and residuals in metres rounded to `decimals` places (default 4, i.e. 0.1 mm); along/cross empty
 * without a row bearing; within_tolerance empty without a tolerance; paired_by "id" or "position".
 * Yields the header first, then chunks of `chunkRows` rows (default 2048), each ending in "\n".
 *
 * @example for (const chunk of residualsCsv({ planted, survey, residuals })) stream.write(chunk);
 */
export function* residualsCsv(input: {
  planted: PointTable;
  survey: PointTable;
  residuals: AuditResiduals;
  decimals?: number;
  chunkRows?: number;
}): Generator<string, void, undefined> {
  const { planted, survey, residuals: r } = input;
  const num = csvNumberFormatter(input.decimals ?? 4);
  const chunkRows = Math.max(1, input.chunkRows ?? 2048);
  const [
    { column: crop, fromPlanted: cropP },
    { column: bed, fromPlanted: bedP },
    { column: row, fromPlanted: rowP },
    { column: arm, fromPlanted: armP },
    { column: fix, fromPlanted: fixP },
  ] = PAIR_ATTRIBUTES.map((name) => pairColumn(planted, survey, name));
  const { plantedIndex, surveyIndex, dE, dN, along, cross, radial, withinTolerance, outlier, method } = r;
  const px = planted.x;
  const py = planted.y;
  const sx = survey.x;
  const sy = survey.y;
  const plantedIds = planted.id;
  const surveyIds = survey.id;
  yield `${RESIDUALS_CSV_COLUMNS.join(",")}\n`;
  const n = plantedIndex.length;
  let lines: string[] = [];
  for (let i = 0; i < n; i++) {
    const p = plantedIndex[i];
    const s = surveyIndex[i];
    lines.push(
      `${plantedIds ? csvText(plantedIds.get(p)) : ""},${surveyIds ? csvText(surveyIds.get(s)) : ""},` +
        `${cellOf(crop, cropP ? p : s)},${cellOf(bed, bedP ? p : s)},${cellOf(row, rowP ? p : s)},` +
        `${cellOf(arm, armP ? p : s)},${cellOf(fix, fixP ? p : s)},` +
        `${num(px[p])},${num(py[p])},${num(sx[s])},${num(sy[s])},${num(dE[i])},${num(dN[i])},` +
        `${along ? num(along[i]) : ""},${cross ? num(cross[i]) : ""},${num(radial[i])},` +
        `${withinTolerance ? flag(withinTolerance[i]) : ""},${flag(outlier[i])},${method[i] === PAIRED_BY_ID ? "id" : "position"}`,
    );
    if (lines.length === chunkRows) {
      lines.push("");
      yield lines.join("\n");
      lines = [];
    }
  }
  if (lines.length > 0) {
    lines.push("");
    yield lines.join("\n");
  }
}

/**
 * Unpaired points CSV (columns {@link UNPAIRED_CSV_COLUMNS}): planted rows never found ("planted-not-found"),
 * survey points with no record ("surveyed-not-planted") and survey points left unpaired because two planted
 * candidates were almost equally near ("ambiguous"), in that order. `file`/`line` point back at the input row;
 * e/n in metres (work CRS) rounded to `decimals` (default 4).
 *
 * @example for (const chunk of unpairedCsv({ planted, survey, pairing })) stream.write(chunk);
 */
export function* unpairedCsv(input: {
  planted: PointTable;
  survey: PointTable;
  pairing: Pairing;
  decimals?: number;
  chunkRows?: number;
}): Generator<string, void, undefined> {
  const { planted, survey, pairing } = input;
  const num = csvNumberFormatter(input.decimals ?? 4);
  const chunkRows = Math.max(1, input.chunkRows ?? 2048);
  yield `${UNPAIRED_CSV_COLUMNS.join(",")}\n`;
  const parts: Array<[string, PointTable, Int32Array]> = [
    ["planted-not-found", planted, pairing.unmatchedPlanted],
    ["surveyed-not-planted", survey, pairing.unmatchedSurvey],
    ["ambiguous", survey, pairing.ambiguousSurvey],
  ];
  let lines: string[] = [];
  for (const [kind, table, rows] of parts) {
    const attrs = PAIR_ATTRIBUTES.map((name) => outputColumn(table, name));
    const file = csvText(table.source);
    for (let k = 0; k < rows.length; k++) {
      const i = rows[k];
      let line = `${kind},${table.id ? csvText(table.id.get(i)) : ""},${file},${table.line[i]},${num(table.x[i])},${num(table.y[i])}`;
      for (const a of attrs) line += `,${cellOf(a, i)}`;
      lines.push(line);
      if (lines.length === chunkRows) {
        lines.push("");
        yield lines.join("\n");
        lines = [];
      }
    }
  }
  if (lines.length > 0) {
    lines.push("");
    yield lines.join("\n");
  }
}

type Scalar = string | number | boolean | null;

function flatten(value: unknown, key: string, out: Array<[string, Scalar]>): void {
  if (value === null || value === undefined) {
    out.push([key, null]);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => flatten(v, `${key}[${i}]`, out));
  } else if (typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) flatten(v, key ? `${key}.${k}` : k, out);
  } else if (typeof value === "number" || typeof value === "string" || typeof value === "boolean") {
    out.push([key, value]);
  }
}

/**
 * The summary as flat key/value rows: nested keys joined with ".", array items as "[i]"
 * (e.g. "withinTolerance.lower95", "groups.arm[0].rmseR", "notes[0].code"). Numbers keep full precision; null stays null.
 *
 * @example summaryRows(summary).find(([k]) => k === "rmseR") // ["rmseR", 0.0123]
 */
export function summaryRows(summary: AuditSummary): Array<[string, Scalar]> {
  const out: Array<[string, Scalar]> = [];
  flatten(summary, "", out);
  return out;
}

/**
 * Summary CSV with columns key,value (see {@link summaryRows}); null → empty cell, text neutralised, numbers plain.
 *
 * @example [...summaryCsv(summary)].join("") // "key,value\nstatus,ok\n..."
 */
export function* summaryCsv(summary: AuditSummary): Generator<string, void, undefined> {
  yield "key,value\n";
  const lines: string[] = [];
  for (const [key, value] of summaryRows(summary)) {
    const cell = value === null ? "" : typeof value === "string" ? csvText(value) : String(value);
    lines.push(`${csvText(key)},${cell}`);
  }
  if (lines.length > 0) yield `${lines.join("\n")}\n`;
}
