import { describe, expect, it } from "vitest";
import { jsonDifferences } from "./diff";

describe("jsonDifferences", () => {
  it("jsonDifferences -- names the changed leaf by its path", () => {
    expect(jsonDifferences({ a: 1, b: { c: [1, 2] } }, { a: 1, b: { c: [1, 3] } })).toEqual([
      { path: "b.c[1]", signed: 2, now: 3 },
    ]);
  });

  it("jsonDifferences -- NaN and null are the same after the canonical round trip; key order does not matter", () => {
    expect(jsonDifferences({ x: NaN, y: 1, z: 2 }, { z: 2, y: 1, x: null })).toEqual([]);
  });

  it("jsonDifferences -- missing members, different lengths and a limit", () => {
    const d = jsonDifferences({ a: [1, 2, 3], b: 1 }, { a: [1, 2], c: 1 }, 2);
    expect(d).toEqual([
      { path: "a.length", signed: 3, now: 2 },
      { path: "b", signed: 1, now: undefined },
    ]);
  });
});
