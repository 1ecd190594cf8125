/**
 * The map payload: one binary response per audit that the browser hands to deck.gl as typed arrays
 * (no per-plant JSON objects). Served by GET /api/audits/:id/map-data as `application/octet-stream`.
 *
 * Byte layout (little-endian; the frame of lib/binary-frame.ts):
 *
 *   0      "PPMD"                         4 ASCII bytes
 *   4      u32 H                          byte length of the header
 *   8      header                         H bytes of UTF-8 JSON: MapMeta + { format: "plotproof-map", version: 1, arrays }
 *   8+H    zero padding                   up to the next multiple of 8 (= data start D)
 *   D+o    array bytes                    for each entry { name, type, size, count, offset: o, byteLength } of header.arrays;
 *                                         every o is a multiple of 8, so each array can be viewed in place
 *
 * Arrays (n = header.pairs, m = header.unpaired; f32 = Float32, u8/u16 = unsigned integers):
 *
 *   pair.xy          f32 × 2 × n   planted easting, northing minus header.origin, metres
 *   pair.d           f32 × 2 × n   survey minus planted: dE, dN, metres
 *   pair.along       f32 × n       along-row error, metres (NaN without a row bearing)
 *   pair.cross       f32 × n       cross-row error, metres, positive right of the row direction (NaN without a row bearing)
 *   pair.flags       u8 × n        bits: 1 tolerance known, 2 within tolerance, 4 outlier, 8 paired by position, 16 beyond max distance
 *   pair.code.<c>    u16 × n       for c in crop, bed, row, arm, fix, day: index into header.dict[c]; 65535 = empty
 *   pair.id          UTF-8         plant ids joined by "\n" ("" when a pair has none); n entries
 *   unpaired.xy      f32 × 2 × m   easting, northing minus header.origin, metres
 *   unpaired.kind    u8 × m        0 planted-not-found, 1 surveyed-not-planted, 2 ambiguous
 *   unpaired.code.<c> u16 × m      for c in crop, bed, row, as above
 *
 * Index i of the pair arrays is the pair's seq in the audit (and of the unpaired arrays, the unpaired seq),
 * which the detail query (?pair=i, ?unpaired=i) takes.
 */
import { type Frame, FrameError, type FrameProblem, readFrame, writeFrame } from "@/lib/binary-frame";
import { DICT_NAMES, type DictName, type MapArrays, type MapData, type MapMeta } from "./types";

const MAGIC = "PPMD";
export const MAP_FORMAT = "plotproof-map";
export const MAP_VERSION = 1;
export const MAP_CONTENT_TYPE = "application/octet-stream";

type ArrayType = "f32" | "u8" | "u16" | "utf8";

export interface ArrayEntry {
  name: string;
  type: ArrayType;
  /** Components per item (2 for x/y pairs). */
  size: number;
  /** Number of items. */
  count: number;
  /** Byte offset from the data start, a multiple of 8. */
  offset: number;
  byteLength: number;
}

interface Header extends MapMeta {
  format: typeof MAP_FORMAT;
  version: typeof MAP_VERSION;
  arrays: ArrayEntry[];
}

const BYTES: Record<Exclude<ArrayType, "utf8">, number> = { f32: 4, u8: 1, u16: 2 };
const UNPAIRED_DICTS = ["crop", "bed", "row"] as const;
const PROBLEM: Record<FrameProblem, string> = {
  magic: "not a Plotproof map payload",
  truncated: "truncated header",
  header: "unreadable header",
};

function isLittleEndian(): boolean {
  return new Uint8Array(Uint16Array.of(1).buffer)[0] === 1;
}

/**
 * Encodes map data into the payload described at the top of this file.
 * Plant ids containing a line break have it replaced by a space (the separator).
 *
 * @example const bytes = encodeMapPayload(meta, arrays); decodeMapPayload(bytes).meta.pairs === meta.pairs
 */
