import { describe, expect, it } from "vitest";
import { readCsv } from "./csv";
import { readGeoJson } from "./geojson";
import { appendReadResults } from "./merge";
import { statusOf } from "./status";

// The status column's words are our own rules (README "Survey files: the status column"); expected values are by
// construction from those rules. common practice, no source: a surveyor notes a planned plant as dead or not found.

const survey = { source: "survey.csv", role: "survey" as const };

describe("status", () => {
  it("statusOf -- spellings, case and separators", () => {
    expect(statusOf("")).toBe("measured");
    expect(statusOf("  ")).toBe("measured");
    expect(statusOf("Surveyed")).toBe("measured");
    expect(statusOf("DEAD")).toBe("dead");
    expect(statusOf("not found")).toBe("not found");
    expect(statusOf("Not_Found")).toBe("not found");
    expect(statusOf("not-found")).toBe("not found");
    expect(statusOf("missing")).toBe("not found");
    expect(statusOf("broken")).toBeNull();
  });

  it("readCsv -- dead and not found rows without coordinates are recorded, not refused", async () => {
    const text = [
      "point,status,easting,northing",
      "C0001,,552300.10,5794100.20",
      "C0002,dead,,",
      "C0003,surveyed,552301.10,5794101.20",
      "C0004,Not found,,",
    ].join("\n");
    const r = await readCsv(text, survey);
    expect(r.issues).toEqual([]);
    expect(r.columns.columns.status).toBe("status");
    expect(r.table!.length).toBe(2);
    expect(r.table!.id!.toArray()).toEqual(["C0001", "C0003"]);
    expect(Array.from(r.table!.line)).toEqual([2, 4]);
    expect(r.recordedMissing).toEqual([
      { line: 3, id: "C0002", status: "dead" },
      { line: 5, id: "C0004", status: "not found" },
    ]);
  });

  it("readCsv -- a file without a status column reads as before", async () => {
    const r = await readCsv("point,easting,northing\nC0001,552300.1,5794100.2\n", survey);
    expect(r.issues).toEqual([]);
    expect(r.recordedMissing).toEqual([]);
    expect(r.columns.columns.status).toBeUndefined();
  });

  it("readCsv -- unknown status value is an error naming file, line, column and value", async () => {
    const r = await readCsv("point;Status;easting;northing\nC0001;;1;2\nC0002;broken;;\n", survey);
    expect(r.table).toBeNull();
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({
      severity: "error",
      code: "status-unknown",
      file: "survey.csv",
      line: 3,
      column: "Status",
      value: "broken",
    });
    expect(r.issues[0].message).toContain('"dead"');
  });

  it("readCsv -- a recorded-missing row without a point name is an error naming the id column", async () => {
    const r = await readCsv("point,status,easting,northing\nC0001,,1,2\n,dead,,\n", survey);
    expect(r.table).toBeNull();
    expect(r.issues[0]).toMatchObject({ code: "status-without-id", file: "survey.csv", line: 3, column: "point" });
    expect(r.issues[0].message).toContain("dead");
  });

  it("readCsv -- a recorded-missing row in a file with no id column names the status column", async () => {
    const r = await readCsv("status,easting,northing\n,1,2\nnot found,,\n", survey);
    expect(r.table).toBeNull();
    expect(r.issues[0]).toMatchObject({ code: "status-without-id", line: 3, column: "status" });
  });

  it("readCsv -- a measured row still needs its coordinates", async () => {
    const r = await readCsv("point,status,easting,northing\nC0001,,1,2\nC0002,surveyed,,\n", survey);
    expect(r.issues).toEqual([
      expect.objectContaining({ severity: "warning", code: "coordinate-missing", line: 3, column: "easting" }),
    ]);
    expect(r.table!.length).toBe(1);
    expect(r.recordedMissing).toEqual([]);
  });

  it("readCsv -- a recorded-missing row with a position: the position is not used, with a warning", async () => {
    const r = await readCsv("point,status,easting,northing\nC0001,,1,2\nC0002,dead,3,4\n", survey);
    expect(r.table!.length).toBe(1);
    expect(r.recordedMissing).toEqual([{ line: 3, id: "C0002", status: "dead" }]);
    expect(r.issues).toEqual([
      expect.objectContaining({ severity: "warning", code: "status-position-unused", line: 3, column: "status" }),
    ]);
  });

  it("readCsv -- as-planted records: a status column is not read", async () => {
    const r = await readCsv("plant_id,status,lat,lon\nP1,dead,52.1,9.2\n", { source: "p.csv", role: "planted" });
    expect(r.issues).toEqual([]);
    expect(r.table!.length).toBe(1);
    expect(r.columns.columns.status).toBeUndefined();
    expect(r.recordedMissing).toEqual([]);
  });

  it("readCsv -- quoted rows (slow path) and small slices give the same records", async () => {
    const text = 'point,status,easting,northing\n"C0001","",1,2\n"C0002","dead",,\nC0003,,3,4\nC0004,not found,,\n';
    const a = await readCsv(text, survey);
    const b = await readCsv(text.replaceAll('"', ""), { ...survey, sliceChars: 7 });
    expect(a.recordedMissing).toEqual([
      { line: 3, id: "C0002", status: "dead" },
      { line: 5, id: "C0004", status: "not found" },
    ]);
    expect(b.recordedMissing).toEqual(a.recordedMissing);
    expect(a.table!.length).toBe(2);
    expect(b.table!.length).toBe(2);
  });

  it("readCsv -- the input is not changed and a mapping can name the status column", async () => {
    const text = "point,how,easting,northing\nC0001,,1,2\nC0002,dead,,\n";
    const copy = text.slice();
    const r = await readCsv(text, { ...survey, mapping: { status: "how" } });
    expect(text).toBe(copy);
    expect(r.recordedMissing).toEqual([{ line: 3, id: "C0002", status: "dead" }]);
  });

  it("readGeoJson -- a feature without geometry but with a status is recorded", async () => {
    const fc = {
      type: "FeatureCollection",
      features: [
        {
          type: "Feature",
          properties: { point: "C0001", status: "" },
          geometry: { type: "Point", coordinates: [1, 2] },
        },
        { type: "Feature", properties: { point: "C0002", status: "dead" }, geometry: null },
        { type: "Feature", properties: { point: "C0003", status: "" }, geometry: null },
      ],
    };
    const r = await readGeoJson(JSON.stringify(fc), { source: "s.geojson", role: "survey" });
    expect(r.recordedMissing).toEqual([{ line: 2, id: "C0002", status: "dead" }]);
    expect(r.issues).toEqual([expect.objectContaining({ code: "coordinate-missing", line: 3 })]);
    expect(r.table!.length).toBe(1);
  });

  it("appendReadResults -- recorded rows of the second part get the first part's lines", async () => {
    const head = "point,status,easting,northing\n";
    const a = await readCsv(`${head}C0001,,1,2\nC0002,dead,,\n`, survey);
    const b = await readCsv(`${head}C0003,not found,,\nC0004,,3,4\n`, survey);
    const m = appendReadResults(a, b, a.linesRead! - 1);
    expect(m.recordedMissing).toEqual([
      { line: 3, id: "C0002", status: "dead" },
      { line: 4, id: "C0003", status: "not found" },
    ]);
    expect(m.table!.length).toBe(2);
  });
});
