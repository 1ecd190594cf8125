import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

// Integration test of `npm run audit`: spawns lib/cli/audit.ts on the fixture files of
// tests/fixtures/engine (written by generate.ts). Expected values are by construction: every
// as-planted record lies 10 mm west and 5 mm south of its plant, the survey has the plant positions,
// rows run at 28°; raw GNSS positions lie 30 mm east and 20 mm south of the plants.
const root = path.resolve(import.meta.dirname, "../..");
const fx = (name: string) => path.join("tests/fixtures/engine", name);

function audit(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "lib/cli/audit.ts", ...args], {
    cwd: root,
    encoding: "utf8",
    timeout: 60_000,
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("audit CLI", () => {
  it("audit CLI -- good files: exit 0 and the JSON summary on stdout", () => {
    const out = path.join(mkdtempSync(path.join(tmpdir(), "plotproof-")), "report.csv");
    const r = audit(
      "--planted",
      fx("planted-good.csv"),
      "--survey",
      fx("survey-good.csv"),
      "--survey-crs",
      "EPSG:32632",
      "--tolerance",
      "0.02",
      "--group-by",
      "arm,day",
      "--timezone",
      "Europe/Berlin",
      "--out",
      out,
    );
    expect(r.stderr).not.toMatch(/^error/m);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.pairs).toBe(89);
    expect(s.unmatchedPlanted).toBe(1);
    expect(s.unmatchedSurvey).toBe(1);
    expect(s.meanDE).toBeCloseTo(0.01, 3);
    expect(s.meanDN).toBeCloseTo(0.005, 3);
    expect(s.rmseR).toBeCloseTo(Math.hypot(0.01, 0.005), 3);
    expect(s.rowBearingDeg).toBeCloseTo(28, 2);
    expect(s.rowBearingSource).toBe("derived");
    expect(s.withinTolerance.share).toBe(1);
    expect(s.raw.meanDE).toBeCloseTo(-0.03, 3);
    expect(s.raw.meanDN).toBeCloseTo(0.02, 3);
    expect(s.groups.arm.map((g: { key: string }) => g.key).sort()).toEqual(["left", "right"]);
    expect(s.groups.day).toHaveLength(1);
    expect(s.run.workCrs).toBe("EPSG:32632");
    expect(s.run.warnings.map((w: { code: string }) => w.code)).toContain("fix-mixed");
    const csv = readFileSync(out, "utf8").split("\n");
    expect(csv[0]).toMatch(/^plant_id,/);
    expect(csv.filter(Boolean)).toHaveLength(90);
  });

  it("audit CLI -- survey with plant ids, semicolons and decimal commas pairs by id", () => {
    const r = audit(
      "--planted",
      fx("planted-good.csv"),
      "--survey",
      fx("survey-ids-semicolon.csv"),
      "--survey-crs",
      "EPSG:25832",
      "--match",
      "id",
      "--row-bearing",
      "28",
    );
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.pairs).toBe(25);
    expect(s.pairedById).toBe(25);
    expect(s.meanDE).toBeCloseTo(0.01, 3);
    expect(s.rowBearingSource).toBe("given");
  });

  it("audit CLI -- text in a coordinate column: exit 2 naming file, line 57, column and value", () => {
    const r = audit(
      "--planted",
      fx("planted-text-line57.csv"),
      "--survey",
      fx("survey-good.csv"),
      "--survey-crs",
      "EPSG:32632",
    );
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain(
      `error ${fx("planted-text-line57.csv")}:57 column "lat" value "fifty-two": expected a number`,
    );
    expect(r.stderr).toContain("(coordinate-not-numeric)");
  });

  it("audit CLI -- swapped latitude/longitude: exit 2, files far apart, columns look swapped", () => {
    const r = audit(
      "--planted",
      fx("planted-swapped.csv"),
      "--survey",
      fx("survey-good.csv"),
      "--survey-crs",
      "EPSG:32632",
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/files-far-apart/);
    expect(r.stderr).toContain(`In ${fx("planted-swapped.csv")} the two coordinate columns look swapped`);
  });

  it("audit CLI -- duplicate plant ids: exit 2 listing the lines", () => {
    const r = audit(
      "--planted",
      fx("planted-duplicate-ids.csv"),
      "--survey",
      fx("survey-good.csv"),
      "--survey-crs",
      "EPSG:32632",
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/plant id "AB-113" appears 2 times, on lines 5, 9/);
    expect(r.stderr).toMatch(/plant id "AB-124" appears 2 times, on lines 12, 13/);
  });

  it("audit CLI -- bad arguments and missing CRS exit 2 with a message", () => {
    expect(audit("--survey", fx("survey-good.csv")).stderr).toMatch(/--planted FILE is required/);
    const bad = audit("--planted", fx("planted-good.csv"), "--survey", fx("survey-good.csv"), "--max-distance=-1");
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--max-distance must be a positive number of metres/);
    const noCrs = audit("--planted", fx("planted-good.csv"), "--survey", fx("survey-good.csv"));
    expect(noCrs.code).toBe(2);
    expect(noCrs.stderr).toMatch(/crs-missing/);
    const missing = audit("--planted", fx("nope.csv"), "--survey", fx("survey-good.csv"), "--survey-crs", "EPSG:32632");
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/file-unreadable/);
    expect(audit("--planted", "a", "--survey", "b", "--bogus").code).toBe(2);
  });
});
