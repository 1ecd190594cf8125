/**
 * The selection rule is ours (common practice, no source); these tests check its promises: the same seed gives the
 * same plants, every stratum gets its minimum, spacing and bed-end margins hold, names fit 16 characters.
 * Bearing check: the principal axis of points on a line at a known bearing is that bearing (plain geometry).
 */
import { describe, expect, it } from "vitest";
import { allocate, mainBearingDeg, type PlanPlant, pointName, selectCheckpoints, type SelectOptions } from "./select";

/** A test field: `beds` beds of 5 rows, `perRow` plants 0.3 m apart along bearing 22.5°, rows 0.5 m, beds 3 m. */
function field(beds = 6, perRow = 160): PlanPlant[] {
  const th = (22.5 * Math.PI) / 180;
  const plants: PlanPlant[] = [];
  for (let b = 1; b <= beds; b++)
    for (let r = 1; r <= 5; r++)
      for (let k = 0; k < perRow; k++) {
        const a = k * 0.3;
        const off = (b - 1) * 3 + (r - 1) * 0.5;
        plants.push({
          id: `T-${b}-${r}-${k + 1}`,
          e: 1000 + Math.sin(th) * a + Math.cos(th) * off,
          n: 5000 + Math.cos(th) * a - Math.sin(th) * off,
          bed: String(b),
          row: String(r),
          arm: String(r),
          crop: "lettuce",
          day: b <= 3 ? "2026-04-14" : "2026-04-15",
          fix: b === 3 && r === 2 && k < 40 ? "rtk-float" : "rtk-fixed",
        });
      }
  return plants;
}

const BASE: SelectOptions = {
  required: 59,
  strataBy: ["bed"],
  minPerStratum: 5,
  sparesPerStratum: 2,
  minSpacingM: 1,
  bedEndM: 2,
  rowBearingDeg: 22.5,
  seed: 4242,
};

