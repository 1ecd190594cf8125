import { describe, expect, it } from "vitest";
import proj4 from "proj4";
import { fitBounds, gridConvergenceDeg, lengthLabel, metresPerPixel, scaleBar } from "./view";
import { convergenceAt, originFor, projectBoundary, unionBox } from "./payload";

describe("view", () => {
  it("fitBounds -- the tighter axis sets the zoom; padding is kept free", () => {
    const f = fitBounds({ minX: -50, minY: -10, maxX: 50, maxY: 10 }, 1000, 400, 0);
    expect(f.target).toEqual([0, 0]);
    expect(f.zoom).toBeCloseTo(Math.log2(10), 12); // 1000 px / 100 m
    const tall = fitBounds({ minX: 0, minY: 0, maxX: 10, maxY: 100 }, 1000, 448, 24);
    expect(2 ** tall.zoom * 100).toBeCloseTo(400, 9); // 100 m fill the 400 px left between the paddings
    expect(tall.target).toEqual([5, 50]);
  });

  it("metresPerPixel -- zoom z shows 2^z pixels per metre (deck.gl OrthographicView)", () => {
    expect(metresPerPixel(0)).toBe(1);
    expect(metresPerPixel(3)).toBe(0.125);
  });

  it("scaleBar -- longest round length that fits", () => {
    expect(scaleBar(0.1, 120)).toEqual({ metres: 10, px: 100, label: "10 m" });
    expect(scaleBar(0.1, 99)).toMatchObject({ metres: 5, px: 50, label: "5 m" });
    expect(scaleBar(0.004, 120)).toMatchObject({ metres: 0.2, label: "20 cm" });
    expect(scaleBar(20, 120)).toMatchObject({ metres: 2000, label: "2 km" });
    expect(scaleBar(0.00002, 120).label).toBe("2 mm");
  });

  it("lengthLabel -- units by size", () => {
    expect(lengthLabel(0.5)).toBe("50 cm");
    expect(lengthLabel(1)).toBe("1 m");
    expect(lengthLabel(0.005)).toBe("5 mm");
  });
});

describe("grid north", () => {
  it("gridConvergenceDeg -- matches the transverse Mercator convergence γ ≈ atan(tan(λ − λ₀) · sin φ)", () => {
    // Spherical TM convergence (Snyder 1987, USGS Professional Paper 1395, §8, from memory); UTM 31N: λ₀ = 3° E.
    for (const [lon, lat] of [
      [5.3936, 52.5178],
      [1.2, 51.0],
      [4.9, 60.3],
    ] as const) {
      const gamma =
        (Math.atan(Math.tan(((lon - 3) * Math.PI) / 180) * Math.sin((lat * Math.PI) / 180)) * 180) / Math.PI;
      const [e, n] = proj4("EPSG:4326", "+proj=utm +zone=31 +ellps=GRS80 +units=m +no_defs", [lon, lat]);
      const [lon2, lat2] = proj4("+proj=utm +zone=31 +ellps=GRS80 +units=m +no_defs", "EPSG:4326", [e, n + 100]);
      expect(gridConvergenceDeg([lon, lat], [lon2, lat2])).toBeCloseTo(gamma, 2);
      expect(convergenceAt(e, n, "EPSG:25831")).toBeCloseTo(gamma, 2);
    }
  });

  it("convergenceAt -- east of the central meridian grid north lies east of true north", () => {
    expect(convergenceAt(662_431, 5_821_325, "EPSG:25831")!).toBeGreaterThan(1.8);
    expect(convergenceAt(662_431, 5_821_325, "EPSG:25831")!).toBeLessThan(2.0);
    expect(convergenceAt(0, 0, "not a crs")).toBeNull();
  });
});

describe("boundary and origin", () => {
  it("projectBoundary -- WGS 84 ring into the work CRS, closing point dropped, checked against proj4", () => {
    const ring = [
      [5.3935, 52.5177],
      [5.3945, 52.5177],
      [5.3945, 52.5183],
      [5.3935, 52.5183],
      [5.3935, 52.5177],
    ];
    const en = projectBoundary({ type: "Polygon", coordinates: [ring] }, "EPSG:25831")!;
    expect(en).toHaveLength(8);
    const [e1, n1] = proj4("EPSG:4326", "+proj=utm +zone=31 +ellps=GRS80 +units=m +no_defs", ring[1]); // proj4 as independent oracle
    expect(en[2]).toBeCloseTo(e1, 3);
    expect(en[3]).toBeCloseTo(n1, 3);
    expect(projectBoundary(null, "EPSG:25831")).toBeNull();
  });

  it("originFor -- centre of records and boundary together, whole metres", () => {
    expect(unionBox({ minE: 10, maxE: 20, minN: 0, maxN: 4 }, [0, 2, 30, 3])).toEqual({
      minE: 0,
      maxE: 30,
      minN: 0,
      maxN: 4,
    });
    expect(originFor({ minE: 662_400.4, maxE: 662_460.2, minN: 5_821_300.2, maxN: 5_821_351 }, null)).toEqual([
      662_430, 5_821_326,
    ]);
    expect(originFor(null, null)).toEqual([0, 0]);
  });
});
