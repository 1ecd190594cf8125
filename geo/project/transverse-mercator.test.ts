import proj4 from "proj4";
import { describe, expect, it } from "vitest";
import { isTransverseMercator, transverseMercatorForward } from "./transverse-mercator";

// Oracle: proj4js's own projection object (`new proj4.Proj(def).forward`, its etmerc series), point by point.
// The array version must give the very same doubles, not merely close ones.
const D2R = Math.PI / 180;

function compare(def: string, lon: number[], lat: number[]): void {
  const o = new proj4.Proj(def) as unknown as Parameters<typeof transverseMercatorForward>[0] & {
    forward(p: { x: number; y: number }): { x: number; y: number };
  };
  expect(isTransverseMercator(o)).toBe(true);
  const x = Float64Array.from(lon),
    y = Float64Array.from(lat);
  const ox = new Float64Array(x.length),
    oy = new Float64Array(x.length);
  transverseMercatorForward(o, x, y, D2R, ox, oy);
  for (let i = 0; i < x.length; i++) {
    const r = o.forward({ x: x[i] * D2R, y: y[i] * D2R });
    expect(Object.is(ox[i], r.x), `${def} at ${lon[i]}, ${lat[i]}: ${ox[i]} vs ${r.x}`).toBe(true);
    expect(Object.is(oy[i], r.y), `${def} at ${lon[i]}, ${lat[i]}: ${oy[i]} vs ${r.y}`).toBe(true);
  }
}

function grid(lon0: number, lon1: number, lat0: number, lat1: number, steps: number): [number[], number[]] {
  const lon: number[] = [],
    lat: number[] = [];
  for (let i = 0; i <= steps; i++)
    for (let j = 0; j <= steps; j++) {
      lon.push(lon0 + ((lon1 - lon0) * i) / steps + 1e-7 * j);
      lat.push(lat0 + ((lat1 - lat0) * j) / steps);
    }
  return [lon, lat];
}

describe("transverse Mercator over arrays", () => {
  it("transverse Mercator -- UTM zones north and south give proj4's own doubles, in and far outside the zone", () => {
    const [lon, lat] = grid(-20, 30, -80, 84, 60); // zone 31 spans 0–6°E; far outside, proj4 returns Infinity
    compare("+proj=utm +zone=31 +ellps=GRS80 +units=m +no_defs", lon, lat);
    compare(
      "+proj=utm +zone=59 +south +datum=WGS84 +units=m +no_defs",
      grid(165, 178, -50, -30, 30)[0],
      grid(165, 178, -50, -30, 30)[1],
    );
  });

  it("transverse Mercator -- other transverse Mercator grids (British National Grid's, New Zealand's) on their ellipsoids", () => {
    // projection parameters as in EPSG:27700 and EPSG:2193 (proj4 strings from memory; no datum shift involved here)
    const [lon, lat] = grid(-8, 2, 49.5, 61, 40);
    compare(
      "+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m +no_defs",
      lon,
      lat,
    );
    const [nlon, nlat] = grid(166, 179, -47.5, -34, 40);
    compare(
      "+proj=tmerc +lat_0=0 +lon_0=173 +k=0.9996 +x_0=1600000 +y_0=10000000 +ellps=GRS80 +units=m +no_defs",
      nlon,
      nlat,
    );
  });

  it("transverse Mercator -- NaN in gives Infinity out, as proj4's forward does (convertArrays then takes the full path); not for +approx", () => {
    const o = new proj4.Proj("+proj=utm +zone=32 +datum=WGS84 +units=m +no_defs") as never;
    const ox = new Float64Array(1),
      oy = new Float64Array(1);
    transverseMercatorForward(o, Float64Array.of(Number.NaN), Float64Array.of(52), D2R, ox, oy);
    expect(ox[0]).toBe((o as { forward(p: object): { x: number } }).forward({ x: Number.NaN, y: 52 * D2R }).x);
    expect(isTransverseMercator(new proj4.Proj("+proj=tmerc +approx +lon_0=9 +ellps=GRS80 +units=m") as never)).toBe(
      false,
    );
    expect(isTransverseMercator(new proj4.Proj("+proj=laea +lat_0=52 +lon_0=10 +ellps=GRS80 +units=m") as never)).toBe(
      false,
    );
  });
});
