import { describe, expect, it } from "vitest";
import type { AuditDto, ProfileSnapshot } from "@/lib/api-types";
import { fieldMapSummary, mapProfile } from "./field-summary";
import { RECORD_ACCURACY_REMINDER, bedGuidance, bedStats, overallGuidance } from "./guidance";

const FIELD = { id: "f1", name: "North block", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" };
const PROFILE: ProfileSnapshot = {
  id: "p1",
  name: "Weeding",
  operation: "in-row weeding",
  radialM: null,
  crossM: 0.02,
  alongM: 0.025,
  requiredShare: 0.95,
  confidence: 0.9,
  minCheckpoints: 30,
};

describe("fieldMapSummary", () => {
  it("fieldMapSummary -- a field without a signed-off audit has no beds and says so", () => {
    expect(fieldMapSummary(FIELD, null, null)).toEqual({
      field: FIELD,
      audit: null,
      profile: null,
      beds: [],
      guidance: [],
      pending: null,
      summary: `No audit of North block has been signed off yet. ${RECORD_ACCURACY_REMINDER}`,
    });
  });

  it("fieldMapSummary -- a newer audit waiting for sign-off is mentioned, never used", () => {
    const pending = { id: "a9", title: "July", state: "submitted" };
    const v = fieldMapSummary(FIELD, null, null, pending);
    expect(v.pending).toEqual(pending);
    expect(v.guidance).toEqual([]);
    expect(v.summary).toBe(
      `No audit of North block has been signed off yet. A newer audit, “July”, is waiting for sign-off; until it is signed off this page does not use it. ${RECORD_ACCURACY_REMINDER}`,
    );
  });

  it("fieldMapSummary -- beds judged at the profile's confidence, guidance from the pure helpers", () => {
    const audit = {
      id: "a1",
      title: "June",
      state: "computed",
      computedAt: "2025-06-01T10:00:00.000Z",
      profile: PROFILE,
    };
    const columns = {
      bed: ["1", "1", "2"],
      radial: [0.01, 0.03, 0.004],
      cross: [0.005, 0.03, 0.001],
      along: [0.008, 0.002, 0.003],
      within: [1, 0, 1],
    };
    const view = fieldMapSummary(FIELD, audit as AuditDto, columns);
    const beds = bedStats({ ...columns, confidence: 0.9 });
    const guidance = beds.map((s) => bedGuidance(s, mapProfile(PROFILE)));
    expect(view.audit).toEqual({ id: "a1", title: "June", state: "computed", computedAt: audit.computedAt, pairs: 3 });
    expect(view.beds).toEqual(beds);
    expect(view.guidance).toEqual(guidance);
    expect(view.summary).toBe(overallGuidance(guidance, mapProfile(PROFILE)));
  });

  it("mapProfile -- the limits of the profile copy; null without one", () => {
    expect(mapProfile(null)).toBeNull();
    expect(mapProfile(PROFILE)).toEqual({
      name: "Weeding",
      operation: "in-row weeding",
      radialM: null,
      crossM: 0.02,
      alongM: 0.025,
      requiredShare: 0.95,
      confidence: 0.9,
      minCheckpoints: 30,
    });
  });
});
