import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { IdColumn } from "@/geo/ids";
import { describe, expect, it } from "vitest";
import { decodePoints, encodePoints } from "./points-blob";
import type { PointTable } from "@/geo/types";

describe("points blob", () => {
  it("points blob -- a table survives encode and decode unchanged", () => {
    const table: PointTable = {
      source: "long-acre-as-planted.csv",
      role: "planted",
      length: 3,
      x: new Float64Array([5.1, 5.2, 5.3]),
      y: new Float64Array([52.1, 52.2, 52.3]),
      line: new Int32Array([2, 3, 4]),
      id: IdColumn.from(["LA-1", "LA-2", ""]),
      attrs: { crop: { codes: new Int32Array([0, 0, -1]), values: ["lettuce"] } },
      time: new Float64Array([1, NaN, 3]),
      hdop: null,
      precision: null,
      rawX: new Float64Array([5.11, 5.21, 5.31]),
      rawY: new Float64Array([52.11, 52.21, 52.31]),
    };
    const back = decodePoints(encodePoints(table));
    expect(back).toEqual(table);
  });

  it("points blob -- decoding works from an unaligned view, as a database driver may return it", () => {
    const table: PointTable = {
      source: "s.csv",
      role: "survey",
      length: 1,
      x: new Float64Array([1]),
      y: new Float64Array([2]),
      line: new Int32Array([2]),
      id: null,
      attrs: {},
      time: null,
      hdop: null,
      precision: new Float64Array([0.002]),
      rawX: null,
      rawY: null,
    };
    const bytes = encodePoints(table);
    const shifted = new Uint8Array(bytes.length + 3);
    shifted.set(bytes, 3);
    expect(decodePoints(shifted.subarray(3))).toEqual(table);
  });

  it("points blob -- blobs of the first format (ids as JSON in the header) are still read", () => {
    // A PPT1 blob built by hand: header with ids, then x, y, line as f64, f64, i32.
    const header = JSON.stringify({
      source: "old.csv",
      role: "planted",
      length: 2,
      id: ["A-1", ""],
      attrValues: {},
      arrays: [
        { name: "x", type: "f64", offset: 0 },
        { name: "y", type: "f64", offset: 16 },
        { name: "line", type: "i32", offset: 32 },
      ],
    });
    const hb = new TextEncoder().encode(header);
    const start = (8 + hb.length + 7) & ~7;
    const out = new Uint8Array(start + 40);
    out.set(new TextEncoder().encode("PPT1"));
    new DataView(out.buffer).setUint32(4, hb.length, true);
    out.set(hb, 8);
    out.set(new Uint8Array(new Float64Array([1, 2]).buffer), start);
    out.set(new Uint8Array(new Float64Array([3, 4]).buffer), start + 16);
    out.set(new Uint8Array(new Int32Array([2, 3]).buffer), start + 32);
    const t = decodePoints(out);
    expect(t.id!.toArray()).toEqual(["A-1", ""]);
    expect(Array.from(t.x)).toEqual([1, 2]);
    expect(Array.from(t.line)).toEqual([2, 3]);
  });

  it("points blob -- ids beyond Latin-1 and reader views with spare room survive", () => {
    const ids = IdColumn.from(["植-1", "P2"]);
    const x = new Float64Array(8).subarray(0, 2);
    const table: PointTable = {
      source: "s.csv",
      role: "planted",
      length: 2,
      x,
      y: new Float64Array([2, 3]),
      line: new Int32Array([2, 3]),
      id: ids,
      attrs: {},
      time: null,
      hdop: null,
      precision: null,
      rawX: null,
      rawY: null,
    };
    const back = decodePoints(encodePoints(table));
    expect(back.id!.toArray()).toEqual(["植-1", "P2"]);
    expect(back.x.length).toBe(2);
  });

  it("decodePoints -- another format or a blob cut short is refused in the blob's own words", () => {
    const bytes = encodePoints(goldenTable());
    expect(() => decodePoints(new TextEncoder().encode("PPMD\0\0\0\0{}"))).toThrow("points blob: unknown format");
    expect(() => decodePoints(bytes.subarray(0, 40))).toThrow("points blob: truncated");
    expect(() => decodePoints(bytes.subarray(0, bytes.byteLength - 8))).toThrow("points blob: truncated");
  });

  it("encodePoints -- writes the bytes of the golden blob (blobs already saved must keep reading)", () => {
    // fixtures/points-ppt2.bin was written by the encoder as it stood before the shared framing
    // (lib/binary-frame.ts); REGEN=1 rewrites it, on purpose only, and the diff is reviewed.
    const golden = path.join(import.meta.dirname, "fixtures", "points-ppt2.bin");
    const table = goldenTable();
    const bytes = encodePoints(table);
    if (process.env.REGEN) writeFileSync(golden, bytes);
    expect(Buffer.from(bytes)).toEqual(readFileSync(golden));
    expect(decodePoints(new Uint8Array(readFileSync(golden)))).toEqual(table);
  });
});

/** Odd lengths and every optional array, so each kind of padding shows in the bytes. */
function goldenTable(): PointTable {
  return {
    source: "long-acre-as-planted.csv",
    role: "planted",
    length: 3,
    x: new Float64Array([662410.5712, 662411.9531, 662452.0004]),
    y: new Float64Array([5821331.3858, 5821334.71, 5821372.9999]),
    line: new Int32Array([2, 3, 5]),
    id: IdColumn.from(["植-1", "LA-2", ""]),
    attrs: {
      crop: { codes: new Int32Array([0, 1, -1]), values: ["lettuce", "leek"] },
      bed: { codes: new Int32Array([0, 0, 1]), values: ["1", "2"] },
    },
    time: new Float64Array([1776168000, NaN, 1776168002.5]),
    hdop: new Float64Array([0.7, 0.8, 0.9]),
    precision: new Float64Array([0.012, 0.011, 0.02]),
    rawX: new Float64Array([5.11, 5.21, 5.31]),
    rawY: new Float64Array([52.11, 52.21, 52.31]),
  };
}
