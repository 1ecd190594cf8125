/**
 * Spreadsheet variants of the CSV reports, made on request from an audit's stored rows. The engine's own reports
 * (residuals-csv.ts) stay the byte-exact "as computed" files that are hashed at sign-off; these never replace them.
 *
 * A variant has a length unit for errors (millimetres or metres; coordinates always metres) and a separator:
 * "comma" (comma between cells, decimal point) or "semicolon" (semicolon between cells, decimal comma), the two
 * conventions spreadsheets follow depending on the locale. Cells holding the separator, a quote, CR or LF are
 * quoted (RFC 4180, with the separator in place of the comma); text cells starting with "=", "+", "-", "@", tab or
 * CR get a leading single quote (see {@link neutraliseCell}). Numbers are never quoted or neutralised.
 */
import { csvNumberFormatter, neutraliseCell } from "./residuals-csv";
import type { AuditSummary } from "./types";

export const SHEET_UNITS = ["mm", "m"] as const;
export const SHEET_SEPARATORS = ["comma", "semicolon"] as const;
export type SheetUnits = (typeof SHEET_UNITS)[number];
export type SheetSeparator = (typeof SHEET_SEPARATORS)[number];

export interface SheetFormat {
  units: SheetUnits;
  sep: SheetSeparator;
}

/**
 * The file-name suffix that states a variant's format.
 *
 * @example sheetSuffix({ units: "mm", sep: "semicolon" }) // "mm-semicolon"
 */
export function sheetSuffix(format: SheetFormat): string {
  return `${format.units}-${format.sep}`;
}

const delimiter = (sep: SheetSeparator): string => (sep === "semicolon" ? ";" : ",");

/**
 * One text cell for a spreadsheet: neutralised against formula injection, then quoted when it holds the
 * separator, a quote, CR or LF.
 *
 * @example sheetText("Bed 3; row 2", "semicolon") // "\"Bed 3; row 2\""
 * @example sheetText("=1+1", "comma") // "'=1+1"
 */
