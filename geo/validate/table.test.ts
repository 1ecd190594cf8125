import { IdColumn } from "../ids";
import { describe, expect, it } from "vitest";
import { resolveCrs } from "../crs/registry";
import { convertPoint } from "../project";
import type { PointTable } from "../types";
import { validateTable } from "./table";

// Checks by construction (coordinate ranges: latitude ±90°, longitude ±180°); the 20-checkpoint
// minimum is FGDC-STD-007.3-1998 §3.2.2 (read). A fictional field near 52.3°N 9.77°E is used.
const t = (x: number[], y: number[], extra: Partial<PointTable> = {}): PointTable => ({
  source: "f.csv",
  role: "planted",
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
  ...extra,
});
const WGS = resolveCrs("EPSG:4326"),
  UTM = resolveCrs("EPSG:32632");
const codes = (issues: { code: string }[]) => issues.map((i) => i.code);

describe("validateTable", () => {
  it("validateTable -- a clean geographic file has no issues", () => {
    expect(validateTable(t([9.77, 9.78], [52.3, 52.31]), WGS)).toEqual([]);
  });

  it("validateTable -- latitude out of range names line, column and value", () => {
    const issues = validateTable(t([9.77, 9.78, 200], [52.3, 95, 52.3]), WGS, {
      columns: {
        header: [],
        columns: { x: "lon", y: "lat" },
        coordinates: "geographic",
        rawCoordinates: null,
        unused: [],
      },
    });
    expect(issues).toEqual([
      expect.objectContaining({
        code: "latitude-out-of-range",
        line: 3,
        column: "lat",
        value: "95",
        severity: "error",
      }),
      expect.objectContaining({ code: "longitude-out-of-range", line: 4, column: "lon", value: "200" }),
    ]);
  });

  it("validateTable -- swapped latitude/longitude", () => {
    // A field at 52°N 125°W written lon-first in the lat column: latitudes of -125 cannot be.
    expect(codes(validateTable(t([52.3, 52.31], [-125.1, -125.2]), WGS))).toEqual(["lat-lon-swapped"]);
  });

  it("validateTable -- metres in a geographic CRS, degrees in a projected one", () => {
    expect(codes(validateTable(t([552300], [5794100]), WGS))).toEqual(["coordinates-look-projected"]);
    expect(codes(validateTable(t([9.77], [52.3]), UTM))).toEqual(["coordinates-look-like-degrees"]);
  });

  it("validateTable -- columns of the wrong kind for the CRS", () => {
    const issues = validateTable(t([9.77], [52.3]), UTM, {
      columns: { header: [], columns: {}, coordinates: "geographic", rawCoordinates: null, unused: [] },
    });
    expect(codes(issues)).toEqual(["crs-kind-mismatch"]);
  });

  it("validateTable -- projected: swapped axes and millimetres are named", () => {
    const [e, n] = convertPoint(9.77, 52.3, "EPSG:4326", "EPSG:32632");
    expect(validateTable(t([e, e + 1], [n, n + 1]), UTM)).toEqual([]);
    expect(codes(validateTable(t([n, n + 1], [e, e + 1]), UTM))).toEqual(["easting-northing-swapped"]);
    expect(codes(validateTable(t([e * 1000, e * 1000 + 5], [n * 1000, n * 1000 + 5]), UTM))).toEqual([
      "coordinates-look-like-millimetres",
    ]);
  });

  it("validateTable -- duplicate ids list every line", () => {
    const issues = validateTable(
      t([9.77, 9.78, 9.79, 9.8], [52.3, 52.3, 52.3, 52.3], { id: IdColumn.from(["A", "B", "A", "A"]) }),
      WGS,
    );
    expect(issues).toEqual([expect.objectContaining({ code: "id-duplicate", severity: "error", value: "A", line: 4 })]);
    expect(issues[0].message).toContain("appears 3 times, on lines 2, 4, 5");
  });

  it("validateTable -- warnings: mixed fix, few checkpoints", () => {
    const fix = { codes: Int32Array.from([0, 1, 0]), values: ["rtk-fixed", "rtk-float"] };
    const issues = validateTable(t([9.77, 9.78, 9.79], [52.3, 52.3, 52.3], { role: "survey", attrs: { fix } }), WGS);
    expect(issues.map((i) => [i.code, i.severity])).toEqual([
      ["fix-mixed", "warning"],
      ["few-points", "warning"],
    ]);
    expect(issues[0].message).toContain("rtk-fixed: 2, rtk-float: 1");
  });

  it("validateTable -- repeated survey point names are an error naming both lines", () => {
    // common practice, no source: a checkpoint measured twice would count twice in the statistics
    const ids = IdColumn.from(["CP1", "CP2", "CP1"]);
    const issues = validateTable(t([9.77, 9.7701, 9.7702], [52.3, 52.3, 52.3], { role: "survey", id: ids }), WGS, {
      minCheckpoints: 1,
    });
    expect(issues).toEqual([
      expect.objectContaining({ severity: "error", code: "id-duplicate", value: "CP1", line: 4 }),
    ]);
    expect(issues[0].message).toContain('survey point name "CP1" appears 2 times, on lines 2, 4');
  });

  it("validateTable -- a precision column in millimetres inside a metres file is a warning suggesting millimetres", () => {
    // common practice, no source: RTK and total-station checkpoints state mm to cm, never metres
    const mm = validateTable(
      t([9.77, 9.7701, 9.7702], [52.3, 52.3, 52.3], { role: "survey", precision: Float64Array.from([4, 1.5, 2]) }),
      WGS,
      { minCheckpoints: 1 },
    );
    expect(mm).toEqual([
      expect.objectContaining({ severity: "warning", code: "precision-implausible", value: "2", line: 2 }),
    ]);
    expect(mm[0].message).toContain("millimetres");
    const metres = validateTable(
      t([9.77, 9.7701, 9.7702], [52.3, 52.3, 52.3], {
        role: "survey",
        precision: Float64Array.from([0.004, 0.0015, 0.002]),
      }),
      WGS,
      { minCheckpoints: 1 },
    );
    expect(metres).toEqual([]);
  });
});
