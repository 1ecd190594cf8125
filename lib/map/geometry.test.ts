import { describe, expect, it } from "vitest";
import * as turf from "@turf/turf";
import { toRowFrame } from "@/lib/audit/row-frame";
import { bedLayout, boundsOf, convexHull, fromRowFrame, rowAxes } from "./geometry";

/** Planted positions laid out like the demo generator (lib/demo/generate.ts): row k of bed b at cross (b−1)·S + (k−1)·w from the first row. */
function field(o: {
  bearing: number;
  beds: number;
  rows: number;
  w: number;
  S: number;
  plants: number;
  spacing: number;
  shift: [number, number];
}) {
  const axes = rowAxes(o.bearing);
  const xy: number[] = [],
    bed: string[] = [],
    row: string[] = [];
  for (let b = 1; b <= o.beds; b++) {
    for (let k = 1; k <= o.rows; k++) {
      for (let i = 0; i < o.plants; i++) {
        const [x, y] = fromRowFrame(i * o.spacing, (b - 1) * o.S + (k - 1) * o.w, axes);
        xy.push(x + o.shift[0], y + o.shift[1]);
        bed.push(String(b));
        row.push(String(k));
      }
    }
  }
  return { xy: Float64Array.from(xy), bed, row };
}

describe("row frame", () => {
  it("rowAxes -- same along/cross convention as the audit engine", () => {
    for (const bearing of [0, 22.5, 90, 112, 200]) {
      const { u, r } = rowAxes(bearing);
      const p = [0.013, -0.004] as const;
      const along = p[0] * u[0] + p[1] * u[1],
        cross = p[0] * r[0] + p[1] * r[1];
      const ref = toRowFrame(p[0], p[1], bearing); // lib/audit/row-frame.ts (our documented convention)
      expect(along).toBeCloseTo(ref.along, 12);
      expect(cross).toBeCloseTo(ref.cross, 12);
      const back = fromRowFrame(along, cross, { u, r });
      expect(back[0]).toBeCloseTo(p[0], 12);
      expect(back[1]).toBeCloseTo(p[1], 12);
    }
  });
});

describe("convexHull", () => {
  it("convexHull -- square with inner and edge points", () => {
    expect(convexHull(Float32Array.of(0, 0, 2, 0, 1, 1, 2, 2, 0, 2, 1, 0, Number.NaN, 5))).toEqual([
      [0, 0],
      [2, 0],
      [2, 2],
      [0, 2],
    ]);
  });

  it("convexHull -- agrees with turf.convex on scattered points (independent oracle)", () => {
    let seed = 3;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const pts: [number, number][] = Array.from({ length: 400 }, () => [rand() * 50 - 25, rand() * 20 - 10]);
    const ours = convexHull(Float64Array.from(pts.flat()));
    const theirs = turf
      .convex(turf.featureCollection(pts.map((p) => turf.point(p))))!
      .geometry.coordinates[0].slice(0, -1);
    const key = (p: number[]) => `${p[0].toFixed(9)},${p[1].toFixed(9)}`;
    expect(new Set(ours.map(key))).toEqual(new Set(theirs.map(key)));
    expect(turf.area(turf.polygon([[...ours, ours[0]]]))).toBeGreaterThan(0);
  });

  it("convexHull -- fewer than three distinct points come back as they are", () => {
    expect(convexHull(Float32Array.of(1, 1, 1, 1, 2, 2))).toEqual([
      [1, 1],
      [2, 2],
    ]);
  });
});

