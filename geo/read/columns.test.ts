import { describe, expect, it } from "vitest";
import { normaliseHeader, planColumns } from "./columns";

// Header spellings are common practice in exports, no source; the expected roles are by construction.
describe("columns", () => {
  it("normaliseHeader -- case, spaces, underscores, units", () => {
    expect(normaliseHeader(" Easting (m) ")).toBe("easting");
    expect(normaliseHeader("Plant_ID")).toBe("plantid");
    expect(normaliseHeader("\uFEFFRaw-Lat [deg]")).toBe("rawlat");
  });

  it("planColumns -- guesses geographic roles and attributes", () => {
    const p = planColumns([
      "Plant ID",
      "Crop",
      "Bed",
      "Row",
      "Tool_Arm",
      "Fix Quality",
      "HDOP",
      "planted_at",
      "Latitude",
      "Lng",
      "raw_lat",
      "raw_lon",
      "note",
    ]);
    expect(p.guess.coordinates).toBe("geographic");
    expect(p.guess.columns).toMatchObject({
      id: "Plant ID",
      y: "Latitude",
      x: "Lng",
      arm: "Tool_Arm",
      fix: "Fix Quality",
      time: "planted_at",
      rawX: "raw_lon",
      rawY: "raw_lat",
      hdop: "HDOP",
    });
    expect(p.guess.rawCoordinates).toBe("geographic");
    expect(p.guess.unused).toEqual(["note"]);
    expect(p.problems).toEqual([]);
  });

  it("planColumns -- projected names x/y/e/n", () => {
    const p = planColumns(["pt", "E", "N", "sigma", "method"]);
    expect(p.guess.coordinates).toBe("projected");
    expect(p.guess.columns).toMatchObject({ x: "E", y: "N", precision: "sigma", method: "method" });
    expect(p.guess.columns.id).toBeUndefined();
  });

  it("planColumns -- missing coordinates is an error naming the header", () => {
    const p = planColumns(["id", "lat", "height"]);
    expect(p.problems[0]).toMatchObject({ code: "coordinate-columns-missing", severity: "error" });
    expect(p.problems[0].message).toContain("id, lat, height");
  });

  it("planColumns -- mapping overrides guessing; unknown mapped name is an error", () => {
    const p = planColumns(["a", "b", "c"], { id: "a", x: "b", y: "c", coordinates: "projected" });
    expect(p.index).toMatchObject({ id: 0, x: 1, y: 2 });
    expect(p.guess.coordinates).toBe("projected");
    const q = planColumns(["a", "b"], { x: "lon", y: "b" });
    expect(q.problems.some((x) => x.code === "mapping-column-not-found" && x.column === "lon")).toBe(true);
  });

  it("planColumns -- null for a role: the guessed column is not read and counts as unused", () => {
    const header = ["plant_id", "arm", "fix", "hdop", "lat", "lon"];
    const mapping = { fix: null, arm: null };
    const p = planColumns(header, mapping);
    expect(p.index.fix).toBe(-1);
    expect(p.index.arm).toBe(-1);
    expect(p.guess.columns.fix).toBeUndefined();
    expect(p.guess.columns.arm).toBeUndefined();
    expect(p.guess.columns).toMatchObject({ id: "plant_id", hdop: "hdop", y: "lat", x: "lon" });
    expect(p.guess.unused).toEqual(["arm", "fix"]);
    expect(p.problems).toEqual([]);
    // Absent still means "guess", and the mapping is not changed.
    expect(planColumns(header, {}).guess.columns.fix).toBe("fix");
    expect(mapping).toEqual({ fix: null, arm: null });
  });

  it("planColumns -- null for x or y is an error naming the position, not a missing-columns error", () => {
    const p = planColumns(["id", "lat", "lon"], { x: null });
    expect(p.problems).toHaveLength(1);
    expect(p.problems[0]).toMatchObject({ code: "mapping-coordinate-not-in-file", severity: "error" });
    expect(p.problems[0].message).toContain("longitude (x) is not in this file");
    const q = planColumns(["id", "easting", "northing"], { y: null });
    expect(q.problems.map((x) => x.code)).toEqual(["mapping-coordinate-not-in-file"]);
    expect(q.problems[0].message).toContain("northing (y)");
    // A position that is missing, not mapped to null, is still reported as missing.
    const r = planColumns(["id", "lon"], { x: null });
    expect(r.problems.map((x) => x.code)).toEqual(["mapping-coordinate-not-in-file", "coordinate-columns-missing"]);
  });

  it("planColumns -- null for one raw GNSS column drops the pair without a warning", () => {
    const p = planColumns(["easting", "northing", "raw_lat", "raw_lon"], { rawX: null });
    expect(p.index).toMatchObject({ rawX: -1, rawY: -1 });
    expect(p.guess.rawCoordinates).toBeNull();
    expect(p.guess.unused).toEqual(["raw_lat", "raw_lon"]);
    expect(p.problems).toEqual([]);
  });

  it("planColumns -- both kinds present: lat/lon used, with a warning", () => {
    const p = planColumns(["id", "lat", "lon", "easting", "northing"]);
    expect(p.guess.coordinates).toBe("geographic");
    expect(p.problems.map((x) => x.code)).toEqual(["coordinates-both-kinds"]);
    expect(planColumns(["id", "lat", "lon", "easting", "northing"], { coordinates: "projected" }).guess.columns.x).toBe(
      "easting",
    );
  });

  it("planColumns -- raw GNSS of another kind than the main coordinates is dropped with a warning", () => {
    const p = planColumns(["easting", "northing", "raw_lat", "raw_lon"]);
    expect(p.guess.rawCoordinates).toBeNull();
    expect(p.problems.map((x) => x.code)).toContain("raw-gnss-kind-differs");
  });
});
