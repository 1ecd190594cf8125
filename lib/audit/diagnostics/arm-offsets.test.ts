import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { armDiagnostics } from "./arm-offsets";
import { simulatePairs } from "../test-helpers";

// Sources: the t interval mean ± t(0.975, n−1)·s/√n (Student 1908; NIST/SEMATECH e-Handbook §1.3.5.2) with jstat as
// independent oracle; other expected values are the offsets planted in the simulated pairs (common practice, no source).

describe("armDiagnostics", () => {
  it("armDiagnostics -- recovers a cross-row offset on one arm and says no offset for the others", () => {
    // expected: the 3 mm cross-row offset planted on arm 3 of the simulated pairs (common practice, no source)
    // Seed 1: none of the three unbiased arms is flagged (a 5 % test flags an unbiased arm by chance one time in 20).
    const pairs = simulatePairs({ armCross: [0, 0, 0.003, 0], rows: 8, checkpointsPerRow: 60, seed: 1 });
    const arms = armDiagnostics(pairs);
    expect(arms.map((a) => a.arm)).toEqual(["1", "2", "3", "4"]);
    const arm3 = arms[2];
    expect(arm3.suggestion.cross!.m).toBeGreaterThan(0.002);
    expect(arm3.suggestion.cross!.m).toBeLessThan(0.004);
    expect(arm3.sentence).toMatch(/^Arm 3: move its records \d\.\d mm ± 0\.\d mm to the right/);
    for (const a of [arms[0], arms[1], arms[3]]) expect(a.suggestion.cross).toBeNull();
    expect(arms[0].sentence).toBe("Arm 1: no significant offset.");
  });
  it("armDiagnostics -- interval equals mean ± t·s/√n of the fixed pairs (jstat as independent oracle)", () => {
    const pairs = simulatePairs({ armCross: [0.001, 0, 0, 0], rows: 4, checkpointsPerRow: 25 });
    const cross = pairs.filter((p) => p.arm === "1").map((p) => p.cross!);
    const a = armDiagnostics(pairs)[0];
    const m = jStat.mean(cross);
    const s = jStat.stdev(cross, true);
    const h = (jStat.studentt.inv(0.975, cross.length - 1) * s) / Math.sqrt(cross.length);
    expect(a.cross.mean!).toBeCloseTo(m, 12);
    expect(a.cross.lower!).toBeCloseTo(m - h, 8);
    expect(a.cross.upper!).toBeCloseTo(m + h, 8);
  });
  it("armDiagnostics -- float pairs are kept apart and do not fake an offset", () => {
    // expected: 16 float checkpoints planted in row 2 of the simulation; 40 per row (common practice, no source)
    const pairs = simulatePairs({ float: { rows: [2, 3], from: 10, to: 25, along: 0.03, cross: 0.012 }, rows: 4 });
    const arms = armDiagnostics(pairs);
    expect(arms[1].degraded.cross.n).toBe(16);
    expect(arms[1].degraded.along.mean!).toBeGreaterThan(0.025);
    expect(arms[1].suggestion.cross).toBeNull();
    expect(arms[1].cross.n).toBe(40 - 16);
  });
  it("armDiagnostics -- without fix qualities every pair is used", () => {
    // expected: 40 simulated checkpoints per arm, all used without a fix column (common practice, no source)
    const pairs = simulatePairs({ rows: 4 }).map((p) => ({ ...p, fix: null }));
    const arms = armDiagnostics(pairs);
    expect(arms[0].basis).toBe("all");
    expect(arms[0].cross.n).toBe(40);
  });
  it("armDiagnostics -- does not modify its input", () => {
    // common practice, no source: the core never mutates its inputs
    const pairs = simulatePairs({ rows: 2 });
    const copy = JSON.stringify(pairs);
    armDiagnostics(pairs);
    expect(JSON.stringify(pairs)).toBe(copy);
  });
});
