/**
 * Sources: FGDC-STD-007.3-1998 §3.2.2 (at least 20 checkpoints); the rest is our own profile contract
 * (common practice, no source).
 */
import { describe, expect, it } from "vitest";
import { hasAnyLimit, radialToleranceProfile, toleranceProfileSchema } from "./profile";

describe("tolerance profile", () => {
  it("toleranceProfileSchema -- fills the defaults and refuses a limit in millimetres typed as metres", () => {
    const p = toleranceProfileSchema.parse({
      name: " In-row ",
      radialM: 0.01,
      requiredShare: 0.95,
      minCheckpoints: 20,
    });
    // common practice, no source: 95 % confidence unless the profile says otherwise.
    expect(p).toEqual({
      name: "In-row",
      radialM: 0.01,
      crossM: null,
      alongM: null,
      requiredShare: 0.95,
      confidence: 0.95,
      minCheckpoints: 20,
    });
    const bad = toleranceProfileSchema.safeParse({ ...p, crossM: 8 });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]).toMatchObject({ path: ["crossM"], message: expect.stringMatching(/in metres/) });
  });

  it("hasAnyLimit -- a profile without limits checks nothing", () => {
    expect(hasAnyLimit({ radialM: null, crossM: null, alongM: null })).toBe(false);
    expect(hasAnyLimit({ radialM: null, crossM: null, alongM: 0.02 })).toBe(true);
  });

  it("radialToleranceProfile -- radial limit only, 95 % share at 95 % confidence, 20 checkpoints", () => {
    const p = radialToleranceProfile(0.02);
    expect(p).toMatchObject({ radialM: 0.02, crossM: null, alongM: null, requiredShare: 0.95, confidence: 0.95 });
    expect(p.minCheckpoints).toBe(20); // FGDC-STD-007.3-1998 §3.2.2
    expect(() => radialToleranceProfile(0)).toThrow(/profile: a radial tolerance must be more than 0/);
  });
});