export function sheetText(text: string, sep: SheetSeparator): string {
  const safe = neutraliseCell(text);
  const d = delimiter(sep);
  return safe.includes(d) || /["\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * Formatter of numbers for a separator: rounded to `decimals` (trailing zeros dropped), with a decimal comma for
 * "semicolon"; empty for null and non-finite values.
 *
 * @example sheetNumber("semicolon", 1)(-12.34) // "-12,3"
 */
export function sheetNumber(sep: SheetSeparator, decimals: number): (v: number | null) => string {
  const plain = csvNumberFormatter(decimals);
  return sep === "semicolon"
    ? (v) => (v === null ? "" : plain(v).replace(".", ","))
    : (v) => (v === null ? "" : plain(v));
}

/** One stored per-plant row, as `audit_residual` holds it (metres), and the planting time when known. */
export interface SheetResidualRow {
  plantId: string | null;
  surveyId: string | null;
  crop: string | null;
  bed: string | null;
  row: string | null;
  arm: string | null;
  fix: string | null;
  /** Planting day in the field's time zone, YYYY-MM-DD, as stored by the engine. */
  day: string | null;
  /** Planting time, epoch milliseconds UTC; null when the records have no time or the row cannot be traced. */
  plantedAt: number | null;
  plantedE: number;
  plantedN: number;
  surveyE: number;
  surveyN: number;
  dE: number;
  dN: number;
  along: number | null;
  cross: number | null;
  radial: number;
  within: boolean | null;
  outlier: boolean;
  pairedBy: "id" | "position";
}

function clockFormatter(timeZone: string): Intl.DateTimeFormat {
  try {
    return new Intl.DateTimeFormat("en-GB", {
      timeZone,
      calendar: "gregory",
      numberingSystem: "latn",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
      hourCycle: "h23",
    });
  } catch {
    throw new Error(`spreadsheet: unknown time zone "${timeZone}" (expected an IANA name such as "Europe/Amsterdam")`);
  }
}

function dateAndClock(formatter: Intl.DateTimeFormat, epochMs: number): { date: string; clock: string } {
  const p: Record<string, string> = {};
  for (const part of formatter.formatToParts(epochMs)) p[part.type] = part.value;
  return { date: `${p.year}-${p.month}-${p.day}`, clock: `${p.hour}:${p.minute}:${p.second}` };
}

/**
 * Local date and time "YYYY-MM-DD HH:MM:SS" of an instant in an IANA time zone ("UTC" for UTC).
 *
 * Source: IANA time zone database as shipped with the runtime (ECMA-402 Intl.DateTimeFormat).
 *
 * @example localDateTime(Date.UTC(2025, 4, 12, 23, 30), "Europe/Amsterdam") // "2025-05-13 01:30:00"
 */
export function localDateTime(epochMs: number, timeZone: string): string {
  if (!Number.isFinite(epochMs)) throw new Error(`spreadsheet: time must be finite epoch milliseconds, got ${epochMs}`);
  const { date, clock } = dateAndClock(clockFormatter(timeZone), epochMs);
  return `${date} ${clock}`;
}

/**
 * Header of the per-plant spreadsheet: errors in `units`, coordinates in metres, the planting time in the field's
 * time zone (named) and in UTC.
 *
 * @example residualsSheetHeader({ units: "mm", sep: "comma" }, "Europe/Amsterdam")[8] // "planted at (UTC)"
 */
export function residualsSheetHeader(format: SheetFormat, timeZone: string): string[] {
  const u = format.units;
  return [
    "plant id",
    "survey id",
    "crop",
    "bed",
    "row",
    "arm",
    "fix",
    `planting day (${timeZone})`,
    "planted at (UTC)",
    `planting time (${timeZone})`,
    "planted east (m)",
    "planted north (m)",
    "surveyed east (m)",
    "surveyed north (m)",
    `east error (${u})`,
    `north error (${u})`,
    `along-row error (${u})`,
    `cross-row error (${u})`,
    `distance (${u})`,
    "within tolerance",
    "outlier",
    "paired by",
  ];
}

const yesNo = (v: boolean | null): string => (v === null ? "" : v ? "yes" : "no");

/**
 * Per-plant spreadsheet rows (header first, then one line per row, CRLF line ends so every spreadsheet splits
 * them alike). Errors are scaled to `units` (0.1 mm or 0.0001 m), coordinates written in metres to 0.1 mm.
 * The planting day is the stored one; the planting time is shown in `timeZone` and in UTC when known.
 * Yields chunks of up to `chunkRows` lines; inputs not modified.
 *
 * @example [...residualsSheet([], { units: "mm", sep: "semicolon" }, "UTC")][0].startsWith("plant id;") // true
 */
export function* residualsSheet(
  rows: Iterable<SheetResidualRow>,
  format: SheetFormat,
  timeZone: string,
  chunkRows = 2048,
): Generator<string, void, undefined> {
  const d = delimiter(format.sep);
  const text = (v: string | null) => (v === null ? "" : sheetText(v, format.sep));
  const scale = format.units === "mm" ? 1000 : 1;
  const err = sheetNumber(format.sep, format.units === "mm" ? 1 : 4);
  const coord = sheetNumber(format.sep, 4);
  const scaled = (v: number | null) => err(v === null ? null : v * scale);
  const local = clockFormatter(timeZone);
  const utc = clockFormatter("UTC");
  yield `${residualsSheetHeader(format, timeZone)
    .map((h) => sheetText(h, format.sep))
    .join(d)}\r\n`;
  let lines: string[] = [];
  for (const r of rows) {
    let atUtc = "";
    let atLocal = "";
    if (r.plantedAt !== null && Number.isFinite(r.plantedAt)) {
      const u = dateAndClock(utc, r.plantedAt);
      atUtc = `${u.date} ${u.clock}`;
      atLocal = dateAndClock(local, r.plantedAt).clock;
    }
    lines.push(
      [
        text(r.plantId),
        text(r.surveyId),
        text(r.crop),
        text(r.bed),
        text(r.row),
        text(r.arm),
        text(r.fix),
        text(r.day),
        atUtc,
        atLocal,
        coord(r.plantedE),
        coord(r.plantedN),
        coord(r.surveyE),
        coord(r.surveyN),
        scaled(r.dE),
        scaled(r.dN),
        scaled(r.along),
        scaled(r.cross),
        scaled(r.radial),
        yesNo(r.within),
        yesNo(r.outlier),
        r.pairedBy === "id" ? "plant id" : "position",
      ].join(d),
    );
    if (lines.length >= chunkRows) {
      yield `${lines.join("\r\n")}\r\n`;
      lines = [];
    }
  }
  if (lines.length > 0) yield `${lines.join("\r\n")}\r\n`;
}

/** One labelled line of the summary spreadsheet. */
export interface SummaryLine {
  label: string;
  value: string | number | null;
  /** "mm", "m", "%", "count", "°" or "" for text. */
  unit: string;
}

/** What the summary spreadsheet states besides the engine's figures; all from stored records. */
export interface SummarySheetInput {
  title: string;
  fieldName: string;
  revision: number;
  /** The state in plain words (e.g. "Signed off"), never the stored code. */
  stateLabel: string;
  computedAt: string | null;
  profile: {
    name: string;
    operation: string;
    radialM: number | null;
    crossM: number | null;
    alongM: number | null;
    requiredShare: number;
    confidence: number;
    minCheckpoints: number;
  } | null;
  verdict: { passed: boolean; criteria: Array<{ passed: boolean; text: string }> } | null;
  summary: AuditSummary;
  signoff: { signerName: string; signedAt: string; sha256: string } | null;
}

/**
 * The summary as labelled lines (label, value, unit) in reading order: what was audited, against which profile,
 * the verdict with each criterion, the headline figures and, when signed, who signed, when and the SHA-256.
 * Lengths are converted to `units`; shares are percentages; times are UTC ISO 8601 as stored.
 *
 * @example summaryLines(input, "mm").find((l) => l.label === "Horizontal RMSE") // { label, value: 7.6, unit: "mm" }
 */
export function summaryLines(input: SummarySheetInput, units: SheetUnits): SummaryLine[] {
  const s = input.summary;
  const len = (v: number | null | undefined): number | null =>
    v === null || v === undefined ? null : units === "mm" ? v * 1000 : v;
  const pct = (v: number | null | undefined): number | null => (v === null || v === undefined ? null : v * 100);
  const lines: SummaryLine[] = [
    { label: "Audit", value: input.title, unit: "" },
    { label: "Field", value: input.fieldName, unit: "" },
    { label: "Revision", value: input.revision, unit: "count" },
    { label: "State", value: input.stateLabel, unit: "" },
    { label: "Computed at (UTC)", value: input.computedAt, unit: "" },
  ];
  const p = input.profile;
  if (p) {
    lines.push(
      { label: "Tolerance profile", value: p.name, unit: "" },
      { label: "Operation", value: p.operation, unit: "" },
      { label: "Distance limit", value: len(p.radialM), unit: units },
      { label: "Cross-row limit", value: len(p.crossM), unit: units },
      { label: "Along-row limit", value: len(p.alongM), unit: units },
      { label: "Required share within limits", value: pct(p.requiredShare), unit: "%" },
      { label: "Confidence", value: pct(p.confidence), unit: "%" },
      { label: "Minimum checkpoints", value: p.minCheckpoints, unit: "count" },
    );
  }
  if (input.verdict) {
    lines.push({ label: "Verdict", value: input.verdict.passed ? "Pass" : "Fail", unit: "" });
    for (const c of input.verdict.criteria)
      lines.push({ label: c.passed ? "Criterion met" : "Criterion not met", value: c.text, unit: "" });
  }
  const wt = s.withinTolerance;
  lines.push(
    { label: "Pairs (checkpoints)", value: s.pairs, unit: "count" },
    { label: "Paired by plant id", value: s.pairedById, unit: "count" },
    { label: "Paired by position", value: s.pairedByPosition, unit: "count" },
    { label: "Planted records not surveyed", value: s.unmatchedPlanted, unit: "count" },
    { label: "Survey points with no record", value: s.unmatchedSurvey, unit: "count" },
    { label: "Survey points left ambiguous", value: s.ambiguousSurvey, unit: "count" },
    { label: "Mean east error", value: len(s.meanDE), unit: units },
    { label: "Mean north error", value: len(s.meanDN), unit: units },
    { label: "East RMSE", value: len(s.rmseE), unit: units },
    { label: "North RMSE", value: len(s.rmseN), unit: units },
    { label: "Horizontal RMSE", value: len(s.rmseR), unit: units },
    { label: "Median distance (CEP 50 %)", value: len(s.cep50), unit: units },
    { label: "95th percentile distance (R95)", value: len(s.r95), unit: units },
    { label: "NSSDA horizontal accuracy at 95 % confidence", value: len(s.nssda95), unit: units },
    { label: "Cross-row RMSE", value: len(s.rmseCross), unit: units },
    { label: "Along-row RMSE", value: len(s.rmseAlong), unit: units },
    { label: "Row bearing", value: s.rowBearingDeg, unit: "°" },
  );
  if (wt) {
    lines.push(
      { label: "Plants within every limit", value: wt.within, unit: "count" },
      { label: "Share within every limit", value: pct(wt.share), unit: "%" },
      { label: `Share within, lower bound at ${pct(wt.confidence)} % confidence`, value: pct(wt.lower95), unit: "%" },
      { label: `Share within, upper bound at ${pct(wt.confidence)} % confidence`, value: pct(wt.upper95), unit: "%" },
    );
  }
  lines.push({ label: "Outliers flagged", value: s.outliers.count, unit: "count" });
  if (s.withoutOutliers)
    lines.push({ label: "Horizontal RMSE without outliers", value: len(s.withoutOutliers.rmseR), unit: units });
  if (input.signoff) {
    lines.push(
      { label: "Signed off by", value: input.signoff.signerName, unit: "" },
      { label: "Signed off at (UTC)", value: input.signoff.signedAt, unit: "" },
      { label: "Sign-off hash (SHA-256)", value: input.signoff.sha256, unit: "" },
    );
  }
  return lines;
}

/**
 * The summary spreadsheet: a header "label,value,unit" and one line per {@link summaryLines} entry; lengths in
 * millimetres to 0.1 mm or metres to 0.0001 m, percentages to 0.01 %, other numbers to 6 places; CRLF line ends.
 *
 * @example summarySheet(input, { units: "m", sep: "comma" }).split("\r\n")[0] // "label,value,unit"
 */
export function summarySheet(input: SummarySheetInput, format: SheetFormat): string {
  const d = delimiter(format.sep);
  const lengths = sheetNumber(format.sep, format.units === "mm" ? 1 : 4);
  const percent = sheetNumber(format.sep, 2);
  const other = sheetNumber(format.sep, 6);
  const out = [["label", "value", "unit"].join(d)];
  for (const l of summaryLines(input, format.units)) {
    const value =
      typeof l.value === "number"
        ? (l.unit === format.units ? lengths : l.unit === "%" ? percent : other)(l.value)
        : l.value === null
          ? ""
          : sheetText(l.value, format.sep);
    out.push([sheetText(l.label, format.sep), value, sheetText(l.unit, format.sep)].join(d));
  }
  return `${out.join("\r\n")}\r\n`;
}