export function encodeMapPayload(meta: MapMeta, a: MapArrays): Uint8Array {
  if (!isLittleEndian()) throw new Error("map payload: big-endian platforms are not supported");
  const n = meta.pairs,
    m = meta.unpaired;
  const parts: { name: string; type: ArrayType; size: number; count: number; bytes: Uint8Array }[] = [];
  const view = (t: Float32Array | Uint8Array | Uint16Array) => new Uint8Array(t.buffer, t.byteOffset, t.byteLength);
  const add = (
    name: string,
    type: ArrayType,
    size: number,
    count: number,
    data: Float32Array | Uint8Array | Uint16Array,
  ) => {
    const expected = type === "utf8" ? data.byteLength : count * size * BYTES[type];
    if (data.byteLength !== expected)
      throw new Error(`map payload: ${name} has ${data.byteLength} bytes, expected ${expected}`);
    parts.push({ name, type, size, count, bytes: view(data) });
  };
  add("pair.xy", "f32", 2, n, a.pairXY);
  add("pair.d", "f32", 2, n, a.pairD);
  add("pair.along", "f32", 1, n, a.pairAlong);
  add("pair.cross", "f32", 1, n, a.pairCross);
  add("pair.flags", "u8", 1, n, a.pairFlags);
  for (const c of DICT_NAMES) add(`pair.code.${c}`, "u16", 1, n, a.pairCodes[c]);
  if (a.pairIds.length !== n) throw new Error(`map payload: ${a.pairIds.length} plant ids for ${n} pairs`);
  add("pair.id", "utf8", 1, n, new TextEncoder().encode(a.pairIds.map((s) => s.replace(/[\r\n]+/g, " ")).join("\n")));
  add("unpaired.xy", "f32", 2, m, a.unpairedXY);
  add("unpaired.kind", "u8", 1, m, a.unpairedKind);
  for (const c of UNPAIRED_DICTS) add(`unpaired.code.${c}`, "u16", 1, m, a.unpairedCodes[c]);

  return writeFrame(
    MAGIC,
    parts.map((p) => p.bytes),
    (layout): Header => ({
      ...meta,
      format: MAP_FORMAT,
      version: MAP_VERSION,
      arrays: parts.map((p, i) => ({
        name: p.name,
        type: p.type,
        size: p.size,
        count: p.count,
        offset: layout[i].offset,
        byteLength: p.bytes.byteLength,
      })),
    }),
  );
}

/**
 * Decodes a payload. The typed arrays are views into `input` (no copy) when it starts on an 8-byte boundary
 * (otherwise copies of the arrays whose position does not suit their element size).
 * Throws "map payload: …" for anything that is not a complete payload of this version.
 *
 * @example const { meta, arrays } = decodeMapPayload(await res.arrayBuffer());
 */
export function decodeMapPayload(input: ArrayBuffer | Uint8Array): MapData {
  if (!isLittleEndian()) throw new Error("map payload: big-endian platforms are not supported");
  let frame: Frame;
  try {
    frame = readFrame(input, [MAGIC]);
  } catch (e) {
    throw e instanceof FrameError ? new Error(`map payload: ${PROBLEM[e.problem]}`) : e;
  }
  const header = frame.header as unknown as Header;
  if (header.format !== MAP_FORMAT || header.version !== MAP_VERSION)
    throw new Error(`map payload: unsupported version ${String(header.version)}`);
  const entries = new Map(header.arrays.map((e) => [e.name, e]));
  const entry = (name: string, type: ArrayType, size: number, count: number) => {
    const e = entries.get(name);
    if (!e) throw new Error(`map payload: array ${name} is missing`);
    if (e.type !== type || e.size !== size || e.count !== count)
      throw new Error(`map payload: array ${name} has the wrong shape`);
    if (e.offset % 8 !== 0 || e.offset + e.byteLength > frame.dataLength)
      throw new Error(`map payload: array ${name} lies outside the payload (truncated?)`);
    if (type !== "utf8" && e.byteLength !== count * size * BYTES[type])
      throw new Error(`map payload: array ${name} has the wrong length`);
    return e.offset;
  };
  const n = header.pairs,
    m = header.unpaired;
  const f32 = (name: string, size: number, count: number) =>
    frame.array("f32", entry(name, "f32", size, count), size * count);
  const u8 = (name: string, count: number) => frame.array("u8", entry(name, "u8", 1, count), count);
  const u16 = (name: string, count: number) => frame.array("u16", entry(name, "u16", 1, count), count);
  const idAt = entry("pair.id", "utf8", 1, n);
  const idText = new TextDecoder().decode(frame.array("u8", idAt, entries.get("pair.id")!.byteLength));
  const pairIds = n === 0 ? [] : idText.split("\n");
  if (pairIds.length !== n) throw new Error(`map payload: ${pairIds.length} plant ids for ${n} pairs`);
  const pairCodes = Object.fromEntries(DICT_NAMES.map((c) => [c, u16(`pair.code.${c}`, n)])) as Record<
    DictName,
    Uint16Array
  >;
  const unpairedCodes = Object.fromEntries(
    UNPAIRED_DICTS.map((c) => [c, u16(`unpaired.code.${c}`, m)]),
  ) as MapArrays["unpairedCodes"];
  const { format: _f, version: _v, arrays: _a, ...meta } = header;
  return {
    meta,
    arrays: {
      pairXY: f32("pair.xy", 2, n),
      pairD: f32("pair.d", 2, n),
      pairAlong: f32("pair.along", 1, n),
      pairCross: f32("pair.cross", 1, n),
      pairFlags: u8("pair.flags", n),
      pairCodes,
      pairIds,
      unpairedXY: f32("unpaired.xy", 2, m),
      unpairedKind: u8("unpaired.kind", m),
      unpairedCodes,
    },
  };
}
