import { describe, expect, it } from "vitest";
import { convertPoint } from "../project";
import type { ColumnGuess } from "../read/columns";
import type { PointTable } from "../types";
import { checkAgainstField, checkFileKind, lonLatBox } from "./field";

// A fictional field near 52.518°N 5.394°E (UTM zone 31N). Distances are by construction; the
// equirectangular approximation is checked against the haversine distance below (Sinnott 1984, "Virtues of
// the Haversine", Sky and Telescope 68(2):159).
const t = (x: number[], y: number[], role: "planted" | "survey" = "planted"): PointTable => ({
  source: "planted.csv",
  role,
  length: x.length,
  x: Float64Array.from(x),
  y: Float64Array.from(y),
  line: Int32Array.from(x.map((_, i) => i + 2)),
  id: null,
  attrs: {},
  time: null,
  hdop: null,
  precision: null,
  rawX: null,
  rawY: null,
});

const RING = [
  [5.393, 52.5175],
  [5.396, 52.5175],
  [5.396, 52.5195],
  [5.393, 52.5195],
  [5.393, 52.5175],
];
const BOUNDARY = { kind: "boundary" as const, ring: RING };

function haversine(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const r = 6_371_008.8; // mean Earth radius (IUGG), metres
  const rad = Math.PI / 180;
  const a =
    Math.sin(((lat2 - lat1) * rad) / 2) ** 2 +
    Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(((lon2 - lon1) * rad) / 2) ** 2;
  return 2 * r * Math.asin(Math.sqrt(a));
}

describe("checkAgainstField", () => {
  it("checkAgainstField -- points inside the boundary give nothing", () => {
    expect(checkAgainstField(t([5.394, 5.395], [52.518, 52.519]), "EPSG:4326", BOUNDARY)).toEqual([]);
  });

  it("checkAgainstField -- a file whose latitude lost its sign is an error naming the distance and lines", () => {
    const issues = checkAgainstField(t([5.394, 5.395, 5.3945], [-52.518, -52.519, -52.5185]), "EPSG:4326", BOUNDARY);
    expect(issues).toEqual([
      expect.objectContaining({ severity: "error", code: "file-far-from-field", line: 2, value: "5.394, -52.518" }),
    ]);
    // By haversine, 52.5185°S to the boundary's southern edge at 52.5175°N is about 11,679 km
    const expectKm = Math.round(haversine(5.3945, -52.5185, 5.3945, 52.5175) / 1000);
    const m = /about ([\d,]+) km/.exec(issues[0].message);
    expect(Math.abs(Number(m![1].replace(/,/g, "")) - expectKm) / expectKm).toBeLessThan(0.01);
    expect(issues[0].message).toContain("lines 2, 3, 4");
  });

  it("checkAgainstField -- a few stray points are a warning with their lines and distance", () => {
    // 0.01° of latitude north of the boundary: about 1.1 km (haversine oracle)
    const issues = checkAgainstField(t([5.394, 5.395, 5.3945], [52.518, 52.519, 52.5295]), "EPSG:4326", BOUNDARY);
    expect(issues).toEqual([expect.objectContaining({ severity: "warning", code: "points-outside-field", line: 4 })]);
    const d = haversine(5.3945, 52.5295, 5.3945, 52.5195);
    expect(issues[0].message).toContain(`up to ${(d / 1000).toFixed(1)} km`);
  });

  it("checkAgainstField -- a projected file is compared through its CRS, and other files' extents serve without a boundary", () => {
    const [e, n] = convertPoint(5.3945, 52.5185, "EPSG:4326", "EPSG:32631");
    const inside = t([e, e + 5], [n, n + 5]);
    const box = lonLatBox(t([5.393, 5.396], [52.5175, 52.5195]), "EPSG:4326")!;
    expect(box).toEqual([5.393, 52.5175, 5.396, 52.5195]);
    const ref = { kind: "files" as const, files: [{ name: "survey.csv", box }] };
    expect(checkAgainstField(inside, "EPSG:32631", ref)).toEqual([]);
    const far = checkAgainstField(t([e, e + 5], [n - 1e6, n - 1e6]), "EPSG:32631", ref);
    expect(far[0]).toMatchObject({ code: "file-far-from-field" });
    expect(far[0].message).toContain("the field's other files (survey.csv)");
  });

  it("checkAgainstField -- the inputs are left unchanged", () => {
    const table = t([5.394], [-52.518]);
    const before = Float64Array.from(table.y);
    checkAgainstField(table, "EPSG:4326", BOUNDARY);
    expect(table.y).toEqual(before);
  });
});

const guess = (columns: Record<string, string>): ColumnGuess => ({
  header: Object.values(columns),
  columns,
  coordinates: "projected",
  rawCoordinates: null,
  unused: [],
});

describe("checkFileKind", () => {
  // common practice, no source: survey files hold tens of checkpoints, as-planted records one row per plant
  it("checkFileKind -- a survey file uploaded as as-planted records is a warning naming its columns", () => {
    const issues = checkFileKind(
      "planted",
      guess({ id: "plant_id", method: "method", precision: "precision_m", x: "easting", y: "northing" }),
      40,
      { planted: [4800], survey: [40] },
      "survey.csv",
    );
    expect(issues).toEqual([
      expect.objectContaining({ severity: "warning", code: "file-kind-doubtful", file: "survey.csv" }),
    ]);
    expect(issues[0].message).toContain('precision column ("precision_m")');
    expect(issues[0].message).toContain("40 row(s), while the field's as-planted files have about 4800");
  });

  it("checkFileKind -- real as-planted records and survey files pass", () => {
    const planted = guess({ id: "plant_id", crop: "crop", bed: "bed", time: "planted_at", x: "lon", y: "lat" });
    expect(checkFileKind("planted", planted, 4800, { planted: [4700], survey: [] }, "p.csv")).toEqual([]);
    const survey = guess({ id: "plant_id", method: "method", precision: "precision_m", x: "e", y: "n" });
    expect(checkFileKind("survey", survey, 60, { planted: [4800], survey: [] }, "s.csv")).toEqual([]);
  });

  it("checkFileKind -- as-planted records uploaded as a survey file are a warning", () => {
    const planted = guess({ id: "plant_id", crop: "crop", bed: "bed", arm: "arm", x: "lon", y: "lat" });
    const issues = checkFileKind("survey", planted, 4800, { planted: [4800], survey: [] }, "p.csv");
    expect(issues[0].message).toContain("looks like as-planted records");
  });
});
