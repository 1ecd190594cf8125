import { describe, expect, it } from "vitest";
import { degradedFixEpisodes, errorJumps, passSeries, type PlantedTrack } from "./episodes";
import { simulatePairs } from "../test-helpers";

// Sources: the error-jump rule is median + 3 scaled MAD (Hampel, J. Amer. Statist. Assoc. 69 (1974) 383–393; scale
// 1.4826 for the normal); episode ranges are the float stretches planted in the hand-built track (common practice, no source).

/** Every record of rows 1–4 (100 plants each, 3 s apart, side by side); rows 2–3 plants 31–80 float. */
function track(): PlantedTrack {
  const n = 400;
  const t0 = Date.UTC(2026, 3, 14, 8);
  const row = (i: number) => Math.floor(i / 100) + 1;
  const k = (i: number) => i % 100;
  const float = (i: number) => (row(i) === 2 || row(i) === 3) && k(i) >= 30 && k(i) < 80;
  return {
    length: n,
    time: Float64Array.from({ length: n }, (_, i) => t0 + k(i) * 3000),
    id: (i) => `P-${row(i)}-${String(k(i) + 1).padStart(4, "0")}`,
    fix: (i) => (float(i) ? "rtk-float" : "rtk-fixed"),
    bed: () => "1",
    row: (i) => String(row(i)),
    arm: (i) => String(row(i)),
  };
}

describe("degradedFixEpisodes", () => {
  it("degradedFixEpisodes -- one episode with the exact plant range of each row", () => {
    // expected: rows 2–3, plants 31–80 set to float in track() above, 3 s apart (common practice, no source)
    const eps = degradedFixEpisodes(track(), []);
    expect(eps).toHaveLength(1);
    expect(eps[0].parts.map((p) => [p.row, p.firstPlantId, p.lastPlantId, p.count])).toEqual([
      ["2", "P-2-0031", "P-2-0080", 50],
      ["3", "P-3-0031", "P-3-0080", 50],
    ]);
    expect(eps[0].count).toBe(100);
    expect(eps[0].fixValues).toEqual(["rtk-float"]);
    expect(eps[0].end! - eps[0].start!).toBe(49 * 3000);
  });
  it("degradedFixEpisodes -- two outages far apart in time are two episodes", () => {
    // expected: plants 91–100 of row 1 set to DGPS, 33 s after the float stretch (common practice, no source)
    const t = track();
    const base = t.fix;
    const k = (i: number) => i % 100;
    // 33 s after the float stretch ends: apart with a 10 s merging gap
    const eps = degradedFixEpisodes({ ...t, fix: (i) => (i < 100 && k(i) >= 90 ? "DGPS" : base(i)) }, [], 10_000);
    expect(eps).toHaveLength(2);
    expect(eps[1].parts[0]).toMatchObject({ row: "1", firstPlantId: "P-1-0091", lastPlantId: "P-1-0100", count: 10 });
  });
});

describe("errorJumps", () => {
  it("errorJumps -- finds a run of large errors and marks it as explained by the float fix", () => {
    // expected: the float stretch planted in rows 2–3 of the simulation; Hampel (1974) 3-MAD rule flags it
    const pairs = simulatePairs({ rows: 4, float: { rows: [2, 3], from: 10, to: 20, along: 0.03, cross: 0.012 } });
    const fixEps = degradedFixEpisodes(
      {
        length: pairs.length,
        time: Float64Array.from(pairs, (p) => p.time!),
        id: (i) => pairs[i].plantId,
        fix: (i) => pairs[i].fix,
        bed: (i) => pairs[i].bed,
        row: (i) => pairs[i].row,
        arm: (i) => pairs[i].arm,
      },
      pairs,
    );
    expect(fixEps[0].checkpoints).toBe(22);
    const jumps = errorJumps(pairs, fixEps);
    expect(jumps).toHaveLength(1);
    expect(jumps[0].parts.map((p) => [p.row, p.firstPlantId, p.lastPlantId])).toEqual([
      ["2", "HB-2-0101", "HB-2-0201"],
      ["3", "HB-3-0101", "HB-3-0201"],
    ]);
    expect(jumps[0].duringDegradedFix).toBe(true);
  });
  it("errorJumps -- nothing on clean data", () => {
    // Hampel (1974): no value beyond median + 3 scaled MAD in simulated N(0, σ) errors of this seed
    expect(errorJumps(simulatePairs({ rows: 4 }), [])).toEqual([]);
  });
});

describe("passSeries", () => {
  it("passSeries -- planting order, unknown times last", () => {
    // common practice, no source: checkpoints without a planting time go last
    const pairs = simulatePairs({ rows: 2, checkpointsPerRow: 3 });
    pairs[0] = { ...pairs[0], time: null };
    const s = passSeries(pairs);
    expect(s[s.length - 1].seq).toBe(0);
    for (let i = 1; i < s.length - 1; i++) expect(s[i].time!).toBeGreaterThanOrEqual(s[i - 1].time!);
  });
});
