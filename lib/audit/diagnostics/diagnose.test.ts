import { describe, expect, it } from "vitest";
import { diagnoseAudit } from "./diagnose";
import { simulatePairs } from "../test-helpers";

describe("diagnoseAudit", () => {
  it("diagnoseAudit -- without the records, degraded-fix stretches come from the checkpoints", () => {
    const pairs = simulatePairs({
      rows: 4,
      rawSd: 0.01,
      float: { rows: [2], from: 5, to: 9, along: 0.03, cross: 0.01 },
    });
    const d = diagnoseAudit({ pairs, track: null });
    expect(d.headline.pairs).toBe(160);
    expect(d.headline.degraded).toBe(5);
    const fix = d.episodes.find((e) => e.kind === "degraded-fix")!;
    expect(fix.parts[0]).toMatchObject({ row: "2", firstPlantId: "HB-2-0051", lastPlantId: "HB-2-0091", count: 5 });
    expect(d.arms).toHaveLength(4);
    expect(d.clearance.cross).toHaveLength(6);
    expect(d.cameraGain[0].overall).toBe(true);
    expect(d.pass).toHaveLength(160);
    // FGDC-STD-007.3-1998 Appendix 3-A: RMSE_r over the RTK-fixed pairs only
    const fixed = pairs.filter((p) => p.fix === "rtk-fixed");
    expect(d.headline.rmseRFixed!).toBeCloseTo(
      Math.sqrt(fixed.reduce((s, p) => s + p.dE ** 2 + p.dN ** 2, 0) / fixed.length),
      12,
    );
  });
  it("diagnoseAudit -- no pairs", () => {
    const d = diagnoseAudit({ pairs: [], track: null });
    expect(d.headline.rmseR).toBeNull();
    expect(d.similarity).toBeNull();
    expect(d.episodes).toEqual([]);
  });
});
