/**
 * Sources: Plotproof style notes, habit 4 (the core is pure) — common practice, no source.
 * Scans the production modules of lib/audit for I/O, clock, environment, randomness and framework imports.
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
  [/from\s+["'](next|react|react-dom|drizzle-orm|better-auth|swr)(\/|["'])/, "framework import"],
  [/\brequire\s*\(/, "require()"],
  [/\bfetch\s*\(/, "fetch()"],
];

describe("lib/audit purity", () => {
  const dir = import.meta.dirname;
  const files = readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts") && !f.endsWith(".d.ts") && f !== "test-helpers.ts");

  it("purity -- production modules exist", () => {
    expect(files).toContain("index.ts");
    expect(files.length).toBeGreaterThan(10);
  });

  it("purity -- no I/O, clock, environment, randomness or framework in production modules", () => {
    for (const f of files) {
      const text = readFileSync(path.join(dir, f), "utf8");
      for (const [re, what] of FORBIDDEN) expect(re.test(text), `${f} uses ${what}`).toBe(false);
    }
  });
});
