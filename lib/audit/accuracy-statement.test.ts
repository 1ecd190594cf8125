/**
 * Sources: FGDC-STD-007.3-1998 (NSSDA) §3.2.3 (reporting statement "Tested __ (meters) horizontal accuracy at 95%
 * confidence level"), Appendix 3-A (Accuracy_r = 1.7308·RMSE_r); ASPRS Positional Accuracy Standards for Digital
 * Geospatial Data, Edition 2 (2023): RMSE_H = sqrt(RMSE_H1² + RMSE_H2²) (from memory), at least 30 checkpoints.
 */
import { describe, expect, it } from "vitest";
import { accuracyStatement } from "./accuracy-statement";

const base = { r95: 0.05, pairs: 40, surveyRmseH: null };

describe("accuracyStatement", () => {
  it("accuracyStatement -- NSSDA worked example, RMSE_x = RMSE_y", () => {
    // FGDC-STD-007.3-1998 Appendix 3-A: RMSE_r = sqrt(0.01² + 0.01²) = 0.014142; 1.7308 × 0.014142 = 0.02448
    const s = accuracyStatement({ ...base, rmseE: 0.01, rmseN: 0.01 });
    expect(s.nssda.case).toBe("case1");
    expect(s.nssda.value).toBeCloseTo(0.024477, 5);
    // FGDC-STD-007.3-1998 §3.2.3: reporting statement wording
    expect(s.nssda.sentence).toBe("Tested 0.0245 meters horizontal accuracy at 95% confidence level.");
  });

  it("accuracyStatement -- NSSDA with RMSE_r = 0.01 m gives 0.0173 m", () => {
    // FGDC-STD-007.3-1998 Appendix 3-A: Accuracy_r = 1.7308 × RMSE_r = 1.7308 × 0.01
    const c = 0.01 / Math.SQRT2;
    const s = accuracyStatement({ ...base, rmseE: c, rmseN: c });
    expect(s.nssda.value).toBeCloseTo(0.017308, 6);
    expect(s.nssda.sentence).toContain("Tested 0.0173 meters");
  });

  it("accuracyStatement -- no NSSDA statement when the formula does not apply", () => {
    // FGDC-STD-007.3-1998 Appendix 3-A: Case 2 only for 0.6 < RMSE_min/RMSE_max
    const s = accuracyStatement({ ...base, rmseE: 0.005, rmseN: 0.02 });
    expect(s.nssda.value).toBeNull();
    expect(s.nssda.sentence).toMatch(/^No NSSDA statement/);
    expect(s.nssda.sentence).not.toContain("Tested");
  });

  it("accuracyStatement -- ASPRS Ed. 2 combines the survey's own RMSE", () => {
    // ASPRS Ed. 2 (2023), from memory: RMSE_H = sqrt(RMSE_H1² + RMSE_H2²) = sqrt(0.010² + 0.005²) = 0.01118
    const h1 = 0.01 / Math.SQRT2; // RMSE_H1 = sqrt(RMSE_x² + RMSE_y²) = 0.010
    const s = accuracyStatement({ ...base, rmseE: h1, rmseN: h1, surveyRmseH: 0.005 });
    expect(s.asprs.rmseH1).toBeCloseTo(0.01, 12);
    expect(s.asprs.rmseH).toBeCloseTo(0.0111803, 7);
    expect(s.asprs.surveyAccounted).toBe(true);
    expect(s.asprs.sentence).toContain("RMSE_H = 0.0112 meters");
    expect(s.asprs.sentence).toContain("RMSE_H2 = 0.0050 m");
  });

  it("accuracyStatement -- ASPRS Ed. 2 says when the survey's error is not accounted for", () => {
    // ASPRS Ed. 2 (2023), from memory: without RMSE_H2 only RMSE_H1 can be reported
    const s = accuracyStatement({ ...base, rmseE: 0.006, rmseN: 0.008 });
    expect(s.asprs.rmseH).toBeCloseTo(0.01, 12);
    expect(s.asprs.rmseH2).toBeNull();
    expect(s.asprs.surveyAccounted).toBe(false);
    expect(s.asprs.sentence).toContain("not accounted for");
  });

  it("accuracyStatement -- notes too few checkpoints for each standard", () => {
    // FGDC-STD-007.3-1998 §3.2.2: at least 20; ASPRS Ed. 2 (2023) summary of changes: at least 30
    const s25 = accuracyStatement({ ...base, pairs: 25, rmseE: 0.01, rmseN: 0.01 });
    expect(s25.nssda.sentence).not.toContain("at least 20");
    expect(s25.asprs.sentence).toContain("at least 30");
    const s10 = accuracyStatement({ ...base, pairs: 10, rmseE: 0.01, rmseN: 0.01 });
    expect(s10.nssda.sentence).toContain("at least 20");
  });
});
