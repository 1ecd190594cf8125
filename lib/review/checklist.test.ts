import { describe, expect, it } from "vitest";
import {
  INSTRUMENT_RATIO,
  evaluateChecklist,
  medianFinite,
  namesMatch,
  tightestLimit,
  type ChecklistContext,
} from "./checklist";

const ctx: ChecklistContext = {
  pairs: 369,
  minCheckpoints: 50,
  tightestLimitM: 0.008,
  filePrecisionM: 0.002,
  profileName: "In-row weeding around plants",
  operation: "Tools that close between plants in the row",
};
const all = { checkpoints: true, instrument: true, controlMark: true, profileFits: true };

describe("checklist", () => {
  it("evaluateChecklist -- all confirmed with a 2 mm instrument against an 8 mm limit: recorded with the ratio", () => {
    const r = evaluateChecklist(ctx, { ...all, controlMarkNote: "  KF-03, 1 mm off  " });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.record.instrument).toEqual({
      confirmed: true,
      precisionMm: 2,
      source: "survey file",
      tightestLimitMm: 8,
      ratio: 4,
      requiredRatio: 3,
    });
    expect(r.record.controlMark.note).toBe("KF-03, 1 mm off");
    expect(r.record.checkpoints).toEqual({ confirmed: true, pairs: 369, required: 50 });
  });

  it("evaluateChecklist -- every unticked item is named", () => {
    const r = evaluateChecklist(ctx, { checkpoints: false, instrument: false, controlMark: false, profileFits: false });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.path.join("."))).toEqual([
      "checklist.checkpoints",
      "checklist.instrument",
      "checklist.controlMark",
      "checklist.profileFits",
    ]);
  });

  it("evaluateChecklist -- too few checkpoints cannot be confirmed", () => {
    const r = evaluateChecklist({ ...ctx, pairs: 31 }, all);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0].message).toBe(
        "Only 31 checkpoints were paired; the profile asks for at least 50. Return the audit for more checkpoints instead.",
      );
  });

  it("evaluateChecklist -- a survey not three times finer than the tightest limit is refused with the needed precision", () => {
    // 5 mm limit / 2 mm survey = 2.5 < 3 (ASPRS Ed. 1 rule of thumb, from memory)
    const r = evaluateChecklist({ ...ctx, tightestLimitM: 0.005 }, all);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0].message).toContain(
        "only 2.5 times finer than the tightest limit (5.0 mm); at least 3 times is needed, i.e. 1.7 mm or better",
      );
    expect(INSTRUMENT_RATIO).toBe(3);
  });

  it("evaluateChecklist -- exactly three times finer passes (the boundary is inclusive)", () => {
    expect(evaluateChecklist({ ...ctx, tightestLimitM: 0.006 }, all).ok).toBe(true);
  });

  it("evaluateChecklist -- without a precision column the signer must state the instrument's precision", () => {
    const noFile = { ...ctx, filePrecisionM: null };
    const r = evaluateChecklist(noFile, all);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].path).toEqual(["checklist", "instrumentPrecisionMm"]);
    const stated = evaluateChecklist(noFile, { ...all, instrumentPrecisionMm: 1 });
    expect(stated.ok && stated.record.instrument).toEqual({
      confirmed: true,
      precisionMm: 1,
      source: "signer",
      tightestLimitMm: 8,
      ratio: 8,
      requiredRatio: 3,
    });
  });

  it("tightestLimit -- the smallest limit that is set", () => {
    expect(tightestLimit({ radialM: 0.01, crossM: 0.008, alongM: null })).toBe(0.008);
    expect(tightestLimit({ radialM: null, crossM: null, alongM: null })).toBeNull();
  });

  it("medianFinite -- ignores NaN; even count averages the middle two", () => {
    expect(medianFinite(new Float64Array([0.002, NaN, 0.004, 0.001, 0.003]))).toBe(0.0025);
    expect(medianFinite(new Float64Array([NaN]))).toBeNull();
    expect(medianFinite(null)).toBeNull();
  });

  it("namesMatch -- case and spacing do not matter, other names do", () => {
    expect(namesMatch("  idris   COOMBE ", "Idris Coombe")).toBe(true);
    expect(namesMatch("Idris", "Idris Coombe")).toBe(false);
    expect(namesMatch("", "")).toBe(false);
  });
});
