/**
 * Sources: our own settings contract (common practice, no source); IANA zone names via Intl.
 */
import { describe, expect, it } from "vitest";
import {
  auditTimeZone,
  buildAuditSettings,
  DEFAULT_MAX_PAIR_DISTANCE_M,
  FALLBACK_TIME_ZONE,
  MAX_PAIR_DISTANCE_CEILING_M,
  maxDistanceMSchema,
  workCrsForField,
  type AuditSettings,
} from "./settings";

const field = { crs: "EPSG:32632", timeZone: "Europe/Berlin", rowBearingDeg: 28 };
const stored: AuditSettings = {
  match: "id",
  maxDistanceM: 0.05,
  rowBearingDeg: 30,
  timeZone: "Europe/Amsterdam",
  workCrs: "EPSG:25832",
};

describe("audit settings", () => {
  it("buildAuditSettings -- a new audit takes the defaults and the field's zone, CRS and bearing", () => {
    // common practice, no source: pairing by position within 10 cm, the field's own projected CRS.
    expect(buildAuditSettings({ field, chosen: {} })).toEqual({
      match: "auto",
      maxDistanceM: DEFAULT_MAX_PAIR_DISTANCE_M,
      rowBearingDeg: 28,
      timeZone: "Europe/Berlin",
      workCrs: "EPSG:32632",
    });
    expect(DEFAULT_MAX_PAIR_DISTANCE_M).toBe(0.1);
  });

  it("buildAuditSettings -- the user's choices win; a null bearing means derive it", () => {
    const s = buildAuditSettings({ field, chosen: { match: "nearest", maxDistanceM: 0.2, rowBearingDeg: null } });
    expect(s).toMatchObject({ match: "nearest", maxDistanceM: 0.2, rowBearingDeg: null });
  });

  it("buildAuditSettings -- a revision keeps the previous settings where nothing new was chosen", () => {
    const s = buildAuditSettings({
      field,
      chosen: { maxDistanceM: 0.08 },
      previous: { settings: stored, rowBearingDerived: false },
    });
    expect(s).toEqual({ ...stored, maxDistanceM: 0.08 });
  });

  it("buildAuditSettings -- a revision derives the bearing again when the previous one was derived", () => {
    const s = buildAuditSettings({ field, chosen: {}, previous: { settings: stored, rowBearingDerived: true } });
    expect(s.rowBearingDeg).toBeNull();
  });

  it("buildAuditSettings -- a revision without stored settings falls back to the field's zone, as a new audit does", () => {
    const revised = buildAuditSettings({ field, chosen: {}, previous: { settings: null, rowBearingDerived: false } });
    const created = buildAuditSettings({ field, chosen: {} });
    expect(revised.timeZone).toBe("Europe/Berlin");
    expect(revised.timeZone).toBe(created.timeZone);
    expect(revised.workCrs).toBe(created.workCrs);
  });

  it("auditTimeZone -- given, else the field's, else UTC", () => {
    expect(auditTimeZone("Asia/Tokyo", "Europe/Berlin")).toBe("Asia/Tokyo");
    expect(auditTimeZone(undefined, "Europe/Berlin")).toBe("Europe/Berlin");
    expect(auditTimeZone(null, null)).toBe(FALLBACK_TIME_ZONE);
    expect(FALLBACK_TIME_ZONE).toBe("UTC");
  });

  it("workCrsForField -- a projected CRS is kept; geographic or unknown becomes auto", () => {
    // EPSG:32632 is WGS 84 / UTM zone 32N (projected), EPSG:4326 is WGS 84 (geographic) — EPSG registry.
    expect(workCrsForField("EPSG:32632")).toBe("EPSG:32632");
    expect(workCrsForField("EPSG:4326")).toBe("auto");
    expect(workCrsForField("EPSG:999999")).toBe("auto");
  });

  it("maxDistanceMSchema -- positive and at most the ceiling", () => {
    expect(maxDistanceMSchema.safeParse(MAX_PAIR_DISTANCE_CEILING_M).success).toBe(true);
    expect(maxDistanceMSchema.safeParse(MAX_PAIR_DISTANCE_CEILING_M + 0.001).success).toBe(false);
    expect(maxDistanceMSchema.safeParse(0).success).toBe(false);
  });
});
