import { describe, expect, it } from "vitest";
import { bedRowTable } from "./bed-row";
import { simulatePairs } from "../test-helpers";

// Sources: cell means are the arithmetic mean of the cell's cross-row errors, recomputed here by hand; natural order and
// counts follow the simulated layout (common practice, no source).

describe("bedRowTable", () => {
  it("bedRowTable -- one cell per bed and row in natural order with counts and means", () => {
    // expected: 2 beds × 4 rows of the simulation; 5 float checkpoints planted in row 6 (common practice, no source)
    const pairs = simulatePairs({ rows: 8, float: { rows: [6], from: 0, to: 4, along: 0.03, cross: 0 } });
    const t = bedRowTable(pairs);
    expect(t.map((c) => `${c.bed}/${c.row}`)).toEqual(["1/1", "1/2", "1/3", "1/4", "2/1", "2/2", "2/3", "2/4"]);
    expect(t[5].degraded).toBe(5);
    const cell = pairs.filter((p) => p.bed === "1" && p.row === "2");
    expect(t[1].meanCross).toBeCloseTo(cell.reduce((s, p) => s + p.cross!, 0) / cell.length, 12);
  });
});
