/**
 * Differences are plain Pythagoras (3-4-5 triangles, exact). The 2× / 3× precision thresholds are common practice,
 * no source; the third of the tightest limit is ASPRS Positional Accuracy Standards Ed. 1 (2014) "three times more
 * accurate" (from memory, as in lib/review/checklist.ts).
 */
import { describe, expect, it } from "vitest";
import { checkControlMark } from "./instrument-check";

const known = { e: 662_400, n: 5_821_300, h: 1.2 };
const at = (dEmm: number, dNmm: number, h?: number) => ({ e: known.e + dEmm / 1000, n: known.n + dNmm / 1000, h });

describe("checkControlMark", () => {
  it("checkControlMark -- 3-4-5 mm differences within 2 × 5 mm and a third of 30 mm: meets", () => {
    const c = checkControlMark({
      markName: "KF-03",
      known,
      before: at(3, 4, 1.203),
      after: at(-3, 4),
      precisionMm: 5,
      tightestLimitM: 0.03,
    });
    expect(c.before.d).toBeCloseTo(0.005, 9); // Pythagoras 3-4-5
    expect(c.before.dH).toBeCloseTo(0.003, 9);
    expect(c.after!.dH).toBeNull();
    expect(c.drift).toBeCloseTo(0.006, 9);
    expect(c.meetsUpToM).toBeCloseTo(0.01, 12);
    expect(c.word).toBe("meets");
    expect(c.reasons[0]).toContain("before 5 mm, after 5 mm: both within 10 mm");
  });

  it("checkControlMark -- between 2 and 3 × the precision: check", () => {
    // 6-8-10 mm with 4 mm precision: 8 mm < 10 mm ≤ 12 mm (common practice, no source)
    const c = checkControlMark({
      markName: "KF-03",
      known,
      before: at(6, 8),
      after: at(0, 1),
      precisionMm: 4,
      tightestLimitM: 0.08,
    });
    expect(c.word).toBe("check");
    expect(c.reasons.join(" ")).toContain("10 mm, is between 2 and 3 × the stated precision (8 mm–12 mm)");
  });

  it("checkControlMark -- over a third of the tightest limit: fails, with the numbers", () => {
    // 9-12-15 mm; limit 30 mm ÷ 3 = 10 mm (ASPRS Ed. 1 ratio, from memory)
    const c = checkControlMark({
      markName: "KF-03",
      known,
      before: at(9, 12),
      after: at(0, 0),
      precisionMm: 8,
      tightestLimitM: 0.03,
    });
    expect(c.word).toBe("fails");
    expect(c.reasons.join(" ")).toContain("over a third of the tightest limit (30 mm ÷ 3 = 10 mm)");
  });

  it("checkControlMark -- no after-measurement is at best check", () => {
    const c = checkControlMark({
      markName: "KF-03",
      known,
      before: at(1, 0),
      after: null,
      precisionMm: 5,
      tightestLimitM: null,
    });
    expect(c.word).toBe("check");
    expect(c.drift).toBeNull();
    expect(c.reasons.join(" ")).toContain("not measured again after the survey");
  });

  it("checkControlMark -- more than ten times the precision away is refused with the numbers", () => {
    expect(() =>
      checkControlMark({
        markName: "KF-03",
        known,
        before: at(0, 0),
        after: at(30, 40),
        precisionMm: 2,
        tightestLimitM: 0.03,
      }),
    ).toThrow(
      "control mark: the measurement after the survey lies 50 mm from the known position of KF-03 (east 30 mm, north 40 mm), more than ten times the instrument's stated precision (10 × 2 mm = 20 mm)",
    );
  });

  it("checkControlMark -- a precision of zero is refused", () => {
    expect(() =>
      checkControlMark({ markName: "X", known, before: at(0, 0), after: null, precisionMm: 0, tightestLimitM: null }),
    ).toThrow(/stated precision must be a number of millimetres above 0/);
  });
});
