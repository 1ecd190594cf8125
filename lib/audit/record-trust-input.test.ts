import { describe, expect, it } from "vitest";
import { recordTrustInput, stratumLabel, type StoredPairColumns } from "./record-trust-input";
import { makeTable } from "./test-helpers";

const profile = { requiredShare: 0.95, confidence: 0.95, radialM: 0.01, crossM: 0.008, alongM: null };

const table = makeTable({
  role: "planted",
  x: [0, 1, 2, 3],
  y: [0, 0, 0, 0],
  id: ["A-1", "A-2", "B-1", "B-1"],
  attrs: {
    fix: ["rtk-fixed", "rtk-float", "rtk-fixed", ""],
    arm: ["1", "1", "2", "2"],
    bed: ["1", "1", "2", "2"],
    row: ["1", "2", "1", "1"],
  },
  // 2026-04-14 23:30 and 2026-04-15 00:30 in Amsterdam (CEST, UTC+2) — IANA tz database
  time: [Date.UTC(2026, 3, 14, 21, 30), Date.UTC(2026, 3, 14, 22, 30), Date.UTC(2026, 3, 14, 22, 31), Number.NaN],
});

function pairs(over: Partial<StoredPairColumns> = {}): StoredPairColumns {
  return {
    count: 3,
    plantId: ["A-2", "B-1", ""],
    fix: ["rtk-float", "rtk-fixed", "ppp"],
    arm: ["1", "2", "3"],
    day: ["2026-04-15", "2026-04-15", ""],
    bed: ["1", "2", "7"],
    row: ["2", "1", "1"],
    radial: Float32Array.of(0.004, 0.02, 0.001),
    cross: Float32Array.of(0.009, 0.001, Number.NaN),
    along: Float32Array.of(0.001, 0.02, Number.NaN),
    within: Int8Array.of(1, 0, 1),
    ...over,
  };
}

describe("recordTrustInput", () => {
  it("record trust input -- pairs take their record's strata; a repeated or missing id keeps the stored texts", () => {
    const input = recordTrustInput({ table, pairs: pairs(), timeZone: "Europe/Amsterdam", profile });
    expect(input.pairs.record).toEqual(Int32Array.of(1, -1, -1)); // "B-1" is repeated in the file
    const fix = input.strata.find((s) => s.dimension === "fix")!;
    expect(fix.values).toEqual(["rtk-fixed", "rtk-float", "ppp"]);
    expect([...fix.recordCodes]).toEqual([0, 1, 0, -1]);
    expect([...fix.pairCodes]).toEqual([1, 0, 2]);
    const day = input.strata.find((s) => s.dimension === "day")!;
    expect(day.values).toEqual(["2026-04-14", "2026-04-15"]);
    expect([...day.recordCodes]).toEqual([0, 1, 1, -1]);
    const bedRow = input.strata.find((s) => s.dimension === "bedRow")!;
    expect(bedRow.values.map((v) => stratumLabel("bedRow", v))).toEqual([
      "bed 1, row 1",
      "bed 1, row 2",
      "bed 2, row 1",
      "bed 7, row 1",
    ]);
    expect(input.pairs.within).toEqual(Int8Array.of(1, 0, 1));
  });

  it("record trust input -- judged again for another operation, a limit counts only where its error is known", () => {
    const input = recordTrustInput({ table, pairs: pairs(), timeZone: "Europe/Amsterdam", profile, rejudge: true });
    // Pair 1: cross 9 mm > 8 mm. Pair 2: radial 20 mm > 10 mm. Pair 3: no cross error known, radial 1 mm.
    expect(input.pairs.within).toEqual(Int8Array.of(0, 0, 0));
    const loose = { ...profile, radialM: 0.05, crossM: 0.01 };
    const again = recordTrustInput({
      table,
      pairs: pairs(),
      timeZone: "Europe/Amsterdam",
      profile: loose,
      rejudge: true,
    });
    expect(again.pairs.within).toEqual(Int8Array.of(1, 1, 0));
  });

  it("record trust input -- a file without a stratum's column has no such stratum", () => {
    const bare = makeTable({ role: "planted", x: [0], y: [0], id: ["X"] });
    const input = recordTrustInput({
      table: bare,
      pairs: pairs({
        count: 0,
        plantId: [],
        fix: [],
        arm: [],
        day: [],
        bed: [],
        row: [],
        radial: [],
        cross: [],
        along: [],
        within: new Int8Array(),
      }),
      timeZone: "UTC",
      profile,
    });
    expect(input.strata).toEqual([]);
    expect(input.recordCount).toBe(1);
  });

  it("stratum label -- each dimension in words", () => {
    expect(stratumLabel("fix", "rtk-float")).toBe("fix quality rtk-float");
    expect(stratumLabel("arm", "3")).toBe("tool arm 3");
    expect(stratumLabel("day", "2026-04-15")).toBe("planting day 2026-04-15");
    expect(stratumLabel("bedRow", "4")).toBe("bed 4");
  });
});
