import { IdColumn } from "@/geo/ids";
import { describe, expect, it } from "vitest";
import { decodePoints, encodePoints } from "./points-blob";
import type { PointTable } from "@/geo/types";

describe("points blob", () => {
  it("points blob -- a table survives encode and decode unchanged", () => {
    const table: PointTable = {
      source: "long-acre-as-planted.csv", role: "planted", length: 3,
      x: new Float64Array([5.1, 5.2, 5.3]), y: new Float64Array([52.1, 52.2, 52.3]), line: new Int32Array([2, 3, 4]),
      id: IdColumn.from(["LA-1", "LA-2", ""]), attrs: { crop: { codes: new Int32Array([0, 0, -1]), values: ["lettuce"] } },
      time: new Float64Array([1, NaN, 3]), hdop: null, precision: null, rawX: new Float64Array([5.11, 5.21, 5.31]), rawY: new Float64Array([52.11, 52.21, 52.31]),
    };
    const back = decodePoints(encodePoints(table));
    expect(back).toEqual(table);
  });

  it("points blob -- decoding works from an unaligned view, as a database driver may return it", () => {
    const table: PointTable = {
      source: "s.csv", role: "survey", length: 1, x: new Float64Array([1]), y: new Float64Array([2]), line: new Int32Array([2]),
      id: null, attrs: {}, time: null, hdop: null, precision: new Float64Array([0.002]), rawX: null, rawY: null,
    };
    const bytes = encodePoints(table);
    const shifted = new Uint8Array(bytes.length + 3);
    shifted.set(bytes, 3);
    expect(decodePoints(shifted.subarray(3))).toEqual(table);
  });
});
