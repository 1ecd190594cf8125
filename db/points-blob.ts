/**
 * Columnar storage of a dataset's parsed points: one bytea per dataset instead of one row per plant,
 * so a million-plant file is saved and loaded in one step and reaches the map as typed arrays.
 *
 * Layout: the frame of lib/binary-frame.ts — "PPT2" | u32 header length | header JSON (UTF-8) | zero padding
 * to 8 bytes | the typed arrays named in header.arrays, each 8-byte aligned. Plant ids are two of those arrays
 * ("id.codes", u8 or u16 code units, and "id.offsets"). "PPT1" blobs, written before, kept the ids
 * as a JSON array in the header (slow to write and parse for a million ids); they are still read.
 */
import type { AttributeName, CodedColumn, PointTable } from "@/geo/types";
import { IdColumn } from "@/geo/ids";
import { FrameError, type FrameProblem, readFrame, writeFrame } from "@/lib/binary-frame";

const MAGIC = "PPT2";
const MAGIC_V1 = "PPT1";

type ArrayName =
  | "x"
  | "y"
  | "line"
  | "time"
  | "hdop"
  | "precision"
  | "rawX"
  | "rawY"
  | "id.codes"
  | "id.offsets"
  | `attr:${string}`;
type ArrayType = "f64" | "i32" | "u16" | "u8";
type Data = Float64Array | Int32Array | Uint16Array | Uint8Array;

interface Header {
  source: string;
  role: PointTable["role"];
  length: number;
  /** PPT1 only. */
  id?: string[] | null;
  attrValues: Record<string, string[]>;
  /** `count`: elements (PPT2); PPT1 arrays all had `length` elements. */
  arrays: { name: ArrayName; type: ArrayType; offset: number; count?: number }[];
}

const typeOf = (d: Data): ArrayType =>
  d instanceof Float64Array ? "f64" : d instanceof Int32Array ? "i32" : d instanceof Uint16Array ? "u16" : "u8";
const PROBLEM: Record<FrameProblem, string> = {
  magic: "unknown format",
  truncated: "truncated",
  header: "unreadable header",
};

/** Runs `read`, rewording a framing error as "points blob: …". */
function inPointsTerms<T>(read: () => T): T {
  try {
    return read();
  } catch (e) {
    throw e instanceof FrameError ? new Error(`points blob: ${PROBLEM[e.problem]}`) : e;
  }
}

export function encodePoints(table: PointTable): Uint8Array {
  const arrays: { name: ArrayName; data: Data }[] = [
    { name: "x", data: table.x },
    { name: "y", data: table.y },
    { name: "line", data: table.line },
  ];
  for (const key of ["time", "hdop", "precision", "rawX", "rawY"] as const) {
    const a = table[key];
    if (a) arrays.push({ name: key, data: a });
  }
  if (table.id) arrays.push({ name: "id.codes", data: table.id.codes }, { name: "id.offsets", data: table.id.offsets });
  const attrValues: Record<string, string[]> = {};
  for (const [name, col] of Object.entries(table.attrs) as [AttributeName, CodedColumn][]) {
    attrValues[name] = col.values;
    arrays.push({ name: `attr:${name}`, data: col.codes });
  }
  return writeFrame(
    MAGIC,
    arrays.map((a) => a.data),
    (parts): Header => ({
      source: table.source,
      role: table.role,
      length: table.length,
      attrValues,
      arrays: arrays.map((a, i) => ({
        name: a.name,
        type: typeOf(a.data),
        offset: parts[i].offset,
        count: a.data.length,
      })),
    }),
  );
}

export function decodePoints(bytes: Uint8Array): PointTable {
  const frame = inPointsTerms(() => readFrame(bytes, [MAGIC, MAGIC_V1]));
  const header = frame.header as unknown as Header;
  // Copies, never views: a table's arrays are moved to the audit worker buffer by buffer (geo/transfer.ts).
  const read = (entry: Header["arrays"][number]): Data =>
    inPointsTerms(() => frame.array(entry.type, entry.offset, entry.count ?? header.length, { copy: true }));
  const arrays = new Map(header.arrays.map((e) => [e.name, read(e)]));
  const f64 = (name: ArrayName) => (arrays.get(name) as Float64Array | undefined) ?? null;
  const attrs: Partial<Record<AttributeName, CodedColumn>> = {};
  for (const [name, values] of Object.entries(header.attrValues)) {
    attrs[name as AttributeName] = { values, codes: arrays.get(`attr:${name}`) as Int32Array };
  }
  const codes = arrays.get("id.codes") as Uint8Array | Uint16Array | undefined;
  const id = codes
    ? new IdColumn(codes, arrays.get("id.offsets") as Int32Array)
    : header.id
      ? IdColumn.from(header.id)
      : null;
  return {
    source: header.source,
    role: header.role,
    length: header.length,
    x: f64("x")!,
    y: f64("y")!,
    line: arrays.get("line") as Int32Array,
    id,
    attrs,
    time: f64("time"),
    hdop: f64("hdop"),
    precision: f64("precision"),
    rawX: f64("rawX"),
    rawY: f64("rawY"),
  };
}
