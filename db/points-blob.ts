/**
 * Columnar storage of a dataset's parsed points: one bytea per dataset instead of one row per plant,
 * so a million-plant file is saved and loaded in one step and reaches the map as typed arrays.
 *
 * Layout (little-endian): "PPT2" | u32 header length | header JSON (UTF-8) | zero padding to 8 bytes |
 * the typed arrays named in header.arrays, each 8-byte aligned. Plant ids are two of those arrays
 * ("id.codes", u8 or u16 code units, and "id.offsets"). "PPT1" blobs, written before, kept the ids
 * as a JSON array in the header (slow to write and parse for a million ids); they are still read.
 */
import type { AttributeName, CodedColumn, PointTable } from "@/geo/types";
import { IdColumn } from "@/geo/ids";

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

const pad8 = (n: number) => (n + 7) & ~7;
const typeOf = (d: Data): ArrayType =>
  d instanceof Float64Array ? "f64" : d instanceof Int32Array ? "i32" : d instanceof Uint16Array ? "u16" : "u8";
const SIZE: Record<ArrayType, number> = { f64: 8, i32: 4, u16: 2, u8: 1 };

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
  let offset = 0;
  const layout = arrays.map((a) => {
    const entry = { name: a.name, type: typeOf(a.data), offset, count: a.data.length };
    offset = pad8(offset + a.data.byteLength);
    return entry;
  });
  const header: Header = { source: table.source, role: table.role, length: table.length, attrValues, arrays: layout };
  const headerBytes = new TextEncoder().encode(JSON.stringify(header));
  const start = pad8(8 + headerBytes.length);
  const out = new Uint8Array(start + offset);
  out.set(new TextEncoder().encode(MAGIC), 0);
  new DataView(out.buffer).setUint32(4, headerBytes.length, true);
  out.set(headerBytes, 8);
  arrays.forEach((a, i) =>
    out.set(new Uint8Array(a.data.buffer, a.data.byteOffset, a.data.byteLength), start + layout[i].offset),
  );
  return out;
}

export function decodePoints(bytes: Uint8Array): PointTable {
  const magic = new TextDecoder().decode(bytes.subarray(0, 4));
  if (magic !== MAGIC && magic !== MAGIC_V1) throw new Error("points blob: unknown format");
  const headerLength = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(4, true);
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength))) as Header;
  const start = pad8(8 + headerLength);
  // Copy into fresh, aligned buffers: the driver's Uint8Array may start at any offset.
  const read = (entry: Header["arrays"][number]): Data => {
    const byteLength = (entry.count ?? header.length) * SIZE[entry.type];
    const copy = bytes.slice(start + entry.offset, start + entry.offset + byteLength).buffer;
    return entry.type === "f64"
      ? new Float64Array(copy)
      : entry.type === "i32"
        ? new Int32Array(copy)
        : entry.type === "u16"
          ? new Uint16Array(copy)
          : new Uint8Array(copy);
  };
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
