/**
 * Turns an audit's stored pairs and unpaired points (as columns) into the map payload's arrays:
 * dictionary codes for text columns, interleaved Float32 coordinates relative to a local origin.
 * Pure: the database query (db/queries/map.ts) supplies the columns.
 */
import { DICT_NAMES, NO_CODE, PAIR_FLAG, UNPAIRED_KINDS, type DictName, type MapArrays } from "./types";

/** Pairs as columns. Coordinates are already relative to the origin (see {@link chooseOrigin}). */
export interface PairColumns {
  count: number;
  /** Planted position minus origin, metres. */
  x: Float32Array;
  y: Float32Array;
  dE: Float32Array;
  dN: Float32Array;
  /** NaN where unknown. */
  along: Float32Array;
  cross: Float32Array;
  /** Bit set of PAIR_FLAG. */
  flags: Uint8Array;
  plantId: string[];
  text: Record<DictName, string[]>;
}

export interface UnpairedColumns {
  count: number;
  x: Float32Array;
  y: Float32Array;
  kind: string[];
  text: Record<"crop" | "bed" | "row", string[]>;
}

const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });

/**
 * Sorted distinct non-empty values of several string columns, in natural order ("2" before "10").
 * @example naturalDictionary([["3", "10", ""], ["2"]]) // ["2", "3", "10"]
 */
export function naturalDictionary(columns: readonly (readonly string[])[]): string[] {
  const set = new Set<string>();
  for (const col of columns) for (const v of col) if (v !== "") set.add(v);
  return [...set].sort((a, b) => collator.compare(a, b) || (a < b ? -1 : a > b ? 1 : 0));
}

/** Codes of `values` in `dict` (NO_CODE for "" or a value not in it). Throws when the dictionary is too long for Uint16. */
export function encodeCodes(values: readonly string[], dict: readonly string[]): Uint16Array {
  if (dict.length >= NO_CODE)
    throw new Error(`map payload: ${dict.length} distinct values in one column; at most ${NO_CODE - 1} fit`);
  const index = new Map(dict.map((v, i) => [v, i]));
  const out = new Uint16Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = index.get(values[i]) ?? NO_CODE;
  return out;
}

function interleave(x: Float32Array, y: Float32Array): Float32Array {
  if (x.length !== y.length) throw new Error("map payload: x and y differ in length");
  const out = new Float32Array(x.length * 2);
  for (let i = 0; i < x.length; i++) {
    out[2 * i] = x[i];
    out[2 * i + 1] = y[i];
  }
  return out;
}

/**
 * The local origin for a field: the centre of the bounding box of everything drawn, rounded to whole metres
 * (so the origin itself is exact and short to print). Relative coordinates then stay within half the field's extent,
 * where Float32 steps are far below a millimetre (2⁻¹⁴ m ≈ 0.06 mm at 1 km; IEEE 754 binary32, 24-bit significand).
 *
 * @example chooseOrigin({ minE: 662400.2, maxE: 662460.8, minN: 5821300, maxN: 5821350 }) // [662431, 5821325]
 */
export function chooseOrigin(box: { minE: number; maxE: number; minN: number; maxN: number } | null): [number, number] {
  if (!box || ![box.minE, box.maxE, box.minN, box.maxN].every(Number.isFinite)) return [0, 0];
  return [Math.round((box.minE + box.maxE) / 2), Math.round((box.minN + box.maxN) / 2)];
}

/**
 * Flag byte of one pair from its stored booleans.
 * @example pairFlags({ within: false, outlier: true, pairedBy: "id", beyondMaxDistance: false }) // 1 | 4 = 5
 */
export function pairFlags(p: {
  within: boolean | null;
  outlier: boolean;
  pairedBy: string;
  beyondMaxDistance: boolean;
}): number {
  let f = 0;
  if (p.within !== null) f |= PAIR_FLAG.WITHIN_KNOWN;
  if (p.within === true) f |= PAIR_FLAG.WITHIN;
  if (p.outlier) f |= PAIR_FLAG.OUTLIER;
  if (p.pairedBy === "position") f |= PAIR_FLAG.BY_POSITION;
  if (p.beyondMaxDistance) f |= PAIR_FLAG.BEYOND_MAX;
  return f;
}

/**
 * Payload arrays and dictionaries from pair and unpaired columns. Pairs and unpaired points share the crop, bed and
 * row dictionaries, so one filter code selects both.
 */
export function buildMapArrays(
  pairs: PairColumns,
  unpaired: UnpairedColumns,
): { arrays: MapArrays; dict: Record<DictName, string[]> } {
  for (const [name, len] of [
    ["x", pairs.x.length],
    ["dE", pairs.dE.length],
    ["flags", pairs.flags.length],
    ["plantId", pairs.plantId.length],
  ] as const) {
    if (len !== pairs.count)
      throw new Error(`map payload: pair column ${name} has ${len} values for ${pairs.count} pairs`);
  }
  if (unpaired.x.length !== unpaired.count || unpaired.kind.length !== unpaired.count)
    throw new Error("map payload: unpaired columns differ in length");
  const shared = new Set<DictName>(["crop", "bed", "row"]);
  const dict = Object.fromEntries(
    DICT_NAMES.map((c) => [
      c,
      naturalDictionary(shared.has(c) ? [pairs.text[c], unpaired.text[c as "crop" | "bed" | "row"]] : [pairs.text[c]]),
    ]),
  ) as Record<DictName, string[]>;
  const kindCode = new Map<string, number>(UNPAIRED_KINDS.map((k, i) => [k, i]));
  const unpairedKind = new Uint8Array(unpaired.count);
  for (let i = 0; i < unpaired.count; i++) {
    const k = kindCode.get(unpaired.kind[i]);
    if (k === undefined) throw new Error(`map payload: unknown unpaired kind "${unpaired.kind[i]}"`);
    unpairedKind[i] = k;
  }
  const arrays: MapArrays = {
    pairXY: interleave(pairs.x, pairs.y),
    pairD: interleave(pairs.dE, pairs.dN),
    pairAlong: pairs.along,
    pairCross: pairs.cross,
    pairFlags: pairs.flags,
    pairCodes: Object.fromEntries(DICT_NAMES.map((c) => [c, encodeCodes(pairs.text[c], dict[c])])) as Record<
      DictName,
      Uint16Array
    >,
    pairIds: pairs.plantId,
    unpairedXY: interleave(unpaired.x, unpaired.y),
    unpairedKind,
    unpairedCodes: {
      crop: encodeCodes(unpaired.text.crop, dict.crop),
      bed: encodeCodes(unpaired.text.bed, dict.bed),
      row: encodeCodes(unpaired.text.row, dict.row),
    },
  };
  return { arrays, dict };
}
