import { describe, expect, it } from "vitest";
import { normaliseFix, parseNumber, TimeReader } from "./values";

describe("values", () => {
  it("parseNumber -- decimal point, decimal comma, blanks and text", () => {
    // by construction
    expect(parseNumber("512345.678", false)).toBe(512345.678);
    expect(parseNumber(" 12,5 ", true)).toBe(12.5);
    expect(parseNumber("12,5", false)).toBeNaN();
    expect(parseNumber("1.234,5", true)).toBeNaN();
    expect(parseNumber("", false)).toBeUndefined();
    expect(parseNumber("   ", true)).toBeUndefined();
    expect(parseNumber("0", false)).toBe(0);
    expect(parseNumber("abc", true)).toBeNaN();
    expect(parseNumber("-1e-3", false)).toBe(-0.001);
  });

  it("normaliseFix -- NMEA GGA fix-quality codes", () => {
    // NMEA 0183 GGA fix quality: 4 RTK fixed, 5 RTK float, 2 differential, 1 autonomous — from memory
    expect(normaliseFix("4")).toBe("rtk-fixed");
    expect(normaliseFix("5")).toBe("rtk-float");
    expect(normaliseFix("2")).toBe("dgnss");
    expect(normaliseFix("1")).toBe("autonomous");
  });

  it("normaliseFix -- text variants, other text kept", () => {
    // common practice, no source: spellings seen in receiver and machine exports
    expect(normaliseFix("RTK Fixed")).toBe("rtk-fixed");
    expect(normaliseFix("fixed")).toBe("rtk-fixed");
    expect(normaliseFix("RTK_FLOAT")).toBe("rtk-float");
    expect(normaliseFix("float")).toBe("rtk-float");
    expect(normaliseFix("DGPS")).toBe("dgnss");
    expect(normaliseFix("single")).toBe("autonomous");
    expect(normaliseFix(" PPP ")).toBe("PPP");
    expect(normaliseFix("")).toBe("");
  });

  it("TimeReader -- ISO 8601 with Z or offset", () => {
    // 2025-05-03T08:00:00Z = 1746259200 s since the Unix epoch: 20211 days × 86400 s + 8 h (by construction)
    const r = new TimeReader();
    expect(r.parse("2025-05-03T08:00:00Z")).toEqual({ ok: true, ms: 1746259200000 });
    expect(r.parse("2025-05-03T10:00:00+02:00")).toEqual({ ok: true, ms: 1746259200000 });
    expect(r.parse("2025-05-03T10:00:00+0200")).toEqual({ ok: true, ms: 1746259200000 });
    expect(r.parse("2025-05-03T03:30:00.250-04:30")).toEqual({ ok: true, ms: 1746259200250 });
    // cross-check with the engine's own ISO parser (ECMAScript Date.parse) — independent implementation
    expect(r.parse("2024-02-29T23:59:59.999Z")).toEqual({ ok: true, ms: Date.parse("2024-02-29T23:59:59.999Z") });
  });

  it("TimeReader -- no offset needs a time zone", () => {
    expect(new TimeReader().parse("2025-05-03 10:00")).toEqual({ ok: false, reason: "no-zone" });
    // Europe/Berlin is UTC+2 in May (CEST) and UTC+1 in January (CET) — common practice, no source
    const berlin = new TimeReader("Europe/Berlin");
    expect(berlin.parse("2025-05-03 10:00")).toEqual({ ok: true, ms: 1746259200000 });
    expect(berlin.parse("2025-01-15T09:00:00")).toEqual({ ok: true, ms: Date.parse("2025-01-15T08:00:00Z") });
    expect(new TimeReader("Mars/Olympus").zoneValid).toBe(false);
    expect(new TimeReader("Mars/Olympus").parse("2025-05-03 10:00")).toEqual({ ok: false, reason: "bad-zone" });
  });

  it("TimeReader -- epoch numbers and rubbish", () => {
    const r = new TimeReader();
    expect(r.parse("1746259200")).toEqual({ ok: true, ms: 1746259200000 });
    expect(r.parse("1746259200123")).toEqual({ ok: true, ms: 1746259200123 });
    expect(r.parse("yesterday")).toEqual({ ok: false, reason: "not-a-time" });
    expect(r.parse("2025-02-30T10:00:00Z")).toEqual({ ok: false, reason: "not-a-time" });
    expect(r.parse("")).toEqual({ ok: false, reason: "empty" });
  });
});
