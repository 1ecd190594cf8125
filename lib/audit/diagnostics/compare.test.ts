import { describe, expect, it } from "vitest";
import { armDiagnostics } from "./arm-offsets";
import { compareDiagnostics } from "./compare";
import { simulatePairs } from "../test-helpers";

// Sources: Welch's t-test (Welch, Biometrika 34 (1947) 28–35) for per-arm means; F-test of variances (NIST/SEMATECH
// e-Handbook §1.3.5.9) for the horizontal RMSE with 2n degrees of freedom (two components per checkpoint). Expected
// directions are the offsets and spreads planted in the simulated pairs (common practice, no source).

const headline = (pairs: ReturnType<typeof simulatePairs>) => ({
  pairs: pairs.length,
  rmseR: Math.sqrt(pairs.reduce((s, p) => s + p.dE ** 2 + p.dN ** 2, 0) / pairs.length),
});

describe("compareDiagnostics", () => {
  it("compareDiagnostics -- a fixed arm offset shows as a significant move of that arm", () => {
    // expected: arm 3's planted 3 mm offset removed between the two simulations (common practice, no source)
    const before = simulatePairs({ armCross: [0, 0, 0.003, 0], seed: 1 });
    const after = simulatePairs({ armCross: [0, 0, 0, 0], seed: 2 });
    const c = compareDiagnostics(
      { headline: headline(before), arms: armDiagnostics(before) },
      { headline: headline(after), arms: armDiagnostics(after) },
    );
    const arm3 = c.arms.find((a) => a.arm === "3" && a.component === "cross")!;
    expect(arm3.meanSignificant).toBe(true);
    expect(arm3.mean!.difference).toBeLessThan(-0.002);
    expect(c.sentence).toMatch(/arm 3 moved \d\.\d mm to the left/);
    expect(c.methods).toMatch(/Welch's t-test/);
    expect(c.rmseR.relative!).toBeLessThan(0);
  });
  it("compareDiagnostics -- horizontal RMSE F-test with 2n degrees of freedom", () => {
    // expected: spread doubled from 2 mm to 4 mm between the simulations; F-test per NIST/SEMATECH e-Handbook §1.3.5.9
    const before = simulatePairs({ seed: 3, sd: 0.002 });
    const after = simulatePairs({ seed: 4, sd: 0.004 });
    const c = compareDiagnostics(
      { headline: headline(before), arms: armDiagnostics(before) },
      { headline: headline(after), arms: armDiagnostics(after) },
    );
    expect(c.rmseR.test!.df1).toBe(2 * after.length);
    expect(c.rmseR.significant).toBe(true);
    expect(c.sentence).toMatch(/^Horizontal RMSE rose \d+ % \(significant\)/);
  });
});
