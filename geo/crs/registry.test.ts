import { describe, expect, it } from "vitest";
import { containsLonLat, datumShiftBetween, findCrs, geographicOf, listCrs, resolveCrs, utmFor } from "./registry";

// Sources: EPSG dataset codes and names (EPSG:32601–32660 / 32701–32760 WGS 84 / UTM, 25828–25838
// ETRS89 / UTM, 27700, 28992, 2193, 3035, 2056, 31467, 3006, 2154), as published in the EPSG registry;
// UTM zone numbering: zone = floor((lon + 180) / 6) + 1 (UTM definition, common practice, no source).
describe("crs registry", () => {
  it("listCrs -- bundles geographic, all UTM zones, ETRS89 UTM and national grids", () => {
    const codes = new Set(listCrs().map((c) => c.code));
    for (let z = 1; z <= 60; z++) {
      expect(codes.has(`EPSG:${32600 + z}`)).toBe(true);
      expect(codes.has(`EPSG:${32700 + z}`)).toBe(true);
    }
    for (let z = 28; z <= 38; z++) expect(codes.has(`EPSG:${25800 + z}`)).toBe(true);
    for (const c of [
      "EPSG:4326",
      "EPSG:4258",
      "EPSG:27700",
      "EPSG:28992",
      "EPSG:2193",
      "EPSG:3035",
      "EPSG:2056",
      "EPSG:31467",
      "EPSG:3006",
    ]) {
      expect(codes.has(c)).toBe(true);
    }
    for (const c of listCrs()) {
      expect(c.area[0]).toBeLessThan(c.area[2]);
      expect(c.area[1]).toBeLessThan(c.area[3]);
      expect(c.proj4).toMatch(/^\+proj=/);
    }
  });

  it("resolveCrs -- codes, bare numbers, aliases and proj strings", () => {
    expect(resolveCrs("EPSG:25832").name).toBe("ETRS89 / UTM zone 32N");
    expect(resolveCrs("epsg:32759").name).toBe("WGS 84 / UTM zone 59S");
    expect(resolveCrs("27700").code).toBe("EPSG:27700");
    expect(resolveCrs("WGS84").code).toBe("EPSG:4326");
    expect(resolveCrs("+proj=longlat +datum=WGS84").kind).toBe("geographic");
    expect(resolveCrs("+proj=tmerc +lon_0=173 +k=0.9996").kind).toBe("projected");
    expect(() => resolveCrs("EPSG:99999")).toThrow(/unknown CRS "EPSG:99999"/);
    expect(() => resolveCrs("+towgs84=1")).toThrow(/unknown CRS/);
  });

  it("findCrs -- by number or words, exact codes first, local ones next", () => {
    expect(findCrs("27700")[0].name).toBe("OSGB 1936 / British National Grid");
    expect(findCrs("utm 32")[0].code).toBe("EPSG:32632");
    expect(findCrs("etrs89 utm 32").map((c) => c.code)).toEqual(["EPSG:25832"]);
    expect(findCrs("utm 59", { lon: 172.7, lat: -34.4 })[0].code).toBe("EPSG:32759");
    expect(findCrs("no such grid")).toEqual([]);
  });

  it("utmFor -- hemisphere and zone", () => {
    expect(utmFor(9.2, 52.1).code).toBe("EPSG:32632");
    expect(utmFor(-177, 60).code).toBe("EPSG:32601");
    expect(utmFor(172.7, -34.4).code).toBe("EPSG:32759");
    expect(utmFor(180, 10).code).toBe("EPSG:32601");
    expect(utmFor(179.99, 10).code).toBe("EPSG:32660");
  });

  it("geographicOf / datumShiftBetween -- same datum vs a towgs84 shift", () => {
    expect(geographicOf(resolveCrs("EPSG:27700").proj4)).toBe(
      "+proj=longlat +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +no_defs",
    );
    expect(datumShiftBetween(resolveCrs("EPSG:27700").proj4, resolveCrs("EPSG:4326").proj4)).toBe(true);
    expect(datumShiftBetween(resolveCrs("EPSG:25832").proj4, resolveCrs("EPSG:32632").proj4)).toBe(false);
    expect(datumShiftBetween(resolveCrs("EPSG:4258").proj4, resolveCrs("EPSG:4326").proj4)).toBe(false);
    expect(containsLonLat(resolveCrs("EPSG:28992").area, 5.4, 52.2)).toBe(true);
  });
});
