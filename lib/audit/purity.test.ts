/**
 * Sources: Plotproof style notes, habit 4 (the core is pure) — common practice, no source.
 * Scans the production modules of lib/audit for I/O, clock, environment, randomness and framework imports.
 */
import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { impurities } from "@/tests/purity-rules";

describe("lib/audit purity", () => {
  const dir = import.meta.dirname;
  const files = readdirSync(dir).filter(
    (f) => f.endsWith(".ts") && !f.endsWith(".test.ts") && !f.endsWith(".d.ts") && f !== "test-helpers.ts",
  );

  it("purity -- production modules exist", () => {
    expect(files).toContain("index.ts");
    expect(files.length).toBeGreaterThan(10);
  });

  it("purity -- no I/O, clock, environment, randomness or framework in production modules", () => {
    expect(impurities(dir, files)).toEqual([]);
  });
});
