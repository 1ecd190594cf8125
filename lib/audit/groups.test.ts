/**
 * Sources: jstat 1.9.6 (beta.inv) for the one-sided bound; simple-statistics 7.12.1 (mean, rootMeanSquare, quantile type 7) as independent oracle for each group;
 * Clopper–Pearson (Newcombe, Stat Med 17:857-872 (1998), Table I: 0/20 → upper 0.1684).
 */
import jStat from "jstat";
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import { groupStatistics } from "./groups";
import type { ErrorColumns } from "./summary";
import { clopperPearson } from "./intervals";

function errorsOf(dE: number[], dN: number[], within: number[] | null, frame = true): ErrorColumns {
  const e = Float64Array.from(dE);
  const n = Float64Array.from(dN);
  return {
    dE: e,
    dN: n,
    along: frame ? Float64Array.from(dN) : null, // rows running north: along = dN
    cross: frame ? Float64Array.from(dE) : null, //                    cross = dE
    radial: e.map((v, i) => Math.hypot(v, n[i])),
    within: within ? Uint8Array.from(within) : null,
  };
}

describe("groupStatistics", () => {
  it("groupStatistics -- each group matches statistics of its own subset", () => {
    // fictional tool arms L and R, and one record with no arm
    const codes = Int32Array.of(0, 1, 0, 1, 0, -1, 1);
    const dE = [0.01, -0.02, 0.012, -0.018, 0.009, 0.5, -0.021];
    const dN = [0.002, 0.001, -0.001, 0.003, 0.0, 0.1, -0.002];
    const within = [1, 1, 1, 0, 1, 0, 1];
    const rows = groupStatistics(codes, ["L", "R"], errorsOf(dE, dN, within), 0.95);
    expect(rows.map((r) => r.key)).toEqual(["L", "R", null]);
    for (const row of rows) {
      const idx = Array.from(codes.keys()).filter((i) =>
        row.key === null ? codes[i] < 0 : ["L", "R"][codes[i]] === row.key,
      );
      const e = idx.map((i) => dE[i]);
      const n = idx.map((i) => dN[i]);
      const radial = idx.map((i) => Math.hypot(dE[i], dN[i]));
      const k = idx.reduce((s, i) => s + within[i], 0);
      // simple-statistics as independent oracle
      expect(row.pairs).toBe(idx.length);
      expect(row.meanDE).toBeCloseTo(ss.mean(e), 14);
      expect(row.meanDN).toBeCloseTo(ss.mean(n), 14);
      expect(row.rmseR).toBeCloseTo(Math.hypot(ss.rootMeanSquare(e), ss.rootMeanSquare(n)), 14);
      expect(row.rmseCross).toBeCloseTo(ss.rootMeanSquare(e), 14);
      expect(row.rmseAlong).toBeCloseTo(ss.rootMeanSquare(n), 14);
      expect(row.cep50).toBeCloseTo(ss.quantile(radial, 0.5), 14);
      expect(row.r95).toBeCloseTo(ss.quantile(radial, 0.95), 14);
      expect(row.withinShare).toBeCloseTo(k / idx.length, 14);
      const ci = clopperPearson(k, idx.length, 0.95)!;
      expect(row.lower95).toBe(ci.lower);
      expect(row.upper95).toBe(ci.upper);
      expect(row.within).toBe(k);
      // one-sided decision bound Beta⁻¹(α; k, n − k + 1) (Clopper & Pearson 1934; jstat as independent oracle)
      const oracle = k === 0 ? 0 : k === idx.length ? 0.05 ** (1 / k) : jStat.beta.inv(0.05, k, idx.length - k + 1);
      expect(row.lowerOneSided).toBeCloseTo(oracle, 8);
      expect(row.p95Cross).toBeCloseTo(ss.quantile(e.map(Math.abs), 0.95), 14);
      expect(row.p95Along).toBeCloseTo(ss.quantile(n.map(Math.abs), 0.95), 14);
    }
  });

  it("groupStatistics -- natural key order, empty groups left out", () => {
    const codes = Int32Array.of(0, 1, 2, 2);
    const rows = groupStatistics(
      codes,
      ["10", "2", "1", "unused"],
      errorsOf([0.01, 0.02, 0.03, 0.04], [0, 0, 0, 0], null),
      0.95,
    );
    expect(rows.map((r) => r.key)).toEqual(["1", "2", "10"]);
    expect(rows.every((r) => r.withinShare === null && r.lower95 === null)).toBe(true);
  });

  it("groupStatistics -- without a row bearing along/cross are null", () => {
    const rows = groupStatistics(Int32Array.of(0), ["bed-1"], errorsOf([0.01], [0.02], [1], false), 0.95);
    expect(rows[0].rmseAlong).toBeNull();
    expect(rows[0].rmseCross).toBeNull();
    expect(rows[0].cep50).toBeCloseTo(Math.hypot(0.01, 0.02), 15);
  });

  it("groupStatistics -- all outside tolerance in a group of 20", () => {
    // Newcombe 1998, Table I: 0/20 → 0–0.1684
    const rows = groupStatistics(
      new Int32Array(20),
      ["arm-B"],
      errorsOf(new Array(20).fill(0.05), new Array(20).fill(0), new Array(20).fill(0)),
      0.95,
    );
    expect(rows[0].lower95).toBe(0);
    expect(rows[0].upper95).toBeCloseTo(0.1684, 4);
  });

  it("groupStatistics -- inputs not mutated, bad codes throw", () => {
    const errors = errorsOf([0.03, 0.01, 0.02], [0, 0, 0], [1, 0, 1]);
    const copy = structuredClone(errors);
    const codes = Int32Array.of(0, 0, 0);
    groupStatistics(codes, ["x"], errors, 0.95);
    expect(errors).toEqual(copy);
    expect(Array.from(codes)).toEqual([0, 0, 0]);
    expect(() => groupStatistics(Int32Array.of(0, 5, 0), ["x"], errors, 0.95)).toThrow(
      "groupStatistics: code 5 out of range",
    );
  });
});
