import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// Style notes, habit 6: every exported core function has a JSDoc comment. (Purity is checked by dependency-cruiser
// and Biome: .dependency-cruiser.cjs, biome.jsonc.)
function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    if (statSync(p).isDirectory()) return sources(p);
    return p.endsWith(".ts") && !p.endsWith(".test.ts") ? [p] : [];
  });
}

describe("jsdoc", () => {
  it("geo sources -- every exported function has a JSDoc comment", () => {
    const files = sources(path.resolve(import.meta.dirname));
    expect(files.length).toBeGreaterThan(20);
    const missing: string[] = [];
    for (const file of files) {
      const lines = readFileSync(file, "utf8").split("\n");
      lines.forEach((l, i) => {
        if (/^export (async )?function/.test(l) && !/\*\/\s*$/.test(lines[i - 1] ?? ""))
          missing.push(`${path.relative(import.meta.dirname, file)}:${i + 1}`);
      });
    }
    expect(missing).toEqual([]);
  });
});
