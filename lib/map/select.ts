/**
 * What the map draws for a set of filters: index lists of the pairs and unpaired points that pass, the error value
 * each pair is coloured by, and the typed arrays handed to deck.gl layers (binary attributes, no objects per plant).
 */
import { fillColours } from "./colour-scale";
import { NO_CODE, PAIR_FLAG, UNPAIRED_KINDS, type DictName, type MapArrays, type UnpairedKind } from "./types";

/** Error a plant is coloured by. Cross and along are magnitudes (distance from the row line / intended spot). */
export type ErrorMetric = "radial" | "cross" | "along";

/** A filter per text column: a code of header.dict, or null for all. */
export interface MapFilter {
  codes: Partial<Record<DictName, number | null>>;
  /** Only pairs out of tolerance. */
  onlyOut: boolean;
}

export const NO_FILTER: MapFilter = { codes: {}, onlyOut: false };

/** True when a pair is out of tolerance (a verdict is known and it is not within). */
export function isOut(flags: number): boolean {
  return (flags & PAIR_FLAG.WITHIN_KNOWN) !== 0 && (flags & PAIR_FLAG.WITHIN) === 0;
}

/**
 * Indices of the pairs passing `filter`, ascending.
 * @example selectPairs(arrays, { codes: { bed: 2 }, onlyOut: true }) // Uint32Array of pair seqs in bed dict[2] out of tolerance
 */
export function selectPairs(a: MapArrays, filter: MapFilter): Uint32Array {
  const n = a.pairFlags.length;
  const active = (Object.entries(filter.codes) as [DictName, number | null | undefined][])
    .filter((e): e is [DictName, number] => e[1] !== null && e[1] !== undefined)
    .map(([name, code]) => [a.pairCodes[name], code] as const);
  const out = new Uint32Array(n);
  let m = 0;
  outer: for (let i = 0; i < n; i++) {
    if (filter.onlyOut && !isOut(a.pairFlags[i])) continue;
    for (const [col, code] of active) if (col[i] !== code) continue outer;
    out[m++] = i;
  }
  return out.slice(0, m);
}

/**
 * Indices of the unpaired points passing `filter`. Unpaired points carry crop, bed and row only: a filter on arm,
 * fix or planting day — or "only out of tolerance", which needs a pair — leaves none of them.
 */
export function selectUnpaired(a: MapArrays, filter: MapFilter): Uint32Array {
  const c = filter.codes;
  const m = a.unpairedKind.length;
  if (filter.onlyOut || [c.arm, c.fix, c.day].some((v) => v !== null && v !== undefined)) return new Uint32Array(0);
  const active = (["crop", "bed", "row"] as const)
    .filter((name) => c[name] !== null && c[name] !== undefined)
    .map((name) => [a.unpairedCodes[name], c[name] as number] as const);
  const out = new Uint32Array(m);
  let k = 0;
  outer: for (let i = 0; i < m; i++) {
    for (const [col, code] of active) if (col[i] !== code) continue outer;
    out[k++] = i;
  }
  return out.slice(0, k);
}

/**
 * Per-pair error value, metres: radial = √(dE² + dN²), cross = |cross|, along = |along| (NaN where unknown).
 * @example metricValues(arrays, "radial")[i] === Math.hypot(arrays.pairD[2 * i], arrays.pairD[2 * i + 1])
 */
export function metricValues(a: MapArrays, metric: ErrorMetric): Float32Array {
  const n = a.pairFlags.length;
  const out = new Float32Array(n);
  if (metric === "radial") for (let i = 0; i < n; i++) out[i] = Math.hypot(a.pairD[2 * i], a.pairD[2 * i + 1]);
  else {
    const src = metric === "cross" ? a.pairCross : a.pairAlong;
    for (let i = 0; i < n; i++) out[i] = Math.abs(src[i]);
  }
  return out;
}

/** Binary data for one deck.gl layer: `length` items and their attributes; `index[k]` is the pair/unpaired seq of item k. */
export interface PointBuffer {
  length: number;
  index: Uint32Array;
  positions: Float32Array;
  colours?: Uint8Array;
}

function gatherXY(xy: Float32Array, index: Uint32Array): Float32Array {
  const out = new Float32Array(index.length * 2);
  for (let k = 0; k < index.length; k++) {
    out[2 * k] = xy[2 * index[k]];
    out[2 * k + 1] = xy[2 * index[k] + 1];
  }
  return out;
}

/**
 * The selected pairs split into within-or-unknown and out-of-tolerance (drawn on top, outlined), each with positions
 * and viridis colours of `values` over `domain`.
 */
export function pairBuffers(
  a: MapArrays,
  selected: Uint32Array,
  values: Float32Array,
  domain: readonly [number, number],
): { rest: PointBuffer; out: PointBuffer } {
  let nOut = 0;
  for (let k = 0; k < selected.length; k++) if (isOut(a.pairFlags[selected[k]])) nOut++;
  const outIdx = new Uint32Array(nOut),
    restIdx = new Uint32Array(selected.length - nOut);
  let o = 0,
    r = 0;
  for (let k = 0; k < selected.length; k++) {
    const i = selected[k];
    if (isOut(a.pairFlags[i])) outIdx[o++] = i;
    else restIdx[r++] = i;
  }
  const make = (index: Uint32Array): PointBuffer => ({
    length: index.length,
    index,
    positions: gatherXY(a.pairXY, index),
    colours: fillColours(values, domain, index),
  });
  return { rest: make(restIdx), out: make(outIdx) };
}

/**
 * Error vectors from each selected planted position towards its surveyed position, lengthened `exaggeration` times:
 * target = planted + exaggeration · (dE, dN).
 */
export function vectorBuffers(
  a: MapArrays,
  selected: Uint32Array,
  exaggeration: number,
): { length: number; index: Uint32Array; source: Float32Array; target: Float32Array } {
  const source = gatherXY(a.pairXY, selected);
  const target = new Float32Array(source.length);
  for (let k = 0; k < selected.length; k++) {
    const i = selected[k];
    target[2 * k] = source[2 * k] + exaggeration * a.pairD[2 * i];
    target[2 * k + 1] = source[2 * k + 1] + exaggeration * a.pairD[2 * i + 1];
  }
  return { length: selected.length, index: selected, source, target };
}

/** The selected unpaired points, one buffer per kind. */
export function unpairedBuffers(a: MapArrays, selected: Uint32Array): Record<UnpairedKind, PointBuffer> {
  const counts = new Uint32Array(UNPAIRED_KINDS.length);
  for (let k = 0; k < selected.length; k++) counts[a.unpairedKind[selected[k]]]++;
  const idx = UNPAIRED_KINDS.map((_, j) => new Uint32Array(counts[j]));
  const fill = new Uint32Array(UNPAIRED_KINDS.length);
  for (let k = 0; k < selected.length; k++) {
    const i = selected[k],
      j = a.unpairedKind[i];
    idx[j][fill[j]++] = i;
  }
  return Object.fromEntries(
    UNPAIRED_KINDS.map((kind, j) => [
      kind,
      { length: idx[j].length, index: idx[j], positions: gatherXY(a.unpairedXY, idx[j]) },
    ]),
  ) as Record<UnpairedKind, PointBuffer>;
}

/** Text of a code column at i, "" when empty. */
export function codeText(dict: readonly string[], codes: Uint16Array, i: number): string {
  const c = codes[i];
  return c === NO_CODE ? "" : (dict[c] ?? "");
}
