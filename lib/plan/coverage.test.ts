/** Coverage and the unpaired split are our own bookkeeping rules (common practice, no source): counted by hand here. */
import { describe, expect, it } from "vitest";
import { surveyCoverage, unpairedSplit, type PlanPointRef } from "./coverage";

const POINTS: PlanPointRef[] = [
  { name: "C0001-B1", plantId: "LA-1-1-0006", stratum: "bed 1", spare: false },
  { name: "C0002-B1", plantId: "LA-1-2-0040", stratum: "bed 1", spare: false },
  { name: "C0003-B1", plantId: "LA-1-4-0100", stratum: "bed 1", spare: false },
  { name: "S0001-B1", plantId: "LA-1-3-0070", stratum: "bed 1", spare: true },
  { name: "C0004-B2", plantId: "LA-2-1-0010", stratum: "bed 2", spare: false },
  { name: "C0005-B2", plantId: "LA-2-5-0150", stratum: "bed 2", spare: false },
];
const STRATA = [
  { key: "bed 1", minimum: 3 },
  { key: "bed 2", minimum: 2 },
];

describe("surveyCoverage", () => {
  it("surveyCoverage -- rows of the file's status column count as recorded missing, with their line", () => {
    const c = surveyCoverage(
      POINTS,
      STRATA,
      ["C0001-B1", "LA-1-2-0040", "S0001-B1", "LA-2-1-0010"],
      [
        { name: "C0003-B1", status: "dead", line: 6 },
        { name: "LA-2-5-0150", status: "not found", line: 7 },
        { name: "C0005-B2", status: "dead" },
      ],
    );
    expect(c.checkpointsSurveyed).toBe(3);
    expect(c.missing).toEqual([
      { name: "C0003-B1", plantId: "LA-1-4-0100", stratum: "bed 1", status: "dead", line: 6 },
      // a report by point name (here the form's) comes before one by plant id (the file's line 7)
      { name: "C0005-B2", plantId: "LA-2-5-0150", stratum: "bed 2", status: "dead" },
    ]);
    expect(c.extra.count).toBe(0);
  });

  it("surveyCoverage -- names or plant ids count; a spare stands in; reported and absent points; extras", () => {
    const c = surveyCoverage(
      POINTS,
      STRATA,
      ["C0001-B1", "LA-1-2-0040", "S0001-B1", "LA-2-1-0010", "", "WEED-7", "C0001-B1"],
      [{ name: "C0003-B1", status: "dead" }],
    );
    expect(c.planned).toBe(5);
    expect(c.checkpointsSurveyed).toBe(3);
    expect(c.sparesSurveyed).toBe(1);
    expect(c.missing).toEqual([
      { name: "C0003-B1", plantId: "LA-1-4-0100", stratum: "bed 1", status: "dead" },
      { name: "C0005-B2", plantId: "LA-2-5-0150", stratum: "bed 2", status: "absent" },
    ]);
    expect(c.extra).toEqual({ count: 2, unnamed: 1, ids: ["WEED-7"] });
    expect(c.strata).toEqual([
      { key: "bed 1", minimum: 3, surveyed: 3, meets: true },
      { key: "bed 2", minimum: 2, surveyed: 1, meets: false },
    ]);
    expect(c.allStrataMeet).toBe(false);
  });

  it("surveyCoverage -- a survey matching no plan point gets a message with the numbers", () => {
    expect(() => surveyCoverage(POINTS, STRATA, ["X1", "X2", ""], [])).toThrow(
      "coverage: none of the 2 named survey points matches a point of the plan (6 points, e.g. C0001-B1 / LA-1-1-0006, C0002-B1 / LA-1-2-0040)",
    );
  });

  it("surveyCoverage -- a survey with no ids at all is not refused (paired by position)", () => {
    const c = surveyCoverage(POINTS, STRATA, ["", ""], []);
    expect(c.checkpointsSurveyed).toBe(0);
    expect(c.missing.length).toBe(5);
  });
});

describe("unpairedSplit", () => {
  it("unpairedSplit -- the three kinds", () => {
    expect(unpairedSplit("planted-not-found", false)).toBe("not-sampled");
    expect(unpairedSplit("planted-not-found", true)).toBe("sampled-not-found");
    expect(unpairedSplit("surveyed-not-planted", false)).toBe("surveyed-no-record");
    expect(unpairedSplit("ambiguous", false)).toBe("ambiguous");
  });
});
