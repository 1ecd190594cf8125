import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
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
  const r = spawnSync(process.execPath, ["lib/cli/launch.mjs", "lib/cli/audit.ts", ...args], {
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

  // The verdict on the good files, by construction: every error is dE = +10 mm, dN = +5 mm, rows at 28°, so
  // radial = hypot(10, 5) = 11.18 mm; along = dE·sin 28° + dN·cos 28° = 9.11 mm;
  // |cross| = |dE·cos 28° − dN·sin 28°| = 6.48 mm (row-frame formulas, common practice, no source).
  const good = ["--planted", fx("planted-good.csv"), "--survey", fx("survey-good.csv"), "--survey-crs", "EPSG:32632"];
  const profileFile = (profile: object) => {
    const file = path.join(mkdtempSync(path.join(tmpdir(), "plotproof-")), "profile.json");
    writeFileSync(file, JSON.stringify(profile));
    return file;
  };

  it("audit CLI -- --tolerance is a radial-only profile: verdict in the JSON and as text on stderr", () => {
    const r = audit(...good, "--tolerance", "0.012");
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.run.profile).toMatchObject({ radialM: 0.012, crossM: null, alongM: null, requiredShare: 0.95 });
    expect(s.verdict.passed).toBe(true);
    expect(s.verdict.criteria.map((c: { id: string }) => c.id)).toEqual(["checkpoints", "radial", "share"]);
    const radial = s.verdict.criteria.find((c: { id: string }) => c.id === "radial");
    expect(radial.observed).toBeCloseTo(Math.hypot(0.01, 0.005), 3);
    expect(r.stderr).toMatch(/^verdict: PASSED against profile "radial 0.012 m"$/m);
    expect(r.stderr).toMatch(/^ {2}pass {2}radial {7}95 % of radial errors within 11\.\d mm; limit 12\.0 mm$/m);
  });

  it("audit CLI -- --profile judges cross-row and along-row limits; a failed verdict still exits 0 unless asked", () => {
    const file = profileFile({
      name: "In-row weeding",
      radialM: null,
      crossM: 0.006,
      alongM: 0.0095,
      requiredShare: 0.9,
      minCheckpoints: 50,
    });
    const r = audit(...good, "--profile", file);
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    const byId = Object.fromEntries(s.verdict.criteria.map((c: { id: string }) => [c.id, c]));
    expect(byId.cross.observed).toBeCloseTo(0.00648, 3);
    expect(byId.cross.passed).toBe(false);
    expect(byId.along.observed).toBeCloseTo(0.00911, 3);
    expect(byId.along.passed).toBe(true);
    expect(byId.checkpoints).toMatchObject({ observed: 89, limit: 50, passed: true });
    expect(s.verdict.passed).toBe(false);
    expect(s.run.profile).toMatchObject({ name: "In-row weeding", confidence: 0.95 });
    expect(r.stderr).toMatch(/^verdict: FAILED against profile "In-row weeding"$/m);
    expect(r.stderr).toMatch(/^ {2}FAIL {2}cross /m);
    expect(audit(...good, "--profile", file, "--fail-on-verdict").code).toBe(3);
  });

  it("audit CLI -- a bad profile file or two profiles exit 2 naming the file and the field", () => {
    const file = profileFile({ name: "x", radialM: 0.02, requiredShare: 0.95, minCheckpoints: 20, radial_m: 1 });
    const bad = audit(...good, "--profile", file);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain(`error: --profile ${file}: unknown field radial_m`);
    const file2 = profileFile({ name: "x", radialM: 20, requiredShare: 0.95, minCheckpoints: 20 });
    expect(audit(...good, "--profile", file2).stderr).toContain(
      `error: --profile ${file2}: radialM: Limits are in metres; 1 m is the largest accepted.`,
    );
    const both = audit(...good, "--profile", file2, "--tolerance", "0.02");
    expect(both.code).toBe(2);
    expect(both.stderr).toMatch(/either --profile or --tolerance/);
    expect(bad.stdout).toBe("");
  });
});
