import { describe, expect, it } from "vitest";
import { resolveCrs, type CrsEntry } from "../crs/registry";
import { convertArrays, projectTable } from "../project";
import type { PointTable } from "../types";
import { validateFiles } from "./files";

// By construction: a fictional field near 52.3°N 9.77°E; distances in UTM 32N metres.
const base = (x: number[], y: number[], source: string): PointTable => ({
  source,
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
});
const file = (t: PointTable, crs: CrsEntry, work = "EPSG:32632") => ({
  source: t,
  crs,
  projected: projectTable(t, crs, work),
});
const lon = [9.77, 9.7701, 9.7702],
  lat = [52.3, 52.3001, 52.3002];
const [ue, un] = convertArrays(Float64Array.from(lon), Float64Array.from(lat), "EPSG:4326", "EPSG:32632");

describe("validateFiles", () => {
  it("validateFiles -- same field, same datum: no issues", () => {
    const p = file(base(lon, lat, "planted.csv"), resolveCrs("EPSG:4326"));
    const s = file(base(Array.from(ue), Array.from(un), "survey.csv"), resolveCrs("EPSG:32632"));
    expect(validateFiles(p, s)).toEqual([]);
  });

  it("validateFiles -- wrong CRS chosen: files far apart, with a hint", () => {
    const p = file(base(lon, lat, "planted.csv"), resolveCrs("EPSG:4326"));
    // survey really in UTM 32N but declared UTM 33N: 600+ km west
    const s = file(base(Array.from(ue), Array.from(un), "survey.csv"), resolveCrs("EPSG:32633"));
    const issues = validateFiles(p, s);
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ code: "files-far-apart", severity: "error" });
    expect(issues[0].message).toMatch(
      /survey\.csv \(EPSG:32633\) lie \d+\.\d km from the as-planted records in planted\.csv \(EPSG:4326\)/,
    );
    expect(issues[0].message).toMatch(/EPSG:32632/);
  });

  it("validateFiles -- swapped lat/lon in one file is diagnosed", () => {
    const p = file(base(lat, lon, "planted.csv"), resolveCrs("EPSG:4326"));
    const s = file(base(Array.from(ue), Array.from(un), "survey.csv"), resolveCrs("EPSG:32632"));
    const issues = validateFiles(p, s);
    expect(issues[0].code).toBe("files-far-apart");
    expect(issues[0].message).toContain("In planted.csv the two coordinate columns look swapped");
  });

  it("validateFiles -- survey in millimetres is diagnosed", () => {
    const p = file(base(lon, lat, "planted.csv"), resolveCrs("EPSG:4326"));
    const s = file(
      base(
        Array.from(ue, (v) => v * 1000),
        Array.from(un, (v) => v * 1000),
        "survey.csv",
      ),
      resolveCrs("EPSG:32632"),
    );
    const issues = validateFiles(p, s);
    expect(issues[0].code).toBe("files-far-apart");
    expect(issues[0].message).toContain("The values in survey.csv look like millimetres");
  });

  it("validateFiles -- stray points and datum differences are warnings", () => {
    const p = file(base([...lon, 0], [...lat, 0], "planted.csv"), resolveCrs("EPSG:4326"));
    const s = file(base(Array.from(ue), Array.from(un), "survey.csv"), resolveCrs("EPSG:32632"));
    expect(validateFiles(p, s).map((i) => [i.code, i.severity, i.line])).toEqual([
      ["point-far-from-others", "warning", 5],
    ]);
    const d = file(base([9.77], [52.3], "survey.csv"), {
      ...resolveCrs("EPSG:4326"),
      code: "custom",
      proj4: "+proj=longlat +ellps=bessel +towgs84=598.1,73.7,418.2,0.202,0.045,-2.455,6.7 +no_defs",
    });
    expect(validateFiles(file(base(lon, lat, "planted.csv"), resolveCrs("EPSG:4326")), d).map((i) => i.code)).toEqual([
      "datum-shift",
    ]);
  });
});
