import { describe, expect, it } from "vitest";
import { aggregateCells } from "./cells";
import { fromRowFrame, rowAxes } from "./geometry";
import { PAIR_FLAG } from "./types";

const IN = PAIR_FLAG.WITHIN_KNOWN | PAIR_FLAG.WITHIN,
  OUT = PAIR_FLAG.WITHIN_KNOWN,
  UNKNOWN = 0;

describe("aggregateCells", () => {
  it("aggregateCells -- square cells in the row frame: counts, mean and share out by hand", () => {
    // Bearing 0: along = y, cross = x. Cells 1 m × 1 m.
    const xy = Float32Array.of(0.5, 0.5, 0.6, 0.7, 0.5, 1.5, 1.5, 0.5);
    const values = Float32Array.of(0.002, 0.004, 0.03, 0.001);
    const cells = aggregateCells({
      xy,
      values,
      flags: Uint8Array.of(IN, IN, OUT, UNKNOWN),
      bearingDeg: 0,
      lengthM: 1,
      beds: null,
    });
    expect(cells).toHaveLength(3);
    const a = cells.find((c) => c.across === 0 && c.along === 0)!;
    expect(a).toMatchObject({ n: 2, known: 2, out: 0, shareOut: 0 });
    expect(a.mean).toBeCloseTo(0.003, 9);
    expect(a.polygon.map((p) => p.map((v) => Math.round(v * 1e9) / 1e9))).toEqual([
      [0, 0],
      [0, 1],
      [1, 1],
      [1, 0],
    ]);
    expect(cells.find((c) => c.along === 1)).toMatchObject({ n: 1, out: 1, shareOut: 1 });
    expect(cells.find((c) => c.across === 1)).toMatchObject({ n: 1, known: 0, shareOut: null });
  });

  it("aggregateCells -- bed cells follow the beds at an angle and carry the bed label", () => {
    const bearing = 22.5,
      axes = rowAxes(bearing);
    // Two beds 3 m apart (centres at cross 1 and 4), checkpoints 0.5 m off each centre, along 0.4–9.2 m every 0.8 m.
    const pts: number[] = [],
      values: number[] = [],
      flags: number[] = [];
    for (const [centre, err] of [
      [1, 0.002],
      [4, 0.02],
    ] as const) {
      for (let a = 0.4; a < 10; a += 0.8) {
        pts.push(...fromRowFrame(a, centre + 0.5, axes));
        values.push(err);
        flags.push(err > 0.01 ? OUT : IN);
      }
    }
    const cells = aggregateCells({
      xy: Float64Array.from(pts),
      values: Float64Array.from(values),
      flags: Uint8Array.from(flags),
      bearingDeg: bearing,
      lengthM: 5,
      beds: {
        centres: [
          { label: "7", centre: 1 },
          { label: "8", centre: 4 },
        ],
        spacingM: 3,
        halfWidth: 1.25,
      },
    });
    expect(cells.map((c) => [c.bed, c.along, c.n])).toEqual([
      ["7", 0, 6],
      ["7", 1, 6],
      ["8", 0, 6],
      ["8", 1, 6],
    ]); // along 0.4, 1.2, … 9.2 m
    expect(cells.filter((c) => c.bed === "8").every((c) => c.shareOut === 1)).toBe(true);
    // The first cell of bed 7 spans along 0–5 m and cross 1 ± 1.25 m.
    const [p0, , p2] = cells[0].polygon;
    expect(p0[0]).toBeCloseTo(fromRowFrame(0, -0.25, axes)[0], 9);
    expect(p2[1]).toBeCloseTo(fromRowFrame(5, 2.25, axes)[1], 9);
  });

  it("aggregateCells -- a bed missing from the list does not shift the labels of the beds after it", () => {
    const cells = aggregateCells({
      xy: Float32Array.of(1, 0.5, 4, 0.5, 7, 0.5),
      values: Float32Array.of(0.001, 0.002, 0.003),
      flags: Uint8Array.of(IN, IN, IN),
      bearingDeg: 0,
      lengthM: 5,
      beds: {
        centres: [
          { label: "1", centre: 1 },
          { label: "3", centre: 7 },
        ],
        spacingM: 3,
        halfWidth: 1.25,
      },
    });
    expect(cells.map((c) => [c.across, c.bed])).toEqual([
      [0, "1"],
      [1, ""],
      [2, "3"],
    ]);
  });

  it("aggregateCells -- only the selected pairs count", () => {
    const cells = aggregateCells({
      xy: Float32Array.of(0.5, 0.5, 0.5, 0.6),
      values: Float32Array.of(0.001, 0.009),
      flags: Uint8Array.of(IN, OUT),
      indices: Uint32Array.of(1),
      bearingDeg: null,
      lengthM: 2,
      beds: null,
    });
    expect(cells).toHaveLength(1);
    expect(cells[0]).toMatchObject({ n: 1, out: 1 });
    expect(cells[0].mean).toBeCloseTo(0.009, 9);
  });

  it("aggregateCells -- rejects a cell length that is not positive", () => {
    expect(() => aggregateCells({ xy: [], values: [], flags: [], bearingDeg: 0, lengthM: 0, beds: null })).toThrow(
      "aggregateCells: cell length must be positive, got 0",
    );
  });
});
