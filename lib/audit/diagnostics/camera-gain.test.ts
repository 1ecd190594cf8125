import { describe, expect, it } from "vitest";
import { cameraGain } from "./camera-gain";
import { simulatePairs } from "../test-helpers";

describe("cameraGain", () => {
  it("cameraGain -- RMSE of raw against corrected on the same pairs", () => {
    const pairs = simulatePairs({ rows: 4, rawSd: 0.012 });
    const [all, ...arms] = cameraGain(pairs);
    expect(all.overall).toBe(true);
    expect(all.pairs).toBe(pairs.length);
    // FGDC-STD-007.3-1998 Appendix 3-A: RMSE_r = sqrt(Σ(dE² + dN²)/n)
    const raw = Math.sqrt(pairs.reduce((s, p) => s + p.rawDE! ** 2 + p.rawDN! ** 2, 0) / pairs.length);
    expect(all.rmseRaw!).toBeCloseTo(raw, 12);
    expect(all.gain!).toBeCloseTo(1 - all.rmseCorrected! / raw, 12);
    expect(all.gain!).toBeGreaterThan(0.6);
    expect(arms.map((a) => a.arm)).toEqual(["1", "2", "3", "4"]);
  });
  it("cameraGain -- empty without raw positions", () => {
    expect(cameraGain(simulatePairs({ rows: 2 }))).toEqual([]);
  });
});
