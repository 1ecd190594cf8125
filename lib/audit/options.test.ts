/**
 * Sources: none needed beyond our own option contract (common practice, no source); IANA zone names via Intl.
 */
import { describe, expect, it } from "vitest";
import { auditOptionsSchema, parseAuditOptions } from "./options";

describe("parseAuditOptions", () => {
  it("parseAuditOptions -- defaults", () => {
    expect(parseAuditOptions(undefined)).toEqual({
      confidence: 0.95,
      groupBy: [],
      outlierRule: { k: 3.5, minThreshold: 0.001 },
    });
    expect(auditOptionsSchema.parse({ outlierRule: { k: 3 } }).outlierRule).toEqual({ k: 3, minThreshold: 0.001 });
  });

  it("parseAuditOptions -- full options pass", () => {
    const o = parseAuditOptions({
      toleranceRadial: 0.03,
      toleranceCross: 0.02,
      toleranceAlong: 0.04,
      confidence: 0.9,
      rowBearingDeg: 12.5,
      rowBearingSource: "derived",
      groupBy: ["arm", "day", "fix"],
      timeZone: "Europe/Amsterdam",
    });
    expect(o.groupBy).toEqual(["arm", "day", "fix"]);
    expect(o.rowBearingSource).toBe("derived");
  });

  it("parseAuditOptions -- cross tolerance needs a bearing", () => {
    expect(() => parseAuditOptions({ toleranceCross: 0.02 })).toThrow(
      "audit: invalid options: rowBearingDeg: toleranceCross/toleranceAlong need a row bearing",
    );
  });

  it("parseAuditOptions -- day grouping needs a known time zone", () => {
    expect(() => parseAuditOptions({ groupBy: ["day"] })).toThrow(
      'timeZone: grouping by "day" needs the field\'s time zone',
    );
    expect(() => parseAuditOptions({ groupBy: ["day"], timeZone: "Mars/Olympus" })).toThrow(
      'unknown time zone "Mars/Olympus"',
    );
  });

  it("parseAuditOptions -- rejects contradictions, duplicates, unknown keys and bad values", () => {
    expect(() => parseAuditOptions({ rowBearingDeg: 10, rowBearingSource: "none" })).toThrow(
      'rowBearingSource is "none" but a bearing was given',
    );
    expect(() => parseAuditOptions({ rowBearingSource: "given" })).toThrow(
      'rowBearingSource is "given" but no bearing was given',
    );
    expect(() => parseAuditOptions({ groupBy: ["arm", "arm"] })).toThrow("groupBy lists an attribute twice");
    expect(() => parseAuditOptions({ tolerance: 0.03 } as never)).toThrow("audit: invalid options");
    expect(() => parseAuditOptions({ confidence: 1 })).toThrow("confidence");
    expect(() => parseAuditOptions({ toleranceRadial: -0.01 })).toThrow("toleranceRadial");
    expect(() => parseAuditOptions({ groupBy: ["colour" as never] })).toThrow("groupBy");
  });
});
