import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// Style rule of this project (shared/notes/style.md, habit 4): the core is pure — no framework, no
// file or network I/O, no clock, no environment. This test greps geo/ sources (not tests) for them.
const FORBIDDEN: [RegExp, string][] = [
  [/from\s+["']node:/, "node: import"],
  [/from\s+["'](fs|path|os|http|https|net|child_process|worker_threads|react|next)(\/[^"']*)?["']/, "framework or I/O import"],
  [/\bDate\.now\s*\(/, "Date.now()"],
  [/new Date\(\s*\)/, "new Date() (reads the clock)"],
  [/\bprocess\./, "process.*"],
  [/\bfetch\s*\(/, "fetch()"],
  [/\bMath\.random\s*\(/, "Math.random()"],
];

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    if (statSync(p).isDirectory()) return sources(p);
    return p.endsWith(".ts") && !p.endsWith(".test.ts") ? [p] : [];
  });
}

describe("purity", () => {
  it("geo sources -- no I/O, clock, environment or framework", () => {
    const found: string[] = [];
    for (const file of sources(path.resolve(import.meta.dirname))) {
      const text = readFileSync(file, "utf8");
      for (const [re, what] of FORBIDDEN) if (re.test(text)) found.push(`${path.relative(import.meta.dirname, file)}: ${what}`);
    }
    expect(found).toEqual([]);
  });

  it("geo sources -- every exported function has a JSDoc comment", () => {
    const missing: string[] = [];
    for (const file of sources(path.resolve(import.meta.dirname))) {
      const lines = readFileSync(file, "utf8").split("\n");
      lines.forEach((l, i) => {
        if (/^export (async )?function/.test(l) && !/\*\/\s*$/.test(lines[i - 1] ?? "")) missing.push(`${path.relative(import.meta.dirname, file)}:${i + 1}`);
      });
    }
    expect(missing).toEqual([]);
  });
});
