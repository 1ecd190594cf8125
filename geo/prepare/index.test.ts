import { describe, expect, it } from "vitest";
import { readCsv } from "../read/csv";
import { convertPoint } from "../project";
import { prepareAudit } from "./index";

// End-to-end of the pure core on a tiny fictional field (truth by construction): records in
// WGS 84 lat/lon, survey in UTM 32N without ids, 3 mm off each plant.
async function files(n = 30, surveyShift = 0.003) {
  const p = ["plant_id,bed,row,lat,lon"],
    s = ["easting,northing"];
  for (let i = 0; i < n; i++) {
    const lat = 52.3 + ((i % 10) * 0.25) / 111_200,
      lon = 9.77 + (Math.floor(i / 10) * 0.5) / 68_000;
    p.push(`P${i},1,${Math.floor(i / 10) + 1},${lat.toFixed(9)},${lon.toFixed(9)}`);
    const [e, nn] = convertPoint(lon, lat, "EPSG:4326", "EPSG:32632");
    s.push(`${(e + surveyShift).toFixed(4)},${nn.toFixed(4)}`);
  }
  const planted = await readCsv(p.join("\n"), { source: "planted.csv", role: "planted" });
  const survey = await readCsv(s.join("\n"), { source: "survey.csv", role: "survey" });
  return { planted, survey };
}

describe("prepareAudit", () => {
  it("prepareAudit -- projects, pairs and derives the row bearing", async () => {
    const { planted, survey } = await files();
    const stages: string[] = [];
    const r = prepareAudit(
      { table: planted.table!, crs: "EPSG:4326", columns: planted.columns },
      { table: survey.table!, crs: "EPSG:32632", columns: survey.columns },
      { onStage: (s) => stages.push(s) },
    );
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.workCrs.code).toBe("EPSG:32632");
    expect(r.pairing.plantedIndex.length).toBe(30);
    for (let k = 0; k < 30; k++) expect(r.pairing.surveyIndex[k]).toBe(r.pairing.plantedIndex[k]);
    expect(r.survey.x).toBe(survey.table!.x); // same CRS: no copy
    expect(r.rowBearing.method).toBe("bed-row");
    // Rows run true north by construction (latitude varies within a row). On the UTM grid true north
    // lies at −γ, the meridian convergence γ = atan(tan(λ − λ0)·sin φ) (Snyder, Map Projections — A
    // Working Manual, USGS PP 1395, 1987, TM series; from memory): 9.77°E, 52.3°N, λ0 = 9° → γ ≈ 0.609°.
    const gamma = (Math.atan(Math.tan((0.77 * Math.PI) / 180) * Math.sin((52.3 * Math.PI) / 180)) * 180) / Math.PI;
    expect(Math.abs(r.rowBearing.bearingDeg - (180 - gamma))).toBeLessThan(0.05);
    expect(stages).toEqual(["validate", "project", "check-files", "pair", "row-bearing", "done"]);
  });

  it("prepareAudit -- stops with errors: unknown CRS, wrong CRS, nothing paired", async () => {
    const { planted, survey } = await files();
    const p = { table: planted.table!, crs: "EPSG:4326", columns: planted.columns };
    const bad = prepareAudit(p, { table: survey.table!, crs: "EPSG:12345", columns: survey.columns });
    expect(bad.ok).toBe(false);
    expect(bad.issues[0]).toMatchObject({ code: "crs-unknown", file: "survey.csv", value: "EPSG:12345" });
    const far = prepareAudit(p, { table: survey.table!, crs: "EPSG:32631", columns: survey.columns });
    expect(far.issues.map((i) => i.code)).toContain("files-far-apart");
    const apart = await files(30, 0.15);
    const none = prepareAudit(p, { table: apart.survey.table!, crs: "EPSG:32632", columns: apart.survey.columns });
    expect(none.issues.at(-1)!.code).toBe("no-pairs");
  });

  it("prepareAudit -- few pairs and a given row bearing", async () => {
    const { planted, survey } = await files(12);
    const r = prepareAudit(
      { table: planted.table!, crs: "EPSG:4326" },
      { table: survey.table!, crs: "EPSG:32632" },
      { rowBearingDeg: 200 },
    );
    if (!r.ok) throw new Error("expected ok");
    expect(r.issues.map((i) => i.code)).toEqual(["few-points", "few-pairs"]);
    expect(r.rowBearing).toMatchObject({ bearingDeg: 20, given: true });
  });
});
