import { describe, expect, it } from "vitest";
import { PLAN_COLOURS, PLAN_HEX } from "@/app/(app)/plans/plan-map-colours";
import { AA, contrastRatio, over, type Rgb } from "@/lib/a11y/contrast";

// WCAG 2.2 §1.4.11 non-text contrast: each planned symbol stands out from the white field by 3:1.
const rgb = (c: readonly number[]): Rgb => [c[0], c[1], c[2]];
const hex = (h: string): Rgb => {
  const at = (i: number) => Number.parseInt(h.slice(i, i + 2), 16);
  return [at(1), at(3), at(5)];
};

describe("plan map colours", () => {
  it("plan map colours -- checkpoints, spares and control marks reach 3:1 on the white field", () => {
    const ground = rgb(PLAN_COLOURS.ground);
    for (const k of ["checkpoint", "spare", "mark"] as const) {
      expect(contrastRatio(rgb(PLAN_COLOURS[k]), ground), k).toBeGreaterThanOrEqual(AA.nonText);
      expect(PLAN_COLOURS[k][3], k).toBe(255);
    }
  });

  it("plan map colours -- the records stay faint (context, below 3:1) and the key uses the same colours", () => {
    const ground = rgb(PLAN_COLOURS.ground);
    const faint = over(rgb(PLAN_COLOURS.record), PLAN_COLOURS.record[3] / 255, ground);
    expect(contrastRatio(faint, ground)).toBeLessThan(AA.nonText);
    for (const k of ["checkpoint", "spare", "mark", "record"] as const)
      expect(hex(PLAN_HEX[k]), k).toEqual(rgb(PLAN_COLOURS[k]));
  });
});
