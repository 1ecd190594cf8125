/**
 * Sources: Plotproof style notes, habit 4 (the core is pure) — common practice, no source.
 * The map's helpers run on the server and in the browser: no I/O, clock, environment, randomness or framework.
 * The two benchmark scripts (bench-*.ts) are command-line tools and are left out.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const FORBIDDEN: Array<[RegExp, string]> = [
  [/\bDate\.now\s*\(/, "Date.now()"],
  [/\bnew Date\s*\(\s*\)/, "new Date()"],
  [/\bprocess\./, "process"],
  [/\bMath\.random\s*\(/, "Math.random()"],
  [/\bconsole\./, "console"],
  [/from\s+["'](node:|fs|path|os|child_process)/, "Node built-in import"],
  [/from\s+["'](next|react|react-dom|drizzle-orm|better-auth|swr|@deck\.gl\/[a-z-]+)(\/|["'])/, "framework import"],
  [/from\s+["']@\/(db|app)\//, "database or app import"],
  [/\brequire\s*\(/, "require()"],
  [/\bfetch\s*\(/, "fetch()"],
];

describe("lib/map purity", () => {
  const dir = import.meta.dirname;
  const files = readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts") && !f.startsWith("bench-"));

  it("purity -- the map's helpers are all scanned", () => {
    expect(files).toEqual(expect.arrayContaining(["binary.ts", "build.ts", "cells.ts", "colour-scale.ts", "geometry.ts", "guidance.ts", "select.ts", "view.ts"]));
  });

  it("purity -- no I/O, clock, environment, randomness or framework in the map's helpers", () => {
    for (const f of files) {
      const text = readFileSync(path.join(dir, f), "utf8");
      for (const [re, what] of FORBIDDEN) expect(re.test(text), `${f} uses ${what}`).toBe(false);
    }
  });
});
