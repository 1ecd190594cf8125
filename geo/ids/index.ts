/**
 * Plant ids of a table and a hash index over them (open addressing over Int32Array slots, FNV-1a
 * 32-bit hash), used to find duplicate ids and to pair by id.
 * FNV-1a: Fowler, Noll and Vo, "FNV hash" (IETF draft-eastlake-fnv), offset basis 2166136261, prime 16777619.
 */
import { appendTo, viewWithRoom } from "../spare";

/** FNV-1a 32-bit hash of a string's UTF-16 code units. @example fnv1a("a") // 3826002220 */
export function fnv1a(s: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/**
 * One plant id per row ("" = none), kept as code units with row offsets instead of one string per
 * row: a million ids are two typed arrays (transferable between threads, no work for the garbage
 * collector) and a string is made only when one is asked for. Code units are bytes while every id
 * is Latin-1 (machine exports), UTF-16 otherwise.
 * @example IdColumn.from(["P1", "", "P3"]).get(2) // "P3"
 */
export class IdColumn {
  /** @param codes code units of all ids, one after the other. @param offsets length + 1 entries: id i is codes[offsets[i], offsets[i+1]). */
  constructor(
    readonly codes: Uint8Array | Uint16Array,
    readonly offsets: Int32Array,
  ) {}

  get length(): number {
    return this.offsets.length - 1;
  }

  /** The id of row i ("" when none). */
  get(i: number): string {
    const a = this.offsets[i],
      b = this.offsets[i + 1];
    if (a === b) return "";
    let s = "";
    for (let k = a; k < b; k += 4096)
      s += String.fromCharCode.apply(null, this.codes.subarray(k, Math.min(b, k + 4096)) as unknown as number[]);
    return s;
  }

  /** True when row i has no id. */
  isEmpty(i: number): boolean {
    return this.offsets[i] === this.offsets[i + 1];
  }

  /** FNV-1a hash of id i (equal to `fnv1a(get(i))`). */
  hash(i: number): number {
    const c = this.codes;
    let h = 0x811c9dc5;
    for (let k = this.offsets[i], e = this.offsets[i + 1]; k < e; k++) {
      h ^= c[k];
      h = Math.imul(h, 0x01000193);
    }
    return h >>> 0;
  }

  /**
   * Compares id i with id j of `other` as JavaScript compares strings (code unit by code unit):
   * negative, 0 or positive.
   */
  compare(i: number, other: IdColumn, j: number): number {
    const a = this.codes,
      b = other.codes;
    let p = this.offsets[i],
      q = other.offsets[j];
    const pe = this.offsets[i + 1],
      qe = other.offsets[j + 1];
    for (; p < pe && q < qe; p++, q++) if (a[p] !== b[q]) return a[p] - b[q];
    return pe - p - (qe - q);
  }

  /** Every id as a string (for small tables, tests and storage). */
  toArray(): string[] {
    const out = new Array<string>(this.length);
    for (let i = 0; i < out.length; i++) out[i] = this.get(i);
    return out;
  }

  /** @example IdColumn.from(["a", "bc"]).offsets // Int32Array [0, 1, 3] */
  static from(ids: readonly string[]): IdColumn {
    const b = new IdColumnBuilder();
    for (const id of ids) b.add(id, 0, id.length);
    return b.finish();
  }

  /** This column followed by `other` (in this column's spare room when it has some, see geo/spare.ts). */
  concat(other: IdColumn): IdColumn {
    const used = this.offsets[this.length],
      extra = other.offsets[other.length];
    let codes: Uint8Array | Uint16Array;
    if (this.codes instanceof Uint8Array && other.codes instanceof Uint8Array)
      codes = appendTo(this.codes.subarray(0, used), extra);
    else {
      codes = new Uint16Array(used + extra);
      codes.set(this.codes.subarray(0, used));
    }
    codes.set(other.codes.subarray(0, extra), used);
    const offsets = appendTo(this.offsets, other.length);
    for (let j = 1; j < other.offsets.length; j++) offsets[this.length + j] = used + other.offsets[j];
    return new IdColumn(codes, offsets);
  }

  /** An IdColumn again after a structured clone (e.g. a message from a worker thread), which keeps only the fields. */
  static revive(v: { codes: Uint8Array | Uint16Array; offsets: Int32Array } | null | undefined): IdColumn | null {
    return v ? (v instanceof IdColumn ? v : new IdColumn(v.codes, v.offsets)) : null;
  }
}

/** Builds an IdColumn row by row; arrays grow by doubling. */
export class IdColumnBuilder {
  private codes: Uint8Array | Uint16Array = new Uint8Array(1 << 16);
  private offsets = new Int32Array(4096);
  private n = 0;
  private used = 0;

  /** Adds the id `text[s, e)` ("" when s === e). */
  add(text: string, s: number, e: number): void {
    const len = e - s;
    if (this.used + len > this.codes.length) this.grow(this.used + len, false);
    if (this.n + 2 > this.offsets.length) {
      const o = new Int32Array(this.offsets.length * 2);
      o.set(this.offsets);
      this.offsets = o;
    }
    let c = this.codes;
    let u = this.used;
    for (let k = s; k < e; k++) {
      const code = text.charCodeAt(k);
      if (code > 255 && c instanceof Uint8Array) {
        this.used = u;
        this.grow(this.used + (e - k), true);
        c = this.codes;
      }
      c[u++] = code;
    }
    this.used = u;
    this.offsets[++this.n] = u;
  }

  /** Room for `need` code units; `wide` switches to UTF-16 code units. */
  private grow(need: number, wide: boolean): void {
    let cap = this.codes.length;
    while (cap < need) cap *= 2;
    const c = wide || this.codes instanceof Uint16Array ? new Uint16Array(cap) : new Uint8Array(cap);
    c.set(this.codes.subarray(0, this.used));
    this.codes = c;
  }

  get length(): number {
    return this.n;
  }

  /** The column, as views of the builder's arrays (their spare room is recorded in geo/spare.ts). */
  finish(): IdColumn {
    return new IdColumn(viewWithRoom(this.codes, this.used), viewWithRoom(this.offsets, this.n + 1));
  }
}

type Ids = IdColumn | readonly string[];
const asColumn = (ids: Ids): IdColumn => (ids instanceof IdColumn ? ids : IdColumn.from(ids as readonly string[]));

/** Index of non-empty ids: first row of each id, plus the rows of repeated ids. */
export interface IdIndex {
  /** First row holding `id`, or -1. */
  lookup(id: string): number;
  /** First row holding the id of row `j` of `other` (another table's ids), or -1; makes no string. */
  lookupFrom(other: IdColumn, j: number): number;
  /** Number of distinct non-empty ids. */
  size: number;
  /** For each id that occurs more than once: all its rows in order. Null when ids are unique. */
  duplicates: Map<string, number[]> | null;
}

/**
 * Builds the index in O(n) expected time. Empty ids ("") are skipped.
 * @example indexIds(["a", "b", "a", ""]).duplicates // Map { "a" => [0, 2] }
 */
export function indexIds(input: Ids): IdIndex {
  const ids = asColumn(input);
  const n = ids.length;
  let cap = 16;
  while (cap < n * 2) cap *= 2;
  const mask = cap - 1;
  const slots = new Int32Array(cap).fill(-1);
  let size = 0;
  let duplicates: Map<string, number[]> | null = null;
  for (let i = 0; i < n; i++) {
    if (ids.isEmpty(i)) continue;
    let h = ids.hash(i) & mask;
    for (;;) {
      const j = slots[h];
      if (j < 0) {
        slots[h] = i;
        size++;
        break;
      }
      if (ids.compare(j, ids, i) === 0) {
        const id = ids.get(i);
        duplicates ??= new Map();
        const rows = duplicates.get(id);
        if (rows) rows.push(i);
        else duplicates.set(id, [j, i]);
        break;
      }
      h = (h + 1) & mask;
    }
  }
  const lookupFrom = (other: IdColumn, k: number): number => {
    if (other.isEmpty(k)) return -1;
    let h = other.hash(k) & mask;
    for (;;) {
      const j = slots[h];
      if (j < 0) return -1;
      if (ids.compare(j, other, k) === 0) return j;
      h = (h + 1) & mask;
    }
  };
  return {
    size,
    duplicates,
    lookup: (id: string) => (id === "" ? -1 : lookupFrom(IdColumn.from([id]), 0)),
    lookupFrom,
  };
}

/**
 * Repeated non-empty ids with all their rows, or null when every id is unique. Ids that are strictly
 * increasing in file order (common for machine exports) are unique without hashing; otherwise
 * `indexIds` is used.
 * @example findDuplicateIds(["a", "b", "a"]) // Map { "a" => [0, 2] }
 */
export function findDuplicateIds(input: Ids): Map<string, number[]> | null {
  const ids = asColumn(input);
  let prev = -1;
  let sorted = true;
  for (let i = 0; i < ids.length; i++) {
    if (ids.isEmpty(i)) continue;
    if (prev >= 0 && !(ids.compare(i, ids, prev) > 0)) {
      sorted = false;
      break;
    }
    prev = i;
  }
  return sorted ? null : indexIds(ids).duplicates;
}
