import { describe, expect, it } from "vitest";
import { makeTable } from "@/lib/audit/test-helpers";
import { availableGroups, computeFromTables } from "./compute";

// Invented positions (demo only): four plants 0.3 m apart, surveyed a few millimetres off.
const plantedXY = { x: [500000, 500000.3, 500000.6, 500000.9], y: [5800000, 5800000, 5800000, 5800000] };
const survey = makeTable({
  role: "survey",
  x: [500000.002, 500000.301, 500000.598, 500000.903],
  y: [5800000.001, 5799999.998, 5800000.002, 5800000],
});
const settings = {
  match: "nearest" as const,
  maxDistanceM: 0.1,
  rowBearingDeg: 90,
  timeZone: "Europe/Amsterdam",
  workCrs: "EPSG:32631",
};
const profile = {
  id: "p",
  name: "test",
  operation: "test",
  radialM: 0.01,
  crossM: null,
  alongM: null,
  requiredShare: 0.5,
  confidence: 0.95,
  minCheckpoints: 1,
};

describe("audit computation for the web app", () => {
  it("availableGroups -- only breakdowns the files can give", () => {
    const bare = makeTable({ role: "planted", ...plantedXY });
    expect(availableGroups(bare, survey)).toEqual([]);
    const rich = makeTable({
      role: "planted",
      ...plantedXY,
      attrs: { arm: ["L", "L", "R", "R"], fix: ["rtk-fixed", "rtk-fixed", "rtk-fixed", "rtk-float"] },
      time: [0, 1, 2, 3],
    });
    expect(
      availableGroups(rich, makeTable({ role: "survey", ...plantedXY, attrs: { crop: ["a", "a", "a", "a"] } })),
    ).toEqual(["arm", "crop", "fix", "day"]);
  });

  it("computeFromTables -- files without times, arms or crops still give a result, without those breakdowns", () => {
    const planted = makeTable({ role: "planted", ...plantedXY, attrs: { bed: ["1", "1", "1", "1"] } });
    const out = computeFromTables(planted, "EPSG:32631", survey, "EPSG:32631", settings, profile);
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(out.result.summary.pairs).toBe(4);
    expect(Object.keys(out.result.summary.groups ?? {})).toEqual(["bed"]);
  });
});
