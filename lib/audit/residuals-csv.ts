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
export const UNPAIRED_CSV_COLUMNS = ["kind", "id", "file", "line", "e", "n", "crop", "bed", "row", "arm", "fix"] as const;

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
function csvText(text: string): string {
  const safe = neutraliseCell(text);
  return NEEDS_QUOTES.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** A numeric cell rounded to `decimals` places; empty for NaN/±Infinity. Plain decimal notation for |v| < 1e21. */
function csvNumber(v: number, scale: number): string {
  if (!Number.isFinite(v)) return "";
  const r = Math.round(v * scale) / scale;
  return String(r === 0 ? 0 : r);
}

function attrText(table: PointTable, name: AttributeName, row: number): string {
  const col = table.attrs[name];
  if (!col) return "";
  const code = col.codes[row];
  return code >= 0 ? col.values[code] : "";
}

/** Attribute of a pair: the planted record's value, else the survey point's. */
function pairAttr(planted: PointTable, survey: PointTable, name: AttributeName, p: number, s: number): string {
  return planted.attrs[name] ? attrText(planted, name, p) : attrText(survey, name, s);
}

const flag = (v: number): string => (v ? "true" : "false");

/**
 * Per-plant residuals CSV (columns {@link RESIDUALS_CSV_COLUMNS}), one row per pair in pairing order.
 * Coordinates and residuals in metres rounded to `decimals` places (default 4, i.e. 0.1 mm); along/cross empty
 * without a row bearing; within_tolerance empty without a tolerance; paired_by "id" or "position".
 * Yields the header first, then chunks of `chunkRows` rows (default 4096), each ending in "\n".
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
  const scale = 10 ** (input.decimals ?? 4);
  const chunkRows = Math.max(1, input.chunkRows ?? 4096);
  yield `${RESIDUALS_CSV_COLUMNS.join(",")}\n`;
  const n = r.plantedIndex.length;
  let lines: string[] = [];
  for (let i = 0; i < n; i++) {
    const p = r.plantedIndex[i];
    const s = r.surveyIndex[i];
    const cells = [
      csvText(planted.id ? planted.id[p] : ""),
      csvText(survey.id ? survey.id[s] : ""),
      csvText(pairAttr(planted, survey, "crop", p, s)),
      csvText(pairAttr(planted, survey, "bed", p, s)),
      csvText(pairAttr(planted, survey, "row", p, s)),
      csvText(pairAttr(planted, survey, "arm", p, s)),
      csvText(pairAttr(planted, survey, "fix", p, s)),
      csvNumber(planted.x[p], scale),
      csvNumber(planted.y[p], scale),
      csvNumber(survey.x[s], scale),
      csvNumber(survey.y[s], scale),
      csvNumber(r.dE[i], scale),
      csvNumber(r.dN[i], scale),
      r.along ? csvNumber(r.along[i], scale) : "",
      r.cross ? csvNumber(r.cross[i], scale) : "",
      csvNumber(r.radial[i], scale),
      r.withinTolerance ? flag(r.withinTolerance[i]) : "",
      flag(r.outlier[i]),
      r.method[i] === PAIRED_BY_ID ? "id" : "position",
    ];
    lines.push(cells.join(","));
    if (lines.length === chunkRows) {
      yield `${lines.join("\n")}\n`;
      lines = [];
    }
  }
  if (lines.length > 0) yield `${lines.join("\n")}\n`;
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
  const scale = 10 ** (input.decimals ?? 4);
  const chunkRows = Math.max(1, input.chunkRows ?? 4096);
  yield `${UNPAIRED_CSV_COLUMNS.join(",")}\n`;
  const parts: Array<[string, PointTable, Int32Array]> = [
    ["planted-not-found", planted, pairing.unmatchedPlanted],
    ["surveyed-not-planted", survey, pairing.unmatchedSurvey],
    ["ambiguous", survey, pairing.ambiguousSurvey],
  ];
  let lines: string[] = [];
  for (const [kind, table, rows] of parts) {
    for (let k = 0; k < rows.length; k++) {
      const i = rows[k];
      lines.push(
        [
          kind,
          csvText(table.id ? table.id[i] : ""),
          csvText(table.source),
          String(table.line[i]),
          csvNumber(table.x[i], scale),
          csvNumber(table.y[i], scale),
          csvText(attrText(table, "crop", i)),
          csvText(attrText(table, "bed", i)),
          csvText(attrText(table, "row", i)),
          csvText(attrText(table, "arm", i)),
          csvText(attrText(table, "fix", i)),
        ].join(","),
      );
      if (lines.length === chunkRows) {
        yield `${lines.join("\n")}\n`;
        lines = [];
      }
    }
  }
  if (lines.length > 0) yield `${lines.join("\n")}\n`;
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
