import { describe, expect, it } from "vitest";
import { buildRecord, hashRecord, residualDigest, type ResidualRecordRow } from "./record";

const row = (seq: number, dE: number): ResidualRecordRow => ({
  seq,
  plantId: `LA-${seq}`,
  surveyId: `LA-${seq}`,
  crop: "lettuce",
  bed: "1",
  row: "1",
  arm: "1",
  fix: "rtk-fixed",
  day: "2026-04-14",
  plantedE: 662410 + seq,
  plantedN: 5821330,
  surveyE: 662410 + seq + dE,
  surveyN: 5821330,
  dE,
  dN: 0,
  along: dE,
  cross: 0,
  radial: Math.abs(dE),
  within: true,
  outlier: false,
  pairedBy: "id",
  beyondMaxDistance: false,
});

describe("record", () => {
  it("residualDigest -- the same rows in any order give the same digest; one changed value changes it", () => {
    const rows = [row(0, 0.001), row(1, -0.002), row(2, 0.0005)];
    const a = residualDigest(rows);
    expect(residualDigest([rows[2], rows[0], rows[1]])).toEqual(a);
    expect(a.count).toBe(3);
    const tampered = residualDigest([row(0, 0.001), row(1, -0.0021), row(2, 0.0005)]);
    expect(tampered.sha256).not.toBe(a.sha256);
  });

  it("residualDigest -- no rows is the SHA-256 of nothing", () => {
    // FIPS 180-4 test vectors (NIST CAVP SHA256ShortMsg, Len = 0)
    expect(residualDigest([]).sha256).toBe("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
  });

  it("hashRecord -- the hash is over the canonical text, and any signed field changes it", () => {
    const parts = {
      audit: { id: "a", revision: 1, revisionOf: null, title: "t", fieldId: "f" },
      inputs: {
        planted: {
          datasetId: "p",
          kind: "planted",
          fileName: "p.csv",
          sha256: "00",
          sizeBytes: 1,
          rowCount: 1,
          crs: "EPSG:4326",
          format: "csv",
          mapping: {},
        },
        survey: {
          datasetId: "s",
          kind: "survey",
          fileName: "s.csv",
          sha256: "11",
          sizeBytes: 1,
          rowCount: 1,
          crs: "EPSG:25831",
          format: "csv",
          mapping: {},
        },
        settings: {},
        profile: {},
      },
      results: {
        summary: { pairs: 3 },
        verdict: { passed: true, criteria: [] },
        residuals: residualDigest([]),
        unpaired: residualDigest([]),
        reports: {},
      },
      signoff: {
        signerId: "u",
        signerName: "Idris Coombe",
        signerRole: "qa_lead",
        typedName: "Idris Coombe",
        checklist: {},
        comment: null,
        deviation: false,
        signedAt: "2026-05-01T10:00:00.000Z",
      },
    };
    const h = hashRecord(buildRecord(parts));
    expect(h.canonical.startsWith('{"audit":{"fieldId":"f","id":"a"')).toBe(true);
    expect(h.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(
      hashRecord(buildRecord({ ...parts, signoff: { ...parts.signoff, typedName: "Someone Else" } })).sha256,
    ).not.toBe(h.sha256);
    expect(hashRecord(buildRecord({ ...parts, results: { ...parts.results, summary: { pairs: 4 } } })).sha256).not.toBe(
      h.sha256,
    );
  });
});