describe("selectCheckpoints", () => {
  it("selectCheckpoints -- the same seed gives the same plants; another seed other plants", () => {
    const plants = field();
    const a = selectCheckpoints(plants, BASE);
    const b = selectCheckpoints(plants, BASE);
    expect(b.points).toEqual(a.points);
    const c = selectCheckpoints(plants, { ...BASE, seed: 4243 });
    expect(c.points.map((p) => p.plantId)).not.toEqual(a.points.map((p) => p.plantId));
  });

  it("selectCheckpoints -- does not depend on the order of the input rows", () => {
    const plants = field();
    const a = selectCheckpoints(plants, BASE);
    const b = selectCheckpoints(plants.slice().reverse(), BASE);
    expect(b.points.map((p) => p.plantId).sort()).toEqual(a.points.map((p) => p.plantId).sort());
  });

  it("selectCheckpoints -- every stratum gets its minimum, the total reaches the sample size, spares come extra", () => {
    const s = selectCheckpoints(field(), { ...BASE, strataBy: ["bed", "fix"], minPerStratum: 4 });
    const checks = s.points.filter((p) => !p.spare);
    expect(checks.length).toBeGreaterThanOrEqual(59);
    expect(s.strata.length).toBe(7); // six beds, bed 3 split by fix
    for (const st of s.strata) {
      const inStratum = checks.filter((p) => p.stratum === st.key).length;
      expect(inStratum, st.key).toBeGreaterThanOrEqual(4);
      expect(inStratum).toBe(st.checkpoints);
      expect(s.points.filter((p) => p.spare && p.stratum === st.key).length).toBe(2);
    }
  });

  it("selectCheckpoints -- no two chosen plants nearer than the spacing; none within the bed-end margin", () => {
    const plants = field();
    const s = selectCheckpoints(plants, { ...BASE, minSpacingM: 1.5, bedEndM: 2.95 });
    for (let i = 0; i < s.points.length; i++)
      for (let j = i + 1; j < s.points.length; j++)
        expect(Math.hypot(s.points[i].e - s.points[j].e, s.points[i].n - s.points[j].n)).toBeGreaterThanOrEqual(1.5);
    // plants 1–10 (0–2.7 m) and the last ten of each row lie within 2.95 m of a bed end
    for (const p of s.points) {
      const k = Number(p.plantId.split("-")[3]) - 1;
      expect(k * 0.3).toBeGreaterThanOrEqual(2.95);
      expect(k * 0.3).toBeLessThanOrEqual(159 * 0.3 - 2.95);
    }
    expect(s.excludedAtBedEnds).toBe(6 * 5 * 20);
  });

  it("selectCheckpoints -- spreads along the rows: each third of a bed holds chosen plants", () => {
    const s = selectCheckpoints(field(), { ...BASE, strataBy: ["bed"], required: 60, minPerStratum: 10 });
    for (let b = 1; b <= 6; b++) {
      const ks = s.points.filter((p) => p.bed === String(b) && !p.spare).map((p) => Number(p.plantId.split("-")[3]));
      expect(ks.some((k) => k < 54)).toBe(true);
      expect(ks.some((k) => k >= 54 && k < 107)).toBe(true);
      expect(ks.some((k) => k >= 107)).toBe(true);
    }
  });

  it("selectCheckpoints -- names are unique and at most 16 characters", () => {
    const s = selectCheckpoints(field(), BASE);
    const names = s.points.map((p) => p.name);
    expect(new Set(names).size).toBe(names.length);
    for (const n of names) expect(n.length).toBeLessThanOrEqual(16);
    expect(names.filter((n) => n.startsWith("C")).length).toBe(s.points.filter((p) => !p.spare).length);
  });

  it("selectCheckpoints -- does not change its input", () => {
    const plants = field(2, 60);
    const copy = structuredClone(plants);
    selectCheckpoints(plants, { ...BASE, required: 30 });
    expect(plants).toEqual(copy);
  });

  it("selectCheckpoints -- more checkpoints than plants: a message with both numbers", () => {
    expect(() => selectCheckpoints(field(1, 10), { ...BASE, required: 59, bedEndM: 0 })).toThrow(
      "plan: the profile needs 59 checkpoints but the as-planted dataset has 50 plants",
    );
    expect(() => selectCheckpoints(field(1, 20), { ...BASE, required: 70, bedEndM: 1 })).toThrow(
      /has 100 plants \(60 after leaving out 1 m at each bed end\)/,
    );
  });

  it("selectCheckpoints -- a stratum too small for its minimum is named with its count", () => {
    // bed 3 row 2 has 40 plants planted on a float fix, fewer than 45
    expect(() =>
      selectCheckpoints(field(), { ...BASE, strataBy: ["fix"], minPerStratum: 45, bedEndM: 0, required: 59 }),
    ).toThrow("plan: 1 stratum(s) have fewer plants than the minimum of 45 per stratum: fix quality rtk-float has 40");
  });

  it("selectCheckpoints -- a spacing too wide for the stratum says so", () => {
    expect(() => selectCheckpoints(field(1, 40), { ...BASE, required: 30, bedEndM: 0, minSpacingM: 5 })).toThrow(
      /checkpoints of bed 1 fit with a minimum spacing of 5 m/,
    );
  });
});

describe("pointName", () => {
  it("pointName -- checkpoint and spare names with the bed", () => {
    expect(pointName(false, 7, "3")).toBe("C0007-B3");
    expect(pointName(true, 12, "North bed 14")).toBe("S0012-BNorthb");
    expect(pointName(false, 9999, null)).toBe("C9999");
    expect(() => pointName(false, 10000, "1")).toThrow(/outside 1–9999/);
  });
});

describe("allocate", () => {
  it("allocate -- proportional with a floor, summing to the total", () => {
    expect(allocate([100, 100, 100], 59, 5)).toEqual([20, 20, 19]);
    expect(allocate([1000, 10], 30, 5)).toEqual([25, 5]);
    expect(allocate([3, 100], 30, 3).reduce((a, b) => a + b)).toBe(30);
  });
});

describe("mainBearingDeg", () => {
  it("mainBearingDeg -- points on a line at 22.5° and at 112°", () => {
    for (const deg of [22.5, 112]) {
      const th = (deg * Math.PI) / 180;
      const pts = Array.from({ length: 50 }, (_, k) => ({
        id: String(k),
        e: Math.sin(th) * k + (k % 2) * 0.01,
        n: Math.cos(th) * k,
        bed: null,
        row: null,
        arm: null,
        crop: null,
        day: null,
        fix: null,
      }));
      expect(mainBearingDeg(pts)).toBeCloseTo(deg, 0);
    }
  });
});
