/**
 * Sources: plane rotation of axes (common practice, no source); the sign convention (cross positive to the right
 * of the row direction, bearing clockwise from grid north) is ours and documented in row-frame.ts.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { rowFrame, toRowFrame } from "./row-frame";

describe("rowFrame", () => {
  it("toRowFrame -- rows running north: along = dN, cross = dE", () => {
    const r = toRowFrame(0.01, 0.02, 0);
    expect(r.along).toBeCloseTo(0.02, 15);
    expect(r.cross).toBeCloseTo(0.01, 15);
  });

  it("toRowFrame -- rows running east: along = dE, cross = −dN (north is to the left)", () => {
    const r = toRowFrame(0.01, 0.02, 90);
    expect(r.along).toBeCloseTo(0.01, 15);
    expect(r.cross).toBeCloseTo(-0.02, 15);
  });

  it("toRowFrame -- rows running south-west and the reverse direction", () => {
    // bearing 225: direction (−1/√2, −1/√2); an error of (−1, −1) cm lies along the row
    const r = toRowFrame(-0.01, -0.01, 225);
    expect(r.along).toBeCloseTo(0.01 * Math.SQRT2, 14);
    expect(r.cross).toBeCloseTo(0, 14);
    // turning the row direction by 180° flips both signs
    const a = toRowFrame(0.013, -0.004, 17);
    const b = toRowFrame(0.013, -0.004, 197);
    expect(b.along).toBeCloseTo(-a.along, 14);
    expect(b.cross).toBeCloseTo(-a.cross, 14);
    // bearings are taken modulo 360
    expect(toRowFrame(0.013, -0.004, 377).cross).toBeCloseTo(a.cross, 14);
    expect(toRowFrame(0.013, -0.004, -343).cross).toBeCloseTo(a.cross, 14);
  });

  it("rowFrame -- preserves length and matches the scalar form", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true })), {
          maxLength: 50,
        }),
        fc.double({ min: -720, max: 720, noNaN: true }),
        (pairs, bearing) => {
          const dE = Float64Array.from(pairs.map((p) => p[0]));
          const dN = Float64Array.from(pairs.map((p) => p[1]));
          const { along, cross } = rowFrame(dE, dN, bearing);
          for (let i = 0; i < dE.length; i++) {
            expect(Math.hypot(along[i], cross[i])).toBeCloseTo(Math.hypot(dE[i], dN[i]), 12);
            const s = toRowFrame(dE[i], dN[i], bearing);
            expect(along[i]).toBe(s.along);
            expect(cross[i]).toBe(s.cross);
          }
        },
      ),
    );
  });

  it("rowFrame -- rejects a non-finite bearing and mismatched lengths", () => {
    expect(() => toRowFrame(0, 0, Number.NaN)).toThrow("rowFrame: row bearing must be a finite number");
    expect(() => rowFrame(new Float64Array(2), new Float64Array(1), 0)).toThrow("rowFrame: dE and dN differ in length");
  });
});
