/**
 * Sources: Plotproof style notes, habit 4 (the core is pure) — common practice, no source.
 * The map's helpers run on the server and in the browser: no I/O, clock, environment, randomness or framework.
 * The two benchmark scripts (bench-*.ts) are command-line tools and are left out.
 */
import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { impurities } from "@/tests/purity-rules";

describe("lib/map purity", () => {
  const dir = import.meta.dirname;
  const files = readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts") && !f.startsWith("bench-"));

  it("purity -- the map's helpers are all scanned", () => {
    expect(files).toEqual(
      expect.arrayContaining([
        "binary.ts",
        "build.ts",
        "cells.ts",
        "colour-scale.ts",
        "geometry.ts",
        "guidance.ts",
        "select.ts",
        "view.ts",
      ]),
    );
  });

  it("purity -- no I/O, clock, environment, randomness or framework in the map's helpers", () => {
    expect(impurities(dir, files)).toEqual([]);
  });
});
