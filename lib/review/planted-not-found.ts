/**
 * The planted records of an audit that nobody surveyed ("planted-not-found"), in one value instead of a row each:
 * a bitset over the records of the planted dataset (bit i set: record i was left unpaired) and, only when the
 * audit's work CRS changed the positions, the projected easting and northing of each such record. Everything
 * else of those records (id, line, crop, bed, row, and the position when unchanged) is read from the dataset's
 * points blob (db/points-blob.ts). The k-th set bit is the unpaired point with seq k.
 *
 * Pure; the audit worker writes this form (lib/audit-job), the database readers rebuild rows from it (db/queries).
 *
 * Layout: the frame of lib/binary-frame.ts — "PNF1" | u32 header length | header JSON | the arrays named in
 * header.arrays ("set": u8, ceil(plants / 8) bytes, bit i in byte i >> 3 at bit i & 7; "e", "n": f64 × count).
 */
import type { PointTable, ProjectedTable } from "@/geo/types";
import { FrameError, type FrameProblem, readFrame, writeFrame } from "@/lib/binary-frame";
import type { UnpairedRecordRow } from "./record";

const MAGIC = "PNF1";

export interface PlantedNotFound {
  /** Records in the planted dataset. */
  plants: number;
  /** Indices of the unpaired records in the planted dataset, ascending (their seq is their position here). */
  indices: Int32Array;
  /** Projected positions, one per index; null when they are the dataset's own (the work CRS is the file's). */
  e: Float64Array | null;
  n: Float64Array | null;
}

interface Header {
  plants: number;
  count: number;
  arrays: { name: "set" | "e" | "n"; type: "u8" | "f64"; offset: number; count: number }[];
}

const PROBLEM: Record<FrameProblem, string> = {
  magic: "unknown format",
  truncated: "truncated",
  header: "unreadable header",
};

/**
 * Encode the unpaired planted records. Throws `planted-not-found blob: …` when the indices are not ascending,
 * lie outside 0…plants−1, or the positions do not have one value per index.
 *
 * @example encodePlantedNotFound({ plants: 10, indices: Int32Array.of(2, 7), e: null, n: null }).byteLength // 48
 */
export function encodePlantedNotFound(p: PlantedNotFound): Uint8Array {
  const set = new Uint8Array((p.plants + 7) >> 3);
  let last = -1;
  for (const i of p.indices) {
    if (i <= last || i >= p.plants)
      throw new Error(`planted-not-found blob: index ${i} is not ascending within 0…${p.plants - 1}`);
    set[i >> 3] |= 1 << (i & 7);
    last = i;
  }
  if ((p.e === null) !== (p.n === null)) throw new Error("planted-not-found blob: eastings without northings");
  if (p.e && (p.e.length !== p.indices.length || p.n!.length !== p.indices.length))
    throw new Error(`planted-not-found blob: ${p.e.length} positions for ${p.indices.length} records`);
  const arrays: { name: Header["arrays"][number]["name"]; data: Uint8Array | Float64Array }[] = [
    { name: "set", data: set },
  ];
  if (p.e && p.n) arrays.push({ name: "e", data: p.e }, { name: "n", data: p.n });
  return writeFrame(
    MAGIC,
    arrays.map((a) => a.data),
    (parts): Header => ({
      plants: p.plants,
      count: p.indices.length,
      arrays: arrays.map((a, k) => ({
        name: a.name,
        type: a.data instanceof Float64Array ? "f64" : "u8",
        offset: parts[k].offset,
        count: a.data.length,
      })),
    }),
  );
}

/**
 * Decode what {@link encodePlantedNotFound} wrote. Throws `planted-not-found blob: …` when the bytes are not such a
 * value or disagree with their own header.
 */
