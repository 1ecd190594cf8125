import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { impurities } from "@/tests/purity-rules";

// The core is pure (rules in tests/purity-rules.ts); this test scans geo/ sources (not tests).
function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    if (statSync(p).isDirectory()) return sources(p);
    return p.endsWith(".ts") && !p.endsWith(".test.ts") ? [p] : [];
  });
}

describe("purity", () => {
  it("geo sources -- no I/O, clock, environment or framework", () => {
    expect(impurities(import.meta.dirname, sources(path.resolve(import.meta.dirname)))).toEqual([]);
  });

  it("geo sources -- every exported function has a JSDoc comment", () => {
    const missing: string[] = [];
    for (const file of sources(path.resolve(import.meta.dirname))) {
      const lines = readFileSync(file, "utf8").split("\n");
      lines.forEach((l, i) => {
        if (/^export (async )?function/.test(l) && !/\*\/\s*$/.test(lines[i - 1] ?? ""))
          missing.push(`${path.relative(import.meta.dirname, file)}:${i + 1}`);
      });
    }
    expect(missing).toEqual([]);
  });
});
