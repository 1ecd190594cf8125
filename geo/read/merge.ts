import { appendTo } from "../spare";
import type { CodedColumn, PointTable } from "../types";
import { IssueCollector } from "../validate/issues";
import type { ReadResult } from "./csv";
import { addTallies, tallyIssues } from "./sink";

const SUMMARY_CODES = new Set(["id-missing", "time-without-zone"]);

/**
 * Joins the results of reading two consecutive parts of one CSV file (the first with the header,
 * the second read as the header line followed by the rest), e.g. parsed on two threads.
 * The second part's lines are shifted by `lineOffset` (physical lines of the first part minus one,
 * the header line the second part repeats); its dictionary codes are remapped onto the first
 * part's; summary warnings are recomputed from both tallies; issues are capped again at `issueCap`.
 * Inputs are not changed.
 *
 * @example appendReadResults(first, second, first.linesRead! - 1).table!.length // rows of both parts
 */
export function appendReadResults(
  first: ReadResult,
  second: ReadResult,
  lineOffset: number,
  issueCap?: number,
): ReadResult {
  const file = first.table?.source ?? second.table?.source ?? first.issues[0]?.file ?? "";
  const issues = new IssueCollector(issueCap);
  for (const i of first.issues) if (!SUMMARY_CODES.has(i.code)) issues.add(i);
  for (const i of second.issues) {
    if (SUMMARY_CODES.has(i.code)) continue;
    // Per-file problems (no line) that both parts report once are kept once.
    if (i.line === undefined && first.issues.some((f) => f.code === i.code && f.line === undefined)) continue;
    issues.add(i.line === undefined || i.line <= 1 ? i : { ...i, line: i.line + lineOffset });
  }
  const tally =
    first.tally && second.tally ? addTallies(first.tally, second.tally, lineOffset) : (first.tally ?? second.tally);
  if (tally) issues.addAll(tallyIssues(tally, file));
  const list = issues.finish();
  const a = first.table,
    b = second.table;
  const table = a && b && !list.some((i) => i.severity === "error") ? concatTables(a, b, lineOffset) : null;
  return {
    table,
    issues: list,
    columns: first.columns,
    tally,
    recordedMissing: [
      ...(first.recordedMissing ?? []),
      ...(second.recordedMissing ?? []).map((r) => ({ ...r, line: r.line + lineOffset })),
    ],
    linesRead: (first.linesRead ?? 0) + Math.max(0, (second.linesRead ?? 0) - 1),
    sawQuote: !!(first.sawQuote || second.sawQuote),
  };
}

function cat(a: Float64Array | null, b: Float64Array | null): Float64Array | null {
  if (!a || !b) return null;
  const out = appendTo(a, b.length);
  out.set(b, a.length);
  return out;
}

function catCoded(a: CodedColumn, b: CodedColumn): CodedColumn {
  const values = a.values.slice();
  const index = new Map(values.map((v, i) => [v, i]));
  const remap = b.values.map((v) => {
    let k = index.get(v);
    if (k === undefined) {
      k = values.length;
      values.push(v);
      index.set(v, k);
    }
    return k;
  });
  const codes = appendTo(a.codes, b.codes.length);
  for (let i = 0; i < b.codes.length; i++) codes[a.codes.length + i] = b.codes[i] < 0 ? -1 : remap[b.codes[i]];
  return { codes, values };
}

/** Second table appended to the first (same columns), its lines shifted by `lineOffset`. */
function concatTables(a: PointTable, b: PointTable, lineOffset: number): PointTable {
  const line = appendTo(a.line, b.length);
  for (let i = 0; i < b.length; i++) line[a.length + i] = b.line[i] + lineOffset;
  const attrs: PointTable["attrs"] = {};
  for (const k of Object.keys(a.attrs) as (keyof PointTable["attrs"])[]) {
    const ca = a.attrs[k],
      cb = b.attrs[k];
    if (ca && cb) attrs[k] = catCoded(ca, cb);
  }
  return {
    source: a.source,
    role: a.role,
    length: a.length + b.length,
    x: cat(a.x, b.x)!,
    y: cat(a.y, b.y)!,
    line,
    id: a.id && b.id ? a.id.concat(b.id) : null,
    attrs,
    time: cat(a.time, b.time),
    hdop: cat(a.hdop, b.hdop),
    precision: cat(a.precision, b.precision),
    rawX: cat(a.rawX, b.rawX),
    rawY: cat(a.rawY, b.rawY),
  };
}
