import { describe, expect, it } from "vitest";
import { recordTrust, type RecordTrustInput } from "@/lib/audit/record-trust";
import { operationPhrase, recordTrustDto } from "./record-guidance";

const profile = { requiredShare: 0.95, confidence: 0.95, radialM: null, crossM: 0.02, alongM: null };
const audit = { id: "a1", title: "Check", revision: 1, state: "Computed, not yet submitted" };

/** `n` records, each checked; those listed in `floatAt` carry fix "rtk-float" and a 30 mm cross-row error. */
function input(n: number, floatAt: Set<number>): RecordTrustInput {
  const fixCodes = Int32Array.from({ length: n }, (_, i) => (floatAt.has(i) ? 1 : 0));
  return {
    recordCount: n,
    pairs: {
      within: Int8Array.from({ length: n }, (_, i) => (floatAt.has(i) ? 0 : 1)),
      radial: Float64Array.from({ length: n }, (_, i) => (floatAt.has(i) ? 0.03 : 0.002)),
      cross: Float64Array.from({ length: n }, (_, i) => (floatAt.has(i) ? 0.03 : 0.002)),
      along: new Float64Array(n).fill(Number.NaN),
      record: Int32Array.from({ length: n }, (_, i) => i),
    },
    strata: [{ dimension: "fix", values: ["rtk-fixed", "rtk-float"], pairCodes: fixCodes, recordCodes: fixCodes }],
    profile,
  };
}

describe("recordTrustDto", () => {
  it("record guidance -- names the cause and the evidence for the rest, counts in words", () => {
    const t = recordTrust(input(1200, new Set([5, 6, 7])));
    const dto = recordTrustDto(t, { audit, profile: { id: null, name: "Inter-row hoeing", own: true } });
    // one-sided bound 0.05^(1/1197) = 0.99750 — Collins, ARL-TR-5214 (2010)
    expect(dto.summary).toBe(
      "Do not rely on 3 of 1,200 records for inter-row hoeing: fix quality rtk-float. The other 1,197 can be relied on — 1,197 of 1,197 remaining checkpoints within tolerance, at least 99.8 % with 95 % confidence.",
    );
    expect(dto.named[0].line).toBe(
      "fix quality rtk-float: do not rely on its 3 records — 3 of 3 checkpoints out of tolerance.",
    );
    expect(dto.counts).toEqual({ total: 1200, rely: 1197, doNotRely: 3, notShown: 0 });
  });

  it("record guidance -- too few checkpoints: not yet shown, with how many more would settle it", () => {
    const t = recordTrust(input(40, new Set()));
    const dto = recordTrustDto(t, { audit, profile: { id: null, name: "Inter-row hoeing", own: true } });
    // 0.05^(1/59) ≥ 0.95 needs 59 checkpoints all within — Collins, ARL-TR-5214 (2010)
    expect(dto.summary).toBe("40 not yet shown — too few checkpoints; 19 more, all within tolerance, would settle it.");
  });

  it("operation phrase -- lower-cases a plain name, keeps an acronym", () => {
    expect(operationPhrase("Inter-row hoeing")).toBe("inter-row hoeing");
    expect(operationPhrase("RTK spot check")).toBe("RTK spot check");
  });
});
