import { describe, expect, it } from "vitest";
import { COLOURS } from "@/app/_components/map/palette";
import { AA, contrastRatio, over, type Rgb } from "@/lib/a11y/contrast";
import { OUT_OF_TOLERANCE_RGB, VIRIDIS_STOPS } from "@/lib/map/colour-scale";

// Every mark on the map stands out from what it is drawn on by 3:1 (WCAG 2.2 §1.4.11 non-text contrast): the bed
// (loam pale) and the field around the beds (white).
const rgb = (c: readonly number[]): Rgb => [c[0], c[1], c[2]];
const GROUNDS: [string, Rgb][] = [
  ["bed", rgb(COLOURS.bed)],
  ["field", rgb(COLOURS.field)],
];
const opaque = (c: readonly number[], ground: Rgb): Rgb => over(rgb(c), c[3] / 255, ground);

describe("map colours", () => {
  it("map colours -- every checkpoint, whatever its error colour, has an edge or fill at 3:1 on bed and field", () => {
    for (const [name, ground] of GROUNDS)
      for (const stop of VIRIDIS_STOPS) {
        const best = Math.max(contrastRatio(stop, ground), contrastRatio(opaque(COLOURS.pointOutline, ground), ground));
        expect(best, `viridis ${stop.join(",")} on ${name}`).toBeGreaterThanOrEqual(AA.nonText);
      }
  });

  it("map colours -- without the edge, the light end of viridis would vanish on a bed (why the edge is there)", () => {
    // the highest-error colour, viridis(1), on loam pale
    expect(contrastRatio(VIRIDIS_STOPS[16], rgb(COLOURS.bed))).toBeLessThan(1.5);
  });

  it("map colours -- unpaired symbols, the out-of-tolerance ring and the selection ring reach 3:1", () => {
    const marks: [string, readonly number[]][] = [
      ["out of tolerance ring", [...OUT_OF_TOLERANCE_RGB, 255]],
      ["record without a checkpoint", COLOURS.ring],
      ["surveyed, no record", COLOURS.surveyOnly],
      ["ambiguous survey point", COLOURS.ambiguous],
      ["selected", COLOURS.selected],
    ];
    for (const [ground, g] of GROUNDS)
      for (const [name, c] of marks)
        expect(contrastRatio(opaque(c, g), g), `${name} on ${ground}`).toBeGreaterThanOrEqual(AA.nonText);
  });
});
