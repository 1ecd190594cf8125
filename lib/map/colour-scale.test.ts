import { describe, expect, it } from "vitest";
import {
  errorDomain,
  fillColours,
  legendTicks,
  mmLabel,
  niceCeil,
  OUT_OF_TOLERANCE_RGB,
  VIRIDIS_LUT,
  VIRIDIS_STOPS,
  viridis,
} from "./colour-scale";

// viridis: van der Walt, Smith & Firing, matplotlib `_cm_listed.py` `_viridis_data` (CC0), entries as floats 0–1.
const MPL = {
  0: [0.267004, 0.004874, 0.329415],
  127: [0.128729, 0.563265, 0.551229],
  128: [0.127568, 0.566949, 0.550556],
  255: [0.993248, 0.906157, 0.143936],
} as const;
const to8 = (c: readonly number[]) => c.map((v) => Math.round(v * 255));

// Independent check of the in-between values: d3-scale-chromatic's 256-entry viridis ramp (8-bit, derived from the
// same matplotlib table; ISC licence), entries 40, 100, 200, 244 and 250. Entry 244 is where linear interpolation
// between the 17 stops strays furthest from the full table over all 256 entries: 5 levels of 255 (blue channel).
const D3 = {
  40: [69, 55, 129],
  100: [42, 118, 142],
  200: [112, 207, 87],
  244: [226, 228, 24],
  250: [241, 229, 29],
} as const;

/** CIE 1976 L* of an 8-bit sRGB colour (IEC 61966-2-1 transfer function, D65 luminance weights). */
function lightness([r, g, b]: ArrayLike<number> & Iterable<number>): number {
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  const y = 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
  return y > (6 / 29) ** 3 ? 116 * Math.cbrt(y) - 16 : 903.3 * y;
}

describe("viridis", () => {
  it("viridis -- ends and middle match matplotlib's table", () => {
    expect(viridis(0)).toEqual(to8(MPL[0])); // viridis: matplotlib _cm_listed.py entry 0 (CC0)
    expect(viridis(1)).toEqual(to8(MPL[255])); // entry 255
    // t = 0.5 sits at position 127.5: between entries 127 and 128, within one 8-bit step of both.
    for (const k of [0, 1, 2]) {
      expect(Math.abs(viridis(0.5)[k] - (MPL[127][k] + MPL[128][k]) * 127.5)).toBeLessThanOrEqual(1);
    }
  });

  it("viridis -- interpolation between the 17 stops stays within 5 levels of the 256-entry table", () => {
    for (const [i, rgb] of Object.entries(D3)) {
      const c = viridis(Number(i) / 255);
      for (const k of [0, 1, 2]) expect(Math.abs(c[k] - rgb[k])).toBeLessThanOrEqual(5); // d3-scale-chromatic viridis ramp
    }
  });

  it("viridis -- lightness rises monotonically (perceptually ordered, readable in greyscale)", () => {
    let last = -Infinity;
    for (let q = 0; q < 256; q++) {
      const l = lightness(VIRIDIS_LUT.subarray(q * 3, q * 3 + 3));
      expect(l).toBeGreaterThan(last - 0.2); // 8-bit rounding may wobble by a fraction of a unit
      last = Math.max(last, l);
    }
    expect(lightness(VIRIDIS_STOPS[16]) - lightness(VIRIDIS_STOPS[0])).toBeGreaterThan(70); // L* ≈ 16 → 90, from memory
  });

  it("viridis -- clamps outside [0, 1] and gives the lowest colour for NaN", () => {
    expect(viridis(-1)).toEqual(viridis(0));
    expect(viridis(7)).toEqual(viridis(1));
    expect(viridis(Number.NaN)).toEqual(viridis(0));
  });

  it("viridis -- the out-of-tolerance red is far from every colour of the scale", () => {
    let nearest = Infinity;
    for (let q = 0; q < 256; q++) {
      const d = Math.hypot(...[0, 1, 2].map((k) => VIRIDIS_LUT[q * 3 + k] - OUT_OF_TOLERANCE_RGB[k]));
      nearest = Math.min(nearest, d);
    }
    expect(nearest).toBeGreaterThan(60);
  });
});

describe("fillColours", () => {
  it("fillColours -- maps the domain onto the scale, clamps, and follows the index list", () => {
    const values = Float32Array.of(0, 0.01, 0.02, 0.05, Number.NaN);
    const all = fillColours(values, [0, 0.02]);
    expect(Array.from(all.subarray(0, 4))).toEqual([...viridis(0), 255]);
    expect(Array.from(all.subarray(8, 12))).toEqual([...viridis(1), 255]);
    expect(Array.from(all.subarray(12, 16))).toEqual([...viridis(1), 255]); // above the domain: top colour
    expect(Array.from(all.subarray(16, 20))).toEqual([...viridis(0), 255]); // NaN: lowest colour
    const mid = Array.from(all.subarray(4, 7));
    expect(mid.every((v, k) => Math.abs(v - viridis(0.5)[k]) <= 1)).toBe(true);
    const picked = fillColours(values, [0, 0.02], Uint32Array.of(2, 0));
    expect(Array.from(picked)).toEqual([...viridis(1), 255, ...viridis(0), 255]);
  });
});

describe("scale domain and legend", () => {
  it("niceCeil -- rounds up to 1, 2, 2.5 or 5 × 10^k", () => {
    expect(niceCeil(0.0173)).toBeCloseTo(0.02, 12);
    expect(niceCeil(0.021)).toBeCloseTo(0.025, 12);
    expect(niceCeil(3)).toBe(5);
    expect(niceCeil(10)).toBe(10);
    expect(niceCeil(0)).toBe(0);
  });

  it("errorDomain -- puts the tolerance limit in the middle of the scale", () => {
    expect(errorDomain(Float32Array.of(0.001, 0.5), 0.01)).toEqual([0, 0.02]);
  });

  it("errorDomain -- without a limit uses the rounded-up 98th percentile", () => {
    const values = Float64Array.from({ length: 100 }, (_, i) => (i + 1) / 10_000); // 0.1 … 10 mm
    // 98th percentile of 0.1…10 mm (lower rank, 0.98·99 = 97 → 9.8 mm) rounds up to 10 mm.
    expect(errorDomain(values, null)[1]).toBeCloseTo(0.01, 12);
    expect(errorDomain(Float32Array.of(), null)).toEqual([0, 0.001]);
  });

  it("legendTicks -- even steps from 0 to the maximum with labels", () => {
    const ticks = legendTicks(0.02, mmLabel);
    expect(ticks.map((t) => t.label)).toEqual(["0 mm", "5 mm", "10 mm", "15 mm", "20 mm"]);
    expect(ticks.map((t) => t.at)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(legendTicks(1, (v) => `${Math.round(v * 100)} %`).map((t) => t.label)).toEqual([
      "0 %",
      "20 %",
      "40 %",
      "60 %",
      "80 %",
      "100 %",
    ]);
    expect(legendTicks(0.005, mmLabel).length).toBeLessThanOrEqual(6);
  });

  it("mmLabel -- metres as millimetres without trailing zeros", () => {
    expect(mmLabel(0.0025)).toBe("2.5 mm");
    expect(mmLabel(0.01)).toBe("10 mm");
    expect(mmLabel(0)).toBe("0 mm");
  });
});
