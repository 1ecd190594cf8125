import proj4 from "proj4";
import { describe, expect, it } from "vitest";
import { geographicOf, resolveCrs } from "../crs/registry";
import type { PointTable } from "../types";
import { convertArrays, convertPoint, projectTable, resolveWorkCrs, toLonLat } from "./index";

// Geographic source on the CRS's own datum (no towgs84 shift): the IOGP 373-7-2 examples are conversions, not datum shifts.
const own = (code: string) => geographicOf(resolveCrs(code).proj4);

const table = (x: number[], y: number[], extra: Partial<PointTable> = {}): PointTable => ({
  source: "t.csv",
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

describe("projection", () => {
  it("convertPoint -- transverse Mercator, British National Grid", () => {
    // IOGP Publication 373-7-2 (Guidance Note 7-2), transverse Mercator example: 50°30'N 0°30'E → 577274.99 E, 69740.50 N (exact 577274.984, 69740.492)
    const [e, n] = convertPoint(0.5, 50.5, own("EPSG:27700"), "EPSG:27700");
    expect(Math.abs(e - 577274.984)).toBeLessThan(0.01);
    expect(Math.abs(n - 69740.492)).toBeLessThan(0.01);
  });

  it("convertPoint -- oblique stereographic, RD New", () => {
    // IOGP 373-7-2, oblique stereographic example: 53°N 6°E → 196105.283 E, 557057.739 N (proj4js sterea agrees to 5 mm)
    const [e, n] = convertPoint(6, 53, own("EPSG:28992"), "EPSG:28992");
    expect(Math.abs(e - 196105.283)).toBeLessThan(0.005);
    expect(Math.abs(n - 557057.739)).toBeLessThan(0.005);
  });

  it("convertPoint -- NZTM2000, southern hemisphere transverse Mercator", () => {
    // Land Information New Zealand NZTM test data: 172.739193967 E, -34.444065991 → 1576041.150, 6188574.240
    const [e, n] = convertPoint(172.739193967, -34.444065991, own("EPSG:2193"), "EPSG:2193");
    expect(Math.abs(e - 1576041.15)).toBeLessThan(0.001);
    expect(Math.abs(n - 6188574.24)).toBeLessThan(0.001);
  });

  it("convertPoint -- WGS 84 / UTM zone 1N", () => {
    // proj4js repository, test/testData.js: (-177, 60) → (500000, 6651411.190362714)
    const [e, n] = convertPoint(-177, 60, "EPSG:4326", "EPSG:32601");
    expect(Math.abs(e - 500000)).toBeLessThan(1e-6);
    expect(Math.abs(n - 6651411.190362714)).toBeLessThan(1e-6);
  });

  it("convertPoint -- LAEA Europe", () => {
    // IOGP 373-7-2, Lambert azimuthal equal area example: 50°N 5°E → 3962799.45 E, 2999718.85 N
    const [e, n] = convertPoint(5, 50, own("EPSG:3035"), "EPSG:3035");
    expect(Math.abs(e - 3962799.45)).toBeLessThan(0.01);
    expect(Math.abs(n - 2999718.85)).toBeLessThan(0.01);
  });

  it("convertPoint -- southern UTM zone mirrors the northern one", () => {
    // UTM definition: southern zones add a false northing of 10 000 000 m, and transverse Mercator is
    // symmetric about the equator, so N_south(lon, -lat) = 10 000 000 − N_north(lon, lat) — from memory (NGA.SIG.0012, UTM/UPS)
    for (const [lon, lat] of [
      [171.3, 34.4],
      [174.8, 41.3],
      [168.0, 5.0],
    ]) {
      const [en, nn] = convertPoint(lon, lat, "EPSG:4326", "EPSG:32659");
      const [es, ns] = convertPoint(lon, -lat, "EPSG:4326", "EPSG:32759");
      expect(Math.abs(es - en)).toBeLessThan(1e-6);
      expect(Math.abs(ns - (10_000_000 - nn))).toBeLessThan(1e-6);
    }
    // and UTM zone 60S round-trips the NZTM test point to better than 1 mm (self-consistency)
    const [e, n] = convertPoint(172.739193967, -34.444065991, "EPSG:4326", "EPSG:32760");
    const [lon, lat] = toLonLat(e, n, "EPSG:32760");
    expect(Math.abs(lon - 172.739193967) * 92000).toBeLessThan(0.001);
    expect(Math.abs(lat + 34.444065991) * 111000).toBeLessThan(0.001);
  });

  it("convertArrays -- identical definitions return the same arrays; NaN stays NaN", () => {
    const x = Float64Array.from([500000, NaN]),
      y = Float64Array.from([5800000, 1]);
    const [ox, oy] = convertArrays(x, y, "EPSG:32632", "EPSG:32632");
    expect(ox).toBe(x);
    expect(oy).toBe(y);
    const [gx] = convertArrays(Float64Array.from([9, NaN]), Float64Array.from([52, 52]), "EPSG:4326", "EPSG:32632");
    expect(gx[1]).toBeNaN();
    // Oracle: proj4js called point by point with its own WGS84 / UTM definitions
    expect(gx[0]).toBeCloseTo(proj4("EPSG:4326", "+proj=utm +zone=32 +datum=WGS84 +units=m +no_defs", [9, 52])[0], 9);
  });

  it("convertArrays -- fast path equals proj4's full conversion, datum shifts included", () => {
    // Oracle: proj4js's own converter point by point (the full pipeline with datum handling)
    const n = 500;
    const lon = Float64Array.from({ length: n }, (_, i) => -1.5 + (i % 25) * 0.01);
    const lat = Float64Array.from({ length: n }, (_, i) => 52 + Math.floor(i / 25) * 0.01);
    for (const target of ["EPSG:32630", "EPSG:27700", "EPSG:3035", "EPSG:25830"]) {
      const [e, nn] = convertArrays(lon, lat, "EPSG:4326", target);
      const c = proj4(resolveCrs("EPSG:4326").proj4, resolveCrs(target).proj4);
      for (let i = 0; i < n; i += 37) {
        const [re, rn] = c.forward([lon[i], lat[i]]);
        expect(e[i]).toBe(re);
        expect(nn[i]).toBe(rn);
      }
    }
  });

  it("projectTable -- projects positions and raw GNSS, leaves the input untouched", () => {
    const t = table([9.1, 9.2], [52.1, 52.2], {
      rawX: Float64Array.from([9.1000001, NaN]),
      rawY: Float64Array.from([52.1, NaN]),
    });
    const copy = structuredClone(t);
    const p = projectTable(t, "EPSG:4326", "EPSG:32632");
    expect(p.crs).toBe("EPSG:32632");
    expect(p.x[0]).toBeGreaterThan(400000);
    expect(p.rawX![0] - p.x[0]).toBeCloseTo(0.0068, 3); // 1e-7° of longitude at 52.1° ≈ 6.8 mm (by construction)
    expect(p.rawX![1]).toBeNaN();
    expect(t).toEqual(copy);
    expect(() => projectTable(t, "EPSG:4326", "EPSG:4326")).toThrow(/work CRS "EPSG:4326" is geographic/);
  });

  it("resolveWorkCrs -- auto picks the UTM zone of the data, hemisphere aware", () => {
    expect(resolveWorkCrs("auto", [{ table: table([9.1, 9.2], [52.1, 52.2]), crs: "EPSG:4326" }]).code).toBe(
      "EPSG:32632",
    );
    expect(resolveWorkCrs("auto", [{ table: table([1576041], [6188574]), crs: "EPSG:2193" }]).code).toBe("EPSG:32759"); // 172.74°E → zone 59
    expect(resolveWorkCrs("EPSG:25832", []).code).toBe("EPSG:25832");
    expect(() => resolveWorkCrs("EPSG:4326", [])).toThrow(/geographic/);
    expect(() => resolveWorkCrs("auto", [{ table: table([NaN], [NaN]), crs: "EPSG:4326" }])).toThrow(
      /no finite positions/,
    );
  });
});
