import { describe, expect, it } from "vitest";
import { buildMapArrays, type PairColumns, type UnpairedColumns } from "./build";
import {
  isOut,
  metricValues,
  pairBuffers,
  selectPairs,
  selectUnpaired,
  unpairedBuffers,
  vectorBuffers,
} from "./select";
import { viridis } from "./colour-scale";
import { PAIR_FLAG } from "./types";

const IN = PAIR_FLAG.WITHIN_KNOWN | PAIR_FLAG.WITHIN,
  OUT = PAIR_FLAG.WITHIN_KNOWN;

function arrays() {
  const pairs: PairColumns = {
    count: 4,
    x: Float32Array.of(0, 1, 2, 3),
    y: Float32Array.of(0, 0, 0, 0),
    dE: Float32Array.of(0.003, 0, 0.02, 0),
    dN: Float32Array.of(0.004, 0.001, 0, 0),
    along: Float32Array.of(0.005, -0.001, 0.02, Number.NaN),
    cross: Float32Array.of(0, 0.0005, -0.004, Number.NaN),
    flags: Uint8Array.of(IN, IN, OUT, 0),
    plantId: ["a", "b", "c", "d"],
    text: {
      crop: ["lettuce", "lettuce", "lettuce", "lettuce"],
      bed: ["1", "1", "3", "3"],
      row: ["1", "2", "2", "3"],
      arm: ["1", "2", "2", "3"],
      fix: ["rtk-fixed", "rtk-fixed", "rtk-float", "rtk-fixed"],
      day: ["d1", "d1", "d2", "d2"],
    },
  };
  const unpaired: UnpairedColumns = {
    count: 3,
    x: Float32Array.of(10, 11, 12),
    y: Float32Array.of(1, 1, 1),
    kind: ["planted-not-found", "planted-not-found", "surveyed-not-planted"],
    text: { crop: ["lettuce", "lettuce", ""], bed: ["1", "3", ""], row: ["1", "1", ""] },
  };
  return buildMapArrays(pairs, unpaired);
}

describe("select", () => {
  it("isOut -- only a known verdict of not within is out", () => {
    expect(isOut(OUT)).toBe(true);
    expect(isOut(IN)).toBe(false);
    expect(isOut(0)).toBe(false);
  });

  it("selectPairs -- filters combine, codes are dictionary indices", () => {
    const { arrays: a, dict } = arrays();
    expect(Array.from(selectPairs(a, { codes: {}, onlyOut: false }))).toEqual([0, 1, 2, 3]);
    expect(Array.from(selectPairs(a, { codes: { bed: dict.bed.indexOf("3") }, onlyOut: false }))).toEqual([2, 3]);
    expect(
      Array.from(
        selectPairs(a, { codes: { bed: dict.bed.indexOf("3"), fix: dict.fix.indexOf("rtk-fixed") }, onlyOut: false }),
      ),
    ).toEqual([3]);
    expect(Array.from(selectPairs(a, { codes: { arm: null }, onlyOut: true }))).toEqual([2]);
    expect(Array.from(selectPairs(a, { codes: { day: dict.day.indexOf("d1") }, onlyOut: true }))).toEqual([]);
  });

  it("selectUnpaired -- crop, bed and row filters apply; arm, fix, day and only-out leave none", () => {
    const { arrays: a, dict } = arrays();
    expect(Array.from(selectUnpaired(a, { codes: {}, onlyOut: false }))).toEqual([0, 1, 2]);
    expect(Array.from(selectUnpaired(a, { codes: { bed: dict.bed.indexOf("3") }, onlyOut: false }))).toEqual([1]);
    expect(Array.from(selectUnpaired(a, { codes: { arm: dict.arm.indexOf("1") }, onlyOut: false }))).toEqual([]);
    expect(Array.from(selectUnpaired(a, { codes: {}, onlyOut: true }))).toEqual([]);
  });

  it("metricValues -- radial from dE/dN, cross and along as magnitudes", () => {
    const { arrays: a } = arrays();
    expect(metricValues(a, "radial")[0]).toBeCloseTo(0.005, 7); // 3-4-5 triangle
    expect(metricValues(a, "cross")[2]).toBeCloseTo(0.004, 7);
    expect(metricValues(a, "along")[1]).toBeCloseTo(0.001, 7);
    expect(Number.isNaN(metricValues(a, "along")[3])).toBe(true);
  });

  it("pairBuffers -- out-of-tolerance plants go to their own buffer with positions and colours", () => {
    const { arrays: a } = arrays();
    const values = metricValues(a, "radial");
    const { rest, out } = pairBuffers(a, Uint32Array.of(0, 1, 2, 3), values, [0, 0.02]);
    expect(Array.from(rest.index)).toEqual([0, 1, 3]);
    expect(Array.from(out.index)).toEqual([2]);
    expect(Array.from(out.positions)).toEqual([2, 0]);
    expect(Array.from(out.colours!)).toEqual([...viridis(1), 255]); // 20 mm at the top of a 0–20 mm scale
    expect(rest.colours!.length).toBe(12);
  });

  it("vectorBuffers -- target = planted + exaggeration × (dE, dN)", () => {
    const { arrays: a } = arrays();
    const v = vectorBuffers(a, Uint32Array.of(0, 2), 100);
    expect(Array.from(v.source)).toEqual([0, 0, 2, 0]);
    expect(v.target[0]).toBeCloseTo(0.3, 5);
    expect(v.target[1]).toBeCloseTo(0.4, 5);
    expect(v.target[2]).toBeCloseTo(4, 5);
  });

  it("unpairedBuffers -- one buffer per kind", () => {
    const { arrays: a } = arrays();
    const b = unpairedBuffers(a, Uint32Array.of(0, 1, 2));
    expect(Array.from(b["planted-not-found"].index)).toEqual([0, 1]);
    expect(Array.from(b["surveyed-not-planted"].positions)).toEqual([12, 1]);
    expect(b.ambiguous.length).toBe(0);
  });
});