export function decodePlantedNotFound(bytes: Uint8Array): PlantedNotFound {
  try {
    const frame = readFrame(bytes, [MAGIC]);
    const h = frame.header as unknown as Header;
    const entry = (name: string) => h.arrays.find((a) => a.name === name);
    const s = entry("set");
    if (!s || s.count !== (h.plants + 7) >> 3) throw new Error("planted-not-found blob: no bitset of the records");
    const set = frame.array("u8", s.offset, s.count);
    const indices = new Int32Array(h.count);
    let k = 0;
    for (let b = 0; b < set.length; b++) {
      let v = set[b];
      while (v) {
        const bit = 31 - Math.clz32(v & -v);
        if (k === h.count) throw new Error(`planted-not-found blob: more than ${h.count} records set`);
        const i = (b << 3) + bit;
        if (i >= h.plants) throw new Error(`planted-not-found blob: record ${i} set of ${h.plants}`);
        indices[k++] = i;
        v &= v - 1;
      }
    }
    if (k !== h.count) throw new Error(`planted-not-found blob: ${k} records set, the header says ${h.count}`);
    const pos = (name: "e" | "n") => {
      const a = entry(name);
      return a ? frame.array("f64", a.offset, h.count, { copy: true }) : null;
    };
    const e = pos("e"),
      n = pos("n");
    if ((e === null) !== (n === null)) throw new Error("planted-not-found blob: eastings without northings");
    return { plants: h.plants, indices, e, n };
  } catch (err) {
    throw err instanceof FrameError ? new Error(`planted-not-found blob: ${PROBLEM[err.problem]}`) : err;
  }
}

export type AttrName = "crop" | "bed" | "row" | "arm" | "fix";

/** The value of an attribute column at record `i`; null when the table has no such column or the record none. */
export function attr(t: PointTable, name: AttrName, i: number): string | null {
  const col = t.attrs[name];
  if (!col) return null;
  const c = col.codes[i];
  return c >= 0 ? col.values[c] : null;
}

/** One stored unpaired row of record `i` of table `t`, at position `e`, `n` (work CRS, metres). */
export function unpairedRow(
  kind: string,
  t: PointTable,
  i: number,
  seq: number,
  e: number,
  n: number,
): UnpairedRecordRow {
  return {
    seq,
    kind,
    pointId: t.id?.get(i) || null,
    line: t.line[i],
    e,
    n,
    crop: attr(t, "crop", i),
    bed: attr(t, "bed", i),
    row: attr(t, "row", i),
  };
}

/**
 * The planted records nobody surveyed in compact form: their indices and, only when the projection changed any of
 * their positions, the projected positions (otherwise those of the table as read are theirs). `asRead` is the
 * planted table before projection, `projected` the one the pairing used.
 */
export function plantedNotFoundPart(
  unmatchedPlanted: Int32Array,
  asRead: PointTable,
  projected: ProjectedTable,
): { plants: number; indices: Int32Array; e: Float64Array | null; n: Float64Array | null } {
  const indices = Int32Array.from(unmatchedPlanted);
  let same = true;
  for (const i of indices)
    if (!Object.is(asRead.x[i], projected.x[i]) || !Object.is(asRead.y[i], projected.y[i])) {
      same = false;
      break;
    }
  if (same) return { plants: projected.length, indices, e: null, n: null };
  const e = new Float64Array(indices.length),
    n = new Float64Array(indices.length);
  for (let k = 0; k < indices.length; k++) {
    e[k] = projected.x[indices[k]];
    n[k] = projected.y[indices[k]];
  }
  return { plants: projected.length, indices, e, n };
}

/**
 * The rows `from`…`to`−1 (seq numbers) of the planted records nobody surveyed, rebuilt from their compact form
 * and the planted table as read: exactly the rows unpairedRecordRows (lib/review/result-rows.ts) gives them.
 */
export function plantedNotFoundRows(
  part: { indices: Int32Array; e: Float64Array | null; n: Float64Array | null },
  planted: PointTable,
  from = 0,
  to = part.indices.length,
): UnpairedRecordRow[] {
  const rows: UnpairedRecordRow[] = [];
  const end = Math.min(to, part.indices.length);
  for (let k = Math.max(0, from); k < end; k++) {
    const i = part.indices[k];
    rows.push(
      unpairedRow(
        "planted-not-found",
        planted,
        i,
        k,
        part.e ? part.e[k] : planted.x[i],
        part.n ? part.n[k] : planted.y[i],
      ),
    );
  }
  return rows;
}
