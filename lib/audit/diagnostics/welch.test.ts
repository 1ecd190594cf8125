import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { welchTest } from "./welch";

const A1 = [27.5, 21.0, 19.0, 23.6, 17.0, 17.9, 16.9, 20.1, 21.9, 22.6, 23.1, 19.6, 19.0, 21.7, 21.4];
const A2 = [27.1, 22.0, 20.8, 23.4, 23.4, 23.5, 25.8, 22.0, 24.8, 20.2, 21.9, 22.1, 22.9, 20.5, 24.4];
const summary = (x: number[]) => ({
  n: x.length,
  mean: jStat.mean(x),
  sd: jStat.stdev(x, true),
});

describe("welchTest", () => {
  it("welchTest -- worked example (scipy 1.17.1 stats.ttest_ind(equal_var=False) as independent oracle)", () => {
    // Example 1 of the Wikipedia article "Welch's t-test" (from memory): t = 2.46, df = 25.0, p = 0.021;
    // scipy: t = 2.455356398286006, df = 24.988529290231416, p = 0.021378001462866992
    const r = welchTest(summary(A1), summary(A2))!;
    expect(r.t).toBeCloseTo(2.455356398286006, 9);
    expect(r.df).toBeCloseTo(24.988529290231416, 9);
    expect(r.p).toBeCloseTo(0.021378001462866992, 9);
    expect(r.difference).toBeCloseTo(22.986666666666665 - 20.82, 9);
  });
  it("welchTest -- too small or no spread", () => {
    expect(welchTest({ n: 1, mean: 0, sd: 0 }, { n: 5, mean: 1, sd: 1 })).toBeNull();
    expect(welchTest({ n: 3, mean: 0, sd: 0 }, { n: 5, mean: 1, sd: 0 })).toBeNull();
  });
});
