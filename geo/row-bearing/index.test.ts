import { describe, expect, it } from "vitest";
import type { CodedColumn, PointTable } from "../types";
import { deriveRowBearing } from "./index";

// Self-constructed geometry: rows laid out at a known bearing, so the truth is by construction.
// The principal-axis formula tan 2θ = 2·Sxy / (Syy − Sxx) is standard 2 × 2 eigen-analysis (any
// linear-algebra text; from memory).
function field(
  bearingDeg: number,
  opts: {
    beds: number;
    rows: number;
    perRow: number;
    spacing: number;
    rowGap: number;
    bedWidth: number;
    noise?: number;
    attrs?: boolean;
  },
): PointTable {
  const b = (bearingDeg * Math.PI) / 180;
  const x: number[] = [],
    y: number[] = [],
    bed: number[] = [],
    row: number[] = [];
  let seed = 7;
  const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 2;
  for (let k = 0; k < opts.beds; k++)
    for (let r = 0; r < opts.rows; r++)
      for (let i = 0; i < opts.perRow; i++) {
        const along = i * opts.spacing,
          cross = k * opts.bedWidth + r * opts.rowGap;
        x.push(552300 + along * Math.sin(b) + cross * Math.cos(b) + (opts.noise ?? 0) * rnd());
        y.push(5794100 + along * Math.cos(b) - cross * Math.sin(b) + (opts.noise ?? 0) * rnd());
        bed.push(k);
        row.push(r);
      }
  const coded = (v: number[], n: number): CodedColumn => ({
    codes: Int32Array.from(v),
    values: Array.from({ length: n }, (_, i) => String(i + 1)),
  });
  return {
    source: "f.csv",
    role: "planted",
    length: x.length,
    x: Float64Array.from(x),
    y: Float64Array.from(y),
    line: new Int32Array(x.length),
    id: null,
    attrs: opts.attrs === false ? {} : { bed: coded(bed, opts.beds), row: coded(row, opts.rows) },
    time: null,
    hdop: null,
    precision: null,
    rawX: null,
    rawY: null,
  };
}
const angleDiff = (a: number, b: number) => Math.abs(((((a - b + 90) % 180) + 180) % 180) - 90);

describe("row bearing", () => {
  for (const bearing of [0, 28, 90, 135.5, 179]) {
    it(`deriveRowBearing -- bed/row groups recover ${bearing}°`, () => {
      const r = deriveRowBearing(
        field(bearing, { beds: 3, rows: 5, perRow: 60, spacing: 0.25, rowGap: 0.5, bedWidth: 3, noise: 0.004 }),
      );
      expect(r.method).toBe("bed-row");
      expect(r.used).toBe(15);
      expect(angleDiff(r.bearingDeg, bearing)).toBeLessThan(0.1);
      expect(r.linearity).toBeGreaterThan(0.99);
    });
  }

  it("deriveRowBearing -- nearest neighbours without row attributes", () => {
    const r = deriveRowBearing(
      field(62, { beds: 4, rows: 5, perRow: 80, spacing: 0.25, rowGap: 0.5, bedWidth: 3, noise: 0.003, attrs: false }),
    );
    expect(r.method).toBe("neighbours");
    expect(angleDiff(r.bearingDeg, 62)).toBeLessThan(1);
  });

  it("deriveRowBearing -- square grid gives a weak result (low linearity)", () => {
    const r = deriveRowBearing(
      field(10, { beds: 1, rows: 30, perRow: 30, spacing: 0.5, rowGap: 0.5, bedWidth: 0, noise: 0.02, attrs: false }),
    );
    expect(r.linearity).toBeLessThan(0.5);
  });

  it("deriveRowBearing -- nothing to go by", () => {
    const t = field(0, { beds: 1, rows: 1, perRow: 2, spacing: 1, rowGap: 1, bedWidth: 1, attrs: false });
    expect(deriveRowBearing(t)).toMatchObject({ method: "none", used: 0 });
  });
});
