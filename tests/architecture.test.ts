/**
 * The layer rules (.dependency-cruiser.cjs) and the core's Biome override (biome.jsonc, .biome/core-purity.grit)
 * catch what they are meant to catch: each deliberate violation in tests/fixtures/layers is reported under its rule's
 * name, the real tree has none, and Biome reports the clock, randomness, environment, network, CommonJS and console in
 * a core file but not elsewhere.
 */
import { spawnSync } from "node:child_process";
import { cpSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { cruise, type ICruiseResult } from "dependency-cruiser";
import extractDepcruiseOptions from "dependency-cruiser/config-utl/extract-depcruise-options";
import extractTSConfig from "dependency-cruiser/config-utl/extract-ts-config";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const ROOT = path.resolve(import.meta.dirname, "..");
const FIXTURE = path.join(ROOT, "tests/fixtures/layers");

/** The options and rules of .dependency-cruiser.cjs, as `npm run deps` reads them. */
function projectOptions() {
  return extractDepcruiseOptions(path.join(ROOT, ".dependency-cruiser.cjs"));
}

/** "rule: from → to" for every violation. */
/** "rule: from → to", an installed package named as imported (it resolves to a file under node_modules when present). */
function violations(result: ICruiseResult): string[] {
  const named = (to: string) => to.replace(/^(?:\.\.\/)*node_modules\/((?:@[^/]+\/)?[^/]+)\/.*$/, "$1");
  return result.summary.violations.map((v) => `${v.rule.name}: ${v.from} → ${named(v.to)}`).sort();
}

describe("layers", () => {
  it("dependency-cruiser -- every deliberate violation of the fixture tree is reported under its rule", async () => {
    const options = await projectOptions();
    const { output } = await cruise(["geo", "lib", "db", "app"], { ...options, baseDir: FIXTURE, tsConfig: undefined });
    const found = violations(output as ICruiseResult);
    // Exactly these: the files that keep the rules (geo/ok.ts, geo/units.ts, db/queries/ok.ts, lib/server/) break none.
    expect(found).toEqual([
      "audit-imports-only-audit-and-geo: lib/audit/uses-server.ts → lib/server/audits/run.ts",
      "core-not-to-db-app-or-server: geo/reads-db.ts → db/client.ts",
      "core-not-to-db-app-or-server: lib/audit/uses-server.ts → lib/server/audits/run.ts",
      "core-not-to-db-app-or-server: lib/map/reads-app.ts → app/page.ts",
      "core-not-to-node: geo/reads-files.ts → fs",
      "core-not-to-platform: lib/map/server-only.ts → server-only",
      "db-imports-lib-types-only: db/queries/calls-server.ts → lib/server/audits/run.ts",
      "db-imports-lib-types-only: db/queries/role-values.ts → lib/roles.ts",
      "db-not-to-server-or-app: db/queries/calls-server.ts → lib/server/audits/run.ts",
      "geo-imports-only-geo: geo/reads-db.ts → db/client.ts",
      "geo-imports-only-geo: geo/reads-files.ts → fs",
      "lib-not-to-db: lib/validation/reads-db.ts → db/client.ts",
      "lib-not-to-server: lib/audit/uses-server.ts → lib/server/audits/run.ts",
      "no-circular: lib/review/cycle-a.ts → lib/review/cycle-b.ts",
      "only-app-imports-app: lib/map/reads-app.ts → app/page.ts",
      "worker-entries-stay-plain: lib/audit-job/worker.ts → server-only",
    ]);
  });

  it("dependency-cruiser -- the project's own tree keeps every rule", { timeout: 120_000 }, async () => {
    const options = await projectOptions();
    const { output } = await cruise(["app", "db", "lib", "geo"], { ...options, baseDir: ROOT }, undefined, {
      tsConfig: extractTSConfig(path.join(ROOT, "tsconfig.json")),
    });
    const result = output as ICruiseResult;
    expect(result.summary.totalCruised).toBeGreaterThan(250);
    expect(violations(result)).toEqual([]);
  });
});

describe("core purity (Biome)", () => {
  let project: string;
  beforeAll(() => {
    // A copy of the project's Biome setup with the fixture placed in the core (geo/), outside it (lib/) and as a test.
    project = mkdtempSync(path.join(tmpdir(), "plotproof-purity-"));
    cpSync(path.join(ROOT, "biome.jsonc"), path.join(project, "biome.jsonc"));
    cpSync(path.join(ROOT, ".biome/core-purity.grit"), path.join(project, ".biome/core-purity.grit"));
    const fixture = path.join(ROOT, "tests/fixtures/core-purity/impure.ts");
    mkdirSync(path.join(project, "geo"));
    mkdirSync(path.join(project, "lib"));
    cpSync(fixture, path.join(project, "geo/impure.ts"));
    cpSync(fixture, path.join(project, "geo/impure.test.ts"));
    cpSync(fixture, path.join(project, "lib/impure.ts"));
  });
  afterAll(() => rmSync(project, { recursive: true, force: true }));

  function lint(file: string): string {
    const biome = path.join(ROOT, "node_modules/.bin/biome");
    const r = spawnSync(biome, ["lint", "--vcs-enabled=false", "--colors=off", "--max-diagnostics=100", file], {
      cwd: project,
      encoding: "utf8",
    });
    return `${r.stdout}${r.stderr}`;
  }

  it("biome -- a core file using the clock, randomness, environment, network, require or console fails", () => {
    const out = lint("geo/impure.ts");
    expect(out).toContain("core-purity: Date.now() reads the clock");
    expect(out).toContain("core-purity: new Date() with no argument reads the clock");
    expect(out).toContain("core-purity: Math.random() is not reproducible");
    expect(out.match(/core-purity: new Date\(\)/g)).toHaveLength(1); // new Date(0) is a fixed instant, not the clock
    for (const global of ["process", "fetch", "require"])
      expect(out).toContain(`Do not use the global variable ${global}.`);
    expect(out).toContain("lint/suspicious/noConsole");
  });

  it("biome -- the same code outside the core, or in a core test, passes", () => {
    for (const file of ["lib/impure.ts", "geo/impure.test.ts"]) {
      const out = lint(file);
      expect(out).not.toContain("core-purity");
      expect(out).not.toContain("noRestrictedGlobals");
      expect(out).not.toContain("noConsole");
      expect(out).toContain("Checked 1 file");
    }
  });
});
