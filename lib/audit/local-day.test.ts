/**
 * Sources: IANA time zone database as shipped with Node's ICU (Europe/Amsterdam CET = UTC+1, CEST = UTC+2 from
 * the last Sunday of March 01:00 UTC; America/Los_Angeles PDT = UTC−7; Asia/Kathmandu UTC+5:45; Pacific/Chatham
 * UTC+12:45/+13:45) — zone offsets from memory; Intl.DateTimeFormat (ECMA-402) as the reference formatter.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isKnownTimeZone, localDay, localDayCodes } from "./local-day";

describe("localDay", () => {
  it("localDay -- 23:30 UTC in summer is the next day in Amsterdam", () => {
    // Europe/Amsterdam is UTC+2 in May (CEST): 2025-05-12 23:30 UTC = 2025-05-13 01:30 local
    expect(localDay(Date.UTC(2025, 4, 12, 23, 30), "Europe/Amsterdam")).toBe("2025-05-13");
    expect(localDay(Date.UTC(2025, 4, 12, 23, 30), "UTC")).toBe("2025-05-12");
  });

  it("localDay -- winter offset is one hour", () => {
    // Europe/Amsterdam is UTC+1 in January (CET)
    expect(localDay(Date.UTC(2025, 0, 15, 22, 59), "Europe/Amsterdam")).toBe("2025-01-15");
    expect(localDay(Date.UTC(2025, 0, 15, 23, 0), "Europe/Amsterdam")).toBe("2025-01-16");
  });

  it("localDay -- west of Greenwich the local day is earlier", () => {
    // America/Los_Angeles is UTC−7 in May (PDT): 2025-05-13 05:00 UTC = 2025-05-12 22:00 local
    expect(localDay(Date.UTC(2025, 4, 13, 5, 0), "America/Los_Angeles")).toBe("2025-05-12");
  });

  it("localDay -- rejects an unknown zone and a missing time", () => {
    expect(() => localDay(0, "Europe/Atlantis")).toThrow('audit: unknown time zone "Europe/Atlantis"');
    expect(() => localDay(Number.NaN, "UTC")).toThrow("localDay: time must be finite");
    expect(isKnownTimeZone("Europe/Amsterdam")).toBe(true);
    expect(isKnownTimeZone("Not/AZone")).toBe(false);
  });
});

describe("localDayCodes", () => {
  it("localDayCodes -- codes follow sorted days, missing time is −1", () => {
    const t = Float64Array.of(
      Date.UTC(2025, 4, 13, 8, 0),
      Date.UTC(2025, 4, 12, 23, 30), // next local day in Amsterdam
      Number.NaN,
      Date.UTC(2025, 4, 12, 10, 0),
    );
    const r = localDayCodes(t, Int32Array.of(0, 1, 2, 3), "Europe/Amsterdam");
    expect(r.values).toEqual(["2025-05-12", "2025-05-13"]);
    expect(Array.from(r.codes)).toEqual([1, 1, -1, 0]);
  });

  it("localDayCodes -- the per-minute cache gives the same days as formatting every instant", () => {
    const zones = [
      "Europe/Amsterdam",
      "America/Los_Angeles",
      "Asia/Kathmandu",
      "Pacific/Chatham",
      "Australia/Lord_Howe",
      "UTC",
    ];
    // 2024-01-01 .. 2027-01-01, including both daylight-saving transitions of every year
    const times = fc.array(fc.integer({ min: Date.UTC(2024, 0, 1), max: Date.UTC(2027, 0, 1) }), {
      minLength: 1,
      maxLength: 60,
    });
    fc.assert(
      fc.property(fc.constantFrom(...zones), times, (zone, ts) => {
        const t = Float64Array.from(ts);
        const rows = Int32Array.from(ts.map((_, i) => i));
        const r = localDayCodes(t, rows, zone);
        ts.forEach((ms, i) => expect(r.values[r.codes[i]]).toBe(localDay(ms, zone)));
      }),
      { numRuns: 300 },
    );
  });

  it("localDayCodes -- instants around local midnight on a daylight-saving day", () => {
    // Europe/Amsterdam switches to summer time on 2025-03-30 at 01:00 UTC; local midnight before is 23:00 UTC
    const t = Float64Array.of(
      Date.UTC(2025, 2, 29, 22, 59, 59, 999),
      Date.UTC(2025, 2, 29, 23, 0),
      Date.UTC(2025, 2, 30, 21, 59),
      Date.UTC(2025, 2, 30, 22, 0),
    );
    const r = localDayCodes(t, Int32Array.of(0, 1, 2, 3), "Europe/Amsterdam");
    expect(Array.from(r.codes).map((c) => r.values[c])).toEqual([
      "2025-03-29",
      "2025-03-30",
      "2025-03-30",
      "2025-03-31",
    ]);
  });

  it("localDayCodes -- inputs not mutated", () => {
    const t = Float64Array.of(Date.UTC(2025, 4, 12, 23, 30));
    const rows = Int32Array.of(0);
    localDayCodes(t, rows, "Europe/Amsterdam");
    expect(Array.from(t)).toEqual([Date.UTC(2025, 4, 12, 23, 30)]);
    expect(Array.from(rows)).toEqual([0]);
  });
});
