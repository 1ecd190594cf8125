import { describe, expect, it } from "vitest";
import { diagnosticsCsv, DIAGNOSTICS_CSV_COLUMNS } from "./csv";
import { diagnoseAudit } from "./diagnose";
import { simulatePairs } from "../test-helpers";

// Sources: CSV layout per RFC 4180; spreadsheet cell neutralisation is common practice, no source (OWASP "CSV
// Injection" note); values are the diagnostics of the same simulated pairs in millimetres.

describe("diagnosticsCsv", () => {
  it("diagnosticsCsv -- header, one row per arm, bed × row cell and episode part, in millimetres", () => {
    // expected: 4 arms and 4 bed × row cells of the simulation, the float episode planted in row 3 (common practice, no source)
    const pairs = simulatePairs({ rows: 4, float: { rows: [3], from: 0, to: 3, along: 0.03, cross: 0 } });
    const d = diagnoseAudit({ pairs, track: null });
    const lines = diagnosticsCsv(d).trimEnd().split("\n");
    expect(lines[0]).toBe(DIAGNOSTICS_CSV_COLUMNS.join(","));
    expect(lines.filter((l) => l.startsWith("arm,"))).toHaveLength(4);
    expect(lines.filter((l) => l.startsWith("bed-row,"))).toHaveLength(4);
    const arm1 = lines.find((l) => l.startsWith("arm,1,"))!.split(",");
    expect(Number(arm1[8])).toBeCloseTo(d.arms[0].cross.mean! * 1000, 3);
    expect(lines.some((l) => l.startsWith("episode,3,1,3,4,"))).toBe(true);
  });
  it("diagnosticsCsv -- a text cell that starts with = is neutralised", () => {
    // common practice, no source: a leading "=" gets a single quote so spreadsheets do not run it
    const pairs = simulatePairs({ rows: 1 }).map((p) => ({ ...p, arm: "=cmd" }));
    expect(diagnosticsCsv(diagnoseAudit({ pairs, track: null }))).toContain("arm,'=cmd,");
  });
});
