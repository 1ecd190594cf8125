import { IdColumnBuilder } from "../ids";
import { viewWithRoom } from "../spare";
import type { AttributeName, CodedColumn, FileRole, PointTable } from "../types";

/**
 * Dictionary of one coded text column. Consecutive equal raw cells (a bed or row is planted in one
 * go) skip the look-up; `codeOfSpan` compares the raw text in place, so no string is made for them.
 */
export class Dictionary {
  readonly values: string[] = [];
  private readonly dict = new Map<string, number>();
  private last = "\u0000";
  private lastCode = -1;

  /** @param normalise turns a raw cell into the stored value (default: trim). */
  constructor(private readonly normalise: (raw: string) => string = (s) => s.trim()) {}

  /** Code of a raw cell (-1 for blank). */
  code(raw: string): number {
    if (raw === this.last) return this.lastCode;
    const v = this.normalise(raw);
    let code = -1;
    if (v !== "") {
      const hit = this.dict.get(v);
      if (hit === undefined) {
        code = this.values.length;
        this.values.push(v);
        this.dict.set(v, code);
      } else code = hit;
    }
    this.last = raw;
    this.lastCode = code;
    return code;
  }

  /** Code of the raw cell `text[s, e)`. */
  codeOfSpan(text: string, s: number, e: number): number {
    const last = this.last;
    const n = e - s;
    if (n === last.length) {
      // A character loop: short cells, and the optimiser inlines it where startsWith is a call.
      let k = 0;
      while (k < n && text.charCodeAt(s + k) === last.charCodeAt(k)) k++;
      if (k === n) return this.lastCode;
    }
    return this.code(text.substring(s, e));
  }
}

/** Which optional columns a store should hold. */
export interface StoreShape {
  id: boolean;
  attrs: readonly AttributeName[];
  time: boolean;
  hdop: boolean;
  precision: boolean;
  raw: boolean;
  /** Per-attribute normalisers (e.g. fix quality); default trim. */
  normalise?: Partial<Record<AttributeName, (raw: string) => string>>;
}

/**
 * Column store for one file: typed arrays that grow together by doubling (one capacity check per
 * row). `finish` returns a PointTable of exact length.
 */
export class ColumnStore {
  n = 0;
  private cap = 4096;
  x = new Float64Array(this.cap);
  y = new Float64Array(this.cap);
  line = new Int32Array(this.cap);
  time: Float64Array | null;
  hdop: Float64Array | null;
  precision: Float64Array | null;
  rawX: Float64Array | null;
  rawY: Float64Array | null;
  /** One code array per attribute, in `shape.attrs` order. */
  codes: Int32Array[];
  readonly dicts: Dictionary[];
  readonly id: IdColumnBuilder | null;

  constructor(readonly shape: StoreShape) {
    const f = (on: boolean) => (on ? new Float64Array(this.cap) : null);
    this.time = f(shape.time);
    this.hdop = f(shape.hdop);
    this.precision = f(shape.precision);
    this.rawX = f(shape.raw);
    this.rawY = f(shape.raw);
    this.codes = shape.attrs.map(() => new Int32Array(this.cap));
    this.dicts = shape.attrs.map((a) => new Dictionary(shape.normalise?.[a]));
    this.id = shape.id ? new IdColumnBuilder() : null;
  }

  /** Makes room for one more row. */
  ensure(): void {
    if (this.n < this.cap) return;
    const cap = this.cap * 2;
    const gf = (a: Float64Array) => {
      const b = new Float64Array(cap);
      b.set(a);
      return b;
    };
    const gi = (a: Int32Array) => {
      const b = new Int32Array(cap);
      b.set(a);
      return b;
    };
    this.x = gf(this.x);
    this.y = gf(this.y);
    this.line = gi(this.line);
    if (this.time) this.time = gf(this.time);
    if (this.hdop) this.hdop = gf(this.hdop);
    if (this.precision) this.precision = gf(this.precision);
    if (this.rawX) this.rawX = gf(this.rawX);
    if (this.rawY) this.rawY = gf(this.rawY);
    this.codes = this.codes.map(gi);
    this.cap = cap;
  }

  finish(source: string, role: FileRole): PointTable {
    const n = this.n;
    // Views, not copies: a second part of the file can be appended into the spare room (geo/spare.ts).
    const cutF = (a: Float64Array) => viewWithRoom(a, n);
    const cutI = (a: Int32Array) => viewWithRoom(a, n);
    const attrs: PointTable["attrs"] = {};
    this.shape.attrs.forEach((a, k) => {
      const col: CodedColumn = { codes: cutI(this.codes[k]), values: this.dicts[k].values.slice() };
      attrs[a] = col;
    });
    const cut = (a: Float64Array | null) => (a ? cutF(a) : null);
    return {
      source,
      role,
      length: n,
      x: cutF(this.x),
      y: cutF(this.y),
      line: cutI(this.line),
      id: this.id ? this.id.finish() : null,
      attrs,
      time: cut(this.time),
      hdop: cut(this.hdop),
      precision: cut(this.precision),
      rawX: cut(this.rawX),
      rawY: cut(this.rawY),
    };
  }
}
