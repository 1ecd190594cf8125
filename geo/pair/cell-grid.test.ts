import fc from "fast-check";
import KDBush from "kdbush";
import { describe, expect, it } from "vitest";
import { buildCellGrid } from "./cell-grid";

// Oracle: kdbush's own radius search (a general-purpose spatial index from the npm registry) on the same points.
function kdWithin(x: Float64Array, y: Float64Array, at: Int32Array, qx: number, qy: number, r: number): number[] {
  const t = new KDBush(at.length, 16, Float64Array);
  for (let j = 0; j < at.length; j++) t.add(x[at[j]], y[at[j]]);
  t.finish();
  return t.within(qx, qy, r).sort((a, b) => a - b);
}

function gridWithin(x: Float64Array, y: Float64Array, at: Int32Array, qx: number, qy: number, r: number): number[] {
  const g = buildCellGrid(x, y, at, r);
  if (!g) throw new Error("no grid");
  const out: number[] = [];
  const k = g.withinInto(qx, qy, r, out);
  return out.slice(0, k).sort((a, b) => a - b);
}

const coord = fc.double({ min: -5, max: 5, noNaN: true });

describe("cell grid", () => {
  it("cell grid -- finds exactly the points kdbush finds within the radius, for any points and query", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(coord, coord), { minLength: 1, maxLength: 300 }),
        fc.tuple(coord, coord),
        fc.double({ min: 0.01, max: 2, noNaN: true }),
        (points, [qx, qy], r) => {
          const x = Float64Array.from(points, (p) => 500_000 + p[0]);
          const y = Float64Array.from(points, (p) => 5_800_000 + p[1]);
          // only every other point is indexed, as pairing indexes only the free records
          const at = Int32Array.from(points.keys()).filter((i) => i % 2 === 0);
          const g = buildCellGrid(x, y, at, r);
          if (!g) return; // too spread for this radius: the caller uses the k-d tree
          expect(gridWithin(x, y, at, 500_000 + qx, 5_800_000 + qy, r)).toEqual(
            kdWithin(x, y, at, 500_000 + qx, 5_800_000 + qy, r),
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it("cell grid -- a point exactly at the radius counts, as in kdbush (distance ≤ r)", () => {
    const x = Float64Array.of(0, 0.1, 0.3),
      y = Float64Array.of(0, 0, 0);
    // kdbush (reference library): within() keeps a point at distance ≤ r
    expect(kdWithin(x, y, Int32Array.of(0, 1, 2), 0, 0, 0.1)).toEqual([0, 1]);
    expect(gridWithin(x, y, Int32Array.of(0, 1, 2), 0, 0, 0.1)).toEqual([0, 1]);
  });

  it("cell grid -- a single long row is gridded along its length", () => {
    const x = Float64Array.from({ length: 400 }, (_, i) => i * 0.25),
      y = new Float64Array(400);
    // kdbush (reference library) finds the same single plant, 1 cm from the query
    expect(gridWithin(x, y, Int32Array.from(x.keys()), 50.01, 0, 0.1)).toEqual(
      kdWithin(x, y, Int32Array.from(x.keys()), 50.01, 0, 0.1),
    );
    expect(gridWithin(x, y, Int32Array.from(x.keys()), 50.01, 0, 0.1)).toEqual([200]);
  });

  it("cell grid -- declines a dense field with one stray fix kilometres away, leaving it to the k-d tree", () => {
    // common practice, no source: one far point stretches a uniform grid until its cells hold too many points,
    // where a k-d tree (kdbush) stays fast; the grid declines and pairing uses the tree.
    const n = 20_000; // 0.25 m × 0.5 m spacing: a 50 m × 25 m block, and one point 40 km east
    const x = Float64Array.from({ length: n + 1 }, (_, i) => (i === n ? 40_000 : (i % 200) * 0.25));
    const y = Float64Array.from({ length: n + 1 }, (_, i) => (i === n ? 0 : Math.floor(i / 200) * 0.5));
    expect(buildCellGrid(x, y, Int32Array.from(x.keys()), 0.1)).toBeNull();
    expect(buildCellGrid(x, y, Int32Array.from(x.keys()).subarray(0, n), 0.1)).not.toBeNull();
  });

  it("cell grid -- refuses a query wider than the radius it was built for", () => {
    // common practice, no source: a grid built for one radius cannot answer a wider query (it would miss cells)
    const g = buildCellGrid(Float64Array.of(0, 0.05), Float64Array.of(0, 0.05), Int32Array.of(0, 1), 0.1);
    expect(g).not.toBeNull();
    expect(() => g?.withinInto(0, 0, 0.2, [])).toThrow(/built for radius 0.1/);
  });
});