describe("bedLayout", () => {
  const S = 3,
    w = 0.5,
    R = 5;

  it("bedLayout -- places beds and rows on the records' bed and row numbers", () => {
    const f = field({ bearing: 22.5, beds: 6, rows: R, w, S, plants: 40, spacing: 0.3, shift: [-9.3, -20.1] });
    const layout = bedLayout({
      bearingDeg: 22.5,
      bedSpacingM: S,
      rowsPerBed: R,
      rowSpacingM: w,
      points: { xy: f.xy, bed: (i) => f.bed[i], row: (i) => f.row[i] },
    });
    expect(layout.anchoredBy).toBe("labels");
    expect(layout.beds.map((b) => b.label)).toEqual(["1", "2", "3", "4", "5", "6"]);
    const axes = rowAxes(22.5);
    // Row k of bed b must pass through the records of that row: compare cross-row positions.
    for (const b of layout.beds) {
      expect(b.rows).toHaveLength(R);
      b.rows.forEach((r, k) => {
        const i = f.bed.findIndex((x, j) => x === b.label && f.row[j] === String(k + 1));
        const pc = f.xy[2 * i] * axes.r[0] + f.xy[2 * i + 1] * axes.r[1];
        const lc = r.path[0][0] * axes.r[0] + r.path[0][1] * axes.r[1];
        expect(lc).toBeCloseTo(pc, 9);
      });
      // The bed spans its records: 40 plants 0.3 m apart = 11.7 m.
      expect(b.to - b.from).toBeCloseTo(11.7, 9);
      // Its name sits on the centre line, one bed width (2.5 m) before the first record.
      expect(b.labelAt[0] * axes.u[0] + b.labelAt[1] * axes.u[1]).toBeCloseTo(b.from - 2.5, 9);
      expect(b.labelAt[0] * axes.r[0] + b.labelAt[1] * axes.r[1]).toBeCloseTo(b.centre, 9);
    }
    expect(layout.halfWidth).toBe(1.25); // five rows 0.5 m apart, half a row spacing beyond the outer rows
  });

  it("bedLayout -- a few mislabelled plants do not move the layout (median anchor)", () => {
    const f = field({ bearing: 112, beds: 4, rows: 4, w: 0.4, S, plants: 30, spacing: 0.35, shift: [5, 5] });
    f.bed[3] = "4";
    f.bed[7] = "3";
    const layout = bedLayout({
      bearingDeg: 112,
      bedSpacingM: S,
      rowsPerBed: 4,
      rowSpacingM: 0.4,
      points: { xy: f.xy, bed: (i) => f.bed[i], row: (i) => f.row[i] },
    });
    const axes = rowAxes(112);
    const first = layout.beds[0].rows[0].path[0];
    const c0 = f.xy[2 * 40] * axes.r[0] + f.xy[2 * 40 + 1] * axes.r[1]; // plant 40: bed 1, row 2 (labels intact)
    expect(first[0] * axes.r[0] + first[1] * axes.r[1] + 0.4).toBeCloseTo(c0, 9);
  });

  it("bedLayout -- without numeric labels, beds sit on the records by circular mean of cross-row positions", () => {
    const f = field({ bearing: 0, beds: 3, rows: R, w, S, plants: 20, spacing: 0.3, shift: [1.7, 0] });
    const layout = bedLayout({ bearingDeg: 0, bedSpacingM: S, rowsPerBed: R, rowSpacingM: w, points: { xy: f.xy } });
    expect(layout.anchoredBy).toBe("positions");
    // Bearing 0: cross = x. Bed centres at 1.7 + 1.0 + 3·(b−1).
    expect(layout.beds.map((b) => b.centre)).toEqual([2.7, 5.7, 8.7].map((v) => expect.closeTo(v, 9)));
    expect(layout.beds.every((b) => b.label === "")).toBe(true);
  });

  it("bedLayout -- says why when the field settings are missing", () => {
    const pts = { xy: Float32Array.of(0, 0, 1, 1) };
    expect(
      bedLayout({ bearingDeg: 22.5, bedSpacingM: null, rowsPerBed: 5, rowSpacingM: 0.5, points: pts }).note,
    ).toMatch(/set the bed spacing/);
    expect(bedLayout({ bearingDeg: null, bedSpacingM: 3, rowsPerBed: 5, rowSpacingM: 0.5, points: pts }).note).toMatch(
      /no row bearing/,
    );
    expect(
      bedLayout({ bearingDeg: 0, bedSpacingM: 3, rowsPerBed: 5, rowSpacingM: 0.5, points: { xy: [] } }).beds,
    ).toEqual([]);
  });
});

describe("boundsOf", () => {
  it("boundsOf -- several interleaved arrays, NaN skipped", () => {
    expect(boundsOf(Float32Array.of(1, 2, Number.NaN, 9), [-3, 4])).toEqual({ minX: -3, minY: 2, maxX: 1, maxY: 4 });
    expect(boundsOf([])).toBeNull();
  });
});
