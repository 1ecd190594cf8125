/**
 * Sources: FGDC-STD-007.3-1998 §3.1 (thresholds are the user's); Clopper–Pearson closed form for k = n
 * (Clopper & Pearson 1934: 20 of 20 supports only "at least 83.2 % within tolerance").
 */
import { describe, expect, it } from "vitest";
import { hasLimits, withinToleranceFlags, withinToleranceShare } from "./tolerance";

const none = { radial: null, cross: null, along: null };

describe("tolerance", () => {
  it("withinToleranceFlags -- radial limit is inclusive", () => {
    const flags = withinToleranceFlags({
      radial: Float64Array.of(0.01, 0.03, 0.031),
      along: null,
      cross: null,
      limits: { ...none, radial: 0.03 },
    });
    expect(Array.from(flags)).toEqual([1, 1, 0]);
  });

  it("withinToleranceFlags -- every given limit must hold", () => {
    const input = {
      radial: Float64Array.of(0.02, 0.02, 0.05),
      cross: Float64Array.of(-0.01, 0.019, 0.001),
      along: Float64Array.of(0.017, 0.001, 0.05),
    };
    expect(Array.from(withinToleranceFlags({ ...input, limits: { ...none, cross: 0.015 } }))).toEqual([1, 0, 1]);
    expect(Array.from(withinToleranceFlags({ ...input, limits: { radial: 0.03, cross: 0.015, along: null } }))).toEqual(
      [1, 0, 0],
    );
    expect(Array.from(withinToleranceFlags({ ...input, limits: { radial: null, cross: 0.02, along: 0.01 } }))).toEqual([
      0, 1, 0,
    ]);
  });

  it("withinToleranceFlags -- cross limit without a row frame throws", () => {
    expect(() =>
      withinToleranceFlags({
        radial: Float64Array.of(0.01),
        along: null,
        cross: null,
        limits: { ...none, cross: 0.02 },
      }),
    ).toThrow("withinToleranceFlags: cross/along limits need a row bearing");
  });

  it("withinToleranceShare -- 20 of 20 within supports only 83.2 %", () => {
    // Clopper & Pearson 1934, closed form for k = n: lower = 0.025^(1/20) = 0.8316
    const w = withinToleranceShare(new Uint8Array(20).fill(1), 0.95, { ...none, radial: 0.03 });
    expect(w.share).toBe(1);
    expect(w.lower95).toBeCloseTo(0.8316, 4);
    expect(w.upper95).toBe(1);
    expect(w.within).toBe(20);
    expect(w.n).toBe(20);
    expect(w.confidence).toBe(0.95);
    expect(w.limits).toEqual({ radial: 0.03, cross: null, along: null });
  });

  it("withinToleranceShare -- no pairs gives nulls", () => {
    const w = withinToleranceShare(new Uint8Array(0), 0.95, { ...none, radial: 0.03 });
    expect(w).toMatchObject({ share: null, lower95: null, upper95: null, within: 0, n: 0 });
  });

  it("hasLimits -- any limit counts", () => {
    expect(hasLimits(none)).toBe(false);
    expect(hasLimits({ ...none, along: 0.05 })).toBe(true);
  });
});
