import { describe, expect, it } from "vitest";
import { readGeoJson } from "./geojson";
import { readPoints } from "./index";

// Source: RFC 7946 (GeoJSON) §3.1.1 — positions are [longitude, latitude]; §3.2 — a Feature's "id".
// The legacy "crs" member ("urn:ogc:def:crs:EPSG::n") is from the 2008 GeoJSON specification, from memory.
const opts = { source: "survey.geojson", role: "survey" as const };
const fcOf = (features: unknown[], extra: Record<string, unknown> = {}) =>
  JSON.stringify({ type: "FeatureCollection", ...extra, features });
const pt = (x: number, y: number, properties: Record<string, unknown> | null = {}, id?: string) => ({
  type: "Feature",
  ...(id ? { id } : {}),
  geometry: { type: "Point", coordinates: [x, y] },
  properties,
});

describe("geojson", () => {
  it("readGeoJson -- points with properties as columns, [lon, lat] order", async () => {
    const r = await readGeoJson(
      fcOf([
        pt(9.2, 52.1, { plant_id: "P1", method: "rtk", sigma: 0.01 }),
        pt(9.3, 52.2, { plant_id: "P2", method: "rtk" }),
      ]),
      opts,
    );
    expect(r.issues).toEqual([]);
    const t = r.table!;
    expect(Array.from(t.x)).toEqual([9.2, 9.3]);
    expect(Array.from(t.y)).toEqual([52.1, 52.2]);
    expect(Array.from(t.line)).toEqual([1, 2]);
    expect(t.id!.toArray()).toEqual(["P1", "P2"]);
    expect(t.attrs.method!.values).toEqual(["rtk"]);
    expect(t.precision![0]).toBe(0.01);
    expect(t.precision![1]).toBeNaN();
    expect(r.columns.coordinates).toBe("geographic");
  });

  it("readGeoJson -- feature id used as plant id; projected legacy crs", async () => {
    const r = await readGeoJson(
      fcOf([pt(552300.5, 5794100.25, null, "P9")], {
        crs: { type: "name", properties: { name: "urn:ogc:def:crs:EPSG::25832" } },
      }),
      opts,
    );
    expect(r.crsHint).toBe("EPSG:25832");
    expect(r.columns.coordinates).toBe("projected");
    expect(r.table!.id!.toArray()).toEqual(["P9"]);
    // Read again with the mapping stored after the first read (as review re-reads raw files).
    const again = await readGeoJson(fcOf([pt(552300.5, 5794100.25, null, "P9")]), {
      ...opts,
      mapping: { ...r.columns.columns, x: undefined, y: undefined, coordinates: "projected" },
    });
    expect(again.issues).toEqual([]);
    expect(again.table!.id!.toArray()).toEqual(["P9"]);
  });

  it("readGeoJson -- mapping id null: neither the id property nor the feature id is read", async () => {
    const text = fcOf([pt(9.2, 52.1, { plant_id: "P1", method: "rtk" }, "F1")]);
    const r = await readGeoJson(text, { ...opts, mapping: { id: null } });
    expect(r.table!.id).toBeNull();
    expect(r.columns.columns.id).toBeUndefined();
    expect(r.columns.unused).toEqual(["plant_id"]);
    expect(r.table!.attrs.method!.values).toEqual(["rtk"]);
  });

  it("readGeoJson -- errors: not JSON, not a FeatureCollection, a line geometry, text coordinates", async () => {
    expect((await readGeoJson("{oops", opts)).issues[0].code).toBe("geojson-invalid");
    expect((await readGeoJson('{"type":"Feature"}', opts)).issues[0].code).toBe("geojson-not-feature-collection");
    const line = await readGeoJson(
      fcOf([
        pt(9, 52),
        {
          type: "Feature",
          geometry: {
            type: "LineString",
            coordinates: [
              [9, 52],
              [9, 53],
            ],
          },
          properties: {},
        },
      ]),
      opts,
    );
    expect(line.issues[0]).toMatchObject({ code: "geometry-not-point", line: 2, value: "LineString" });
    expect(line.table).toBeNull();
    const text = await readGeoJson(
      fcOf([{ type: "Feature", geometry: { type: "Point", coordinates: ["9", 52] }, properties: {} }]),
      opts,
    );
    expect(text.issues[0]).toMatchObject({ code: "coordinate-not-numeric", line: 1 });
    expect((await readGeoJson("", opts)).issues[0].code).toBe("file-empty");
  });

  it("readGeoJson -- feature without geometry is left out with a warning", async () => {
    const r = await readGeoJson(fcOf([pt(9, 52), { type: "Feature", geometry: null, properties: {} }]), opts);
    expect(r.table!.length).toBe(1);
    expect(r.issues[0]).toMatchObject({ code: "coordinate-missing", severity: "warning", line: 2 });
  });

  it("readPoints -- picks the reader from the file name", async () => {
    const r = await readPoints(fcOf([pt(9, 52)]), { source: "x.GeoJSON", role: "survey" });
    expect(r.table!.length).toBe(1);
    const c = await readPoints("lat,lon\n52,9\n", { source: "x.csv", role: "survey" });
    expect(c.table!.length).toBe(1);
  });
});
