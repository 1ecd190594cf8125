import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { EXCLUSION_CAUTION, exclusionCsv, exclusionGeoJson, type ExclusionContext, rowStretches } from "./exclusions";

const ctx: ExclusionContext = {
  fieldName: "Long Acre",
  crs: "EPSG:25831",
  geographic: false,
  audit: { id: "a1", title: "Spring check", revision: 2, state: "Signed off" },
  profileName: "Inter-row hoeing",
  signoffHash: "ab".repeat(32),
  rule: "A record is not to be relied on when …",
  stretches: [{ bed: "3", row: "2", firstPlantId: "P-31", lastPlantId: "P-33", records: 3 }],
};
const record = {
  plantId: "=P-31",
  crop: "lettuce",
  bed: "3",
  row: "2",
  arm: "2",
  fix: "rtk-float",
  plantedUtc: "2026-04-14T22:01:00.000Z",
  x: 662410.12345,
  y: 5821330.5,
  judgement: "do not rely" as const,
  reason: "fix quality rtk-float: 1 of 12 checkpoints out of tolerance",
};

describe("exclusions", () => {
  it("row stretches -- a record of the same bed and row that is relied on ends a run; other rows do not", () => {
    const s = rowStretches({
      bedRow: Int32Array.of(0, 1, 0, 0, 1, 0, -1),
      keys: [
        { bed: "3", row: "2" },
        { bed: "3", row: "3" },
      ],
      excluded: Uint8Array.of(1, 1, 1, 0, 1, 1, 1),
      plantId: (i) => `P${i}`,
    });
    expect(s).toEqual([
      { bed: "3", row: "2", firstPlantId: "P0", lastPlantId: "P2", records: 2 },
      { bed: "3", row: "3", firstPlantId: "P1", lastPlantId: "P4", records: 2 },
      { bed: "3", row: "2", firstPlantId: "P5", lastPlantId: "P5", records: 1 },
    ]);
  });

  it("exclusion csv -- states audit, hash, CRS, stretch and caution; cells neutralised; parses back", () => {
    const text = exclusionCsv(ctx, [record]);
    const comments = text.split("\n").filter((l) => l.startsWith("# "));
    expect(comments[1]).toBe(`# Audit: Spring check (revision 2), id a1, signed off; SHA-256 ${"ab".repeat(32)}`);
    expect(comments).toContain("# Stretch: bed 3, row 2 — P-31 to P-33 (3 records)");
    expect(comments.at(-1)).toBe(`# Caution: ${EXCLUSION_CAUTION}`);
    const rows = Papa.parse<Record<string, string>>(text, { header: true, comments: "#", skipEmptyLines: true }).data;
    expect(rows).toEqual([
      {
        plant_id: "'=P-31",
        crop: "lettuce",
        bed: "3",
        row: "2",
        arm: "2",
        fix: "rtk-float",
        planted_utc: "2026-04-14T22:01:00.000Z",
        easting: "662410.1235",
        northing: "5821330.5",
        judgement: "do not rely",
        reason: "fix quality rtk-float: 1 of 12 checkpoints out of tolerance",
      },
    ]);
  });

  it("exclusion csv -- a geographic CRS gives longitude and latitude to 9 decimals; unsigned says so", () => {
    const text = exclusionCsv({ ...ctx, geographic: true, crs: "EPSG:4326", signoffHash: null }, [
      { ...record, x: 5.3936459634, y: 52.5178474081 },
    ]);
    expect(text).toContain("not signed off (state: Signed off); no hash yet");
    expect(text).toContain(",longitude,latitude,");
    expect(text).toContain(",5.393645963,52.517847408,");
  });

  it("exclusion geojson -- points in the field's CRS with the context in its own member", () => {
    const g = exclusionGeoJson(ctx, [record]);
    expect(g.features[0].geometry.coordinates).toEqual([662410.12345, 5821330.5]);
    expect(g.features[0].properties.plant_id).toBe("=P-31");
    expect(g.plotproof.signoffSha256).toBe("ab".repeat(32));
    expect(g.crs.properties.name).toBe("EPSG:25831");
  });
});
