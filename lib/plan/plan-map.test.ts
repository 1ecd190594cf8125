/** The records payload is our own format; expected values are worked by hand (common practice, no source). */
import { describe, expect, it } from "vitest";
import { planRecordsPayload } from "./plan-map";

describe("planRecordsPayload", () => {
  it("planRecordsPayload -- origin floored below records and plan points; centimetres relative to it", () => {
    const e = new Float64Array([320600.123, 320610.5, Number.NaN]);
    const n = new Float64Array([5814900.5, 5814905.254, 5814901]);
    const copy = [Array.from(e), Array.from(n)];
    const p = planRecordsPayload("EPSG:25831", e, n, [{ e: 320599.9, n: 5814902 }]);
    expect(p.origin).toEqual([320599, 5814900]);
    expect(p.xy).toEqual([112, 50, 1150, 525]);
    expect(p.count).toBe(2);
    expect(p.unplaced).toBe(1);
    expect(p.crs).toBe("EPSG:25831");
    expect([Array.from(e), Array.from(n)]).toEqual(copy);
  });

  it("planRecordsPayload -- no records at all", () => {
    expect(planRecordsPayload("EPSG:25831", [], [], [])).toEqual({
      crs: "EPSG:25831",
      origin: [0, 0],
      count: 0,
      unplaced: 0,
      xy: [],
    });
  });
});
