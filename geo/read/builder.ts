import type { AttributeName, CodedColumn, FileRole, PointTable } from "../types";

/** A Float64Array that grows by doubling. */
export class GrowF64 {
  a: Float64Array;
  n = 0;
  constructor(capacity = 1024) {
    this.a = new Float64Array(capacity);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Float64Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  /** Exact-length copy. */
  done(): Float64Array {
    return this.a.slice(0, this.n);
  }
}

/** An Int32Array that grows by doubling. */
export class GrowI32 {
  a: Int32Array;
  n = 0;
  constructor(capacity = 1024) {
    this.a = new Int32Array(capacity);
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Int32Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): Int32Array {
    return this.a.slice(0, this.n);
  }
}

/**
 * Builds a dictionary-coded text column. Consecutive equal values (common: a bed or row is planted
 * in one go) skip the dictionary look-up.
 */
export class CodedBuilder {
  readonly codes = new GrowI32();
  readonly values: string[] = [];
  private readonly dict = new Map<string, number>();
  private last = "\u0000";
  private lastCode = -1;

  push(raw: string): void {
    if (raw === this.last) {
      this.codes.push(this.lastCode);
      return;
    }
    const v = raw.trim();
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
    this.codes.push(code);
  }

  /** Pushes the text `text[s, e)`; no substring is made when it equals the previous cell. */
  pushSpan(text: string, s: number, e: number): void {
    const last = this.last;
    if (e - s === last.length && text.startsWith(last, s)) {
      this.codes.push(this.lastCode);
      return;
    }
    this.push(text.substring(s, e));
  }

  /** Pushes an already normalised value (no caching on the raw text). */
  pushValue(v: string): void {
    this.last = "\u0000";
    let code = -1;
    if (v !== "") {
      const hit = this.dict.get(v);
      if (hit === undefined) {
        code = this.values.length;
        this.values.push(v);
        this.dict.set(v, code);
      } else code = hit;
    }
    this.codes.push(code);
  }

  done(): CodedColumn {
    return { codes: this.codes.done(), values: this.values.slice() };
  }
}

/** Which optional columns a builder should collect. */
export interface BuilderShape {
  id: boolean;
  attrs: readonly AttributeName[];
  time: boolean;
  hdop: boolean;
  precision: boolean;
  raw: boolean;
}

/** Column-wise accumulator for one file; `finish` returns a PointTable of exact length. */
export class TableBuilder {
  readonly x = new GrowF64();
  readonly y = new GrowF64();
  readonly line = new GrowI32();
  readonly id: string[] | null;
  readonly attrs: Partial<Record<AttributeName, CodedBuilder>> = {};
  readonly time: GrowF64 | null;
  readonly hdop: GrowF64 | null;
  readonly precision: GrowF64 | null;
  readonly rawX: GrowF64 | null;
  readonly rawY: GrowF64 | null;

  constructor(readonly shape: BuilderShape) {
    this.id = shape.id ? [] : null;
    for (const a of shape.attrs) this.attrs[a] = new CodedBuilder();
    this.time = shape.time ? new GrowF64() : null;
    this.hdop = shape.hdop ? new GrowF64() : null;
    this.precision = shape.precision ? new GrowF64() : null;
    this.rawX = shape.raw ? new GrowF64() : null;
    this.rawY = shape.raw ? new GrowF64() : null;
  }

  get length(): number {
    return this.x.n;
  }

  finish(source: string, role: FileRole): PointTable {
    const attrs: PointTable["attrs"] = {};
    for (const [k, b] of Object.entries(this.attrs) as [AttributeName, CodedBuilder][]) attrs[k] = b.done();
    return {
      source,
      role,
      length: this.x.n,
      x: this.x.done(),
      y: this.y.done(),
      line: this.line.done(),
      id: this.id,
      attrs,
      time: this.time ? this.time.done() : null,
      hdop: this.hdop ? this.hdop.done() : null,
      precision: this.precision ? this.precision.done() : null,
      rawX: this.rawX ? this.rawX.done() : null,
      rawY: this.rawY ? this.rawY.done() : null,
    };
  }
}
