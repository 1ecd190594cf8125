/**
 * The error colour scale: viridis, a perceptually uniform sequential colour map that stays readable for the common
 * forms of colour-blindness and in greyscale (lightness rises monotonically from dark purple to yellow).
 *
 * Source: viridis by Stéfan van der Walt, Nathaniel Smith and Eric Firing for matplotlib (2015), released under CC0
 * (public domain) in matplotlib's `_cm_listed.py`. The 17 stops below are that 256-entry table at positions
 * round(k · 255 / 16), k = 0…16, as 8-bit sRGB; values between stops are interpolated linearly in sRGB.
 */

export type Rgb = readonly [number, number, number];

/** viridis at t = k/16, k = 0…16 (8-bit sRGB). */
export const VIRIDIS_STOPS: readonly Rgb[] = [
  [68, 1, 84],
  [72, 24, 106],
  [71, 45, 123],
  [66, 64, 134],
  [59, 82, 139],
  [51, 99, 141],
  [44, 114, 142],
  [38, 130, 142],
  [33, 145, 140],
  [31, 160, 136],
  [40, 174, 128],
  [63, 188, 115],
  [94, 201, 98],
  [132, 212, 75],
  [173, 220, 48],
  [216, 226, 25],
  [253, 231, 37],
];

/**
 * viridis colour at t ∈ [0, 1] (clamped; NaN gives the lowest colour), 8-bit sRGB.
 * @example viridis(0) // [68, 1, 84]
 * @example viridis(1) // [253, 231, 37]
 */
export function viridis(t: number): Rgb {
  const x = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const pos = x * (VIRIDIS_STOPS.length - 1);
  const i = Math.min(VIRIDIS_STOPS.length - 2, Math.floor(pos));
  const f = pos - i;
  const a = VIRIDIS_STOPS[i],
    b = VIRIDIS_STOPS[i + 1];
  return [
    Math.round(a[0] + (b[0] - a[0]) * f),
    Math.round(a[1] + (b[1] - a[1]) * f),
    Math.round(a[2] + (b[2] - a[2]) * f),
  ];
}

/** 256-entry lookup table of {@link viridis}, RGB interleaved, for colouring many points quickly. */
export const VIRIDIS_LUT: Uint8Array = (() => {
  const lut = new Uint8Array(256 * 3);
  for (let k = 0; k < 256; k++) lut.set(viridis(k / 255), k * 3);
  return lut;
})();

/** Plotproof's highlight for plants out of tolerance: the palette's `alarm` (#b3362b); viridis contains no red. */
export const OUT_OF_TOLERANCE_RGB: Rgb = [179, 54, 43];

/**
 * RGBA colours (alpha 255) for `values` (metres, or any unit of `domain`) on viridis over [min, max] of `domain`.
 * Writes colour k for values[indices[k]] (all values when `indices` is omitted). NaN gets the lowest colour.
 *
 * @example fillColours(Float32Array.of(0, 0.02), [0, 0.02]) // Uint8Array [68, 1, 84, 255, 253, 231, 37, 255]
 */
export function fillColours(
  values: ArrayLike<number>,
  domain: readonly [number, number],
  indices?: ArrayLike<number>,
): Uint8Array {
  const n = indices ? indices.length : values.length;
  const out = new Uint8Array(n * 4);
  const [lo, hi] = domain;
  const scale = hi > lo ? 255 / (hi - lo) : 0;
  for (let k = 0; k < n; k++) {
    const v = values[indices ? indices[k] : k];
    let q = Math.round((v - lo) * scale);
    if (!(q >= 0))
      q = 0; // also NaN
    else if (q > 255) q = 255;
    out[k * 4] = VIRIDIS_LUT[q * 3];
    out[k * 4 + 1] = VIRIDIS_LUT[q * 3 + 1];
    out[k * 4 + 2] = VIRIDIS_LUT[q * 3 + 2];
    out[k * 4 + 3] = 255;
  }
  return out;
}

/** Rounds up to 1, 2, 2.5 or 5 × 10^k. @example niceCeil(0.0173) // 0.02 */
export function niceCeil(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 0;
  const p = 10 ** Math.floor(Math.log10(x));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * p >= x * (1 - 1e-12)) return m * p;
  return 10 * p;
}

/**
 * Colour domain [0, max] of an error scale, metres. With a tolerance limit the limit sits in the middle of the scale
 * (max = 2 × limit), so within and out of tolerance read at a glance; without one, max is the 98th percentile of
 * the finite values rounded up by {@link niceCeil} (at least 1 mm).
 *
 * @example errorDomain(Float32Array.of(0.001, 0.004), 0.01) // [0, 0.02]
 */
export function errorDomain(values: ArrayLike<number>, limit: number | null): [number, number] {
  if (limit !== null && limit > 0) return [0, 2 * limit];
  const finite: number[] = [];
  const step = Math.max(1, Math.floor(values.length / 20_000));
  for (let i = 0; i < values.length; i += step) if (Number.isFinite(values[i])) finite.push(values[i]);
  if (finite.length === 0) return [0, 0.001];
  finite.sort((a, b) => a - b);
  const p98 = finite[Math.min(finite.length - 1, Math.floor(0.98 * (finite.length - 1)))];
  return [0, Math.max(0.001, niceCeil(p98))];
}

export interface LegendTick {
  /** Position on the legend, 0–1. */
  at: number;
  value: number;
  label: string;
}

/**
 * Evenly spaced ticks for a legend from 0 to `max`, at most `maxTicks` of them, on a 1/2/2.5/5 × 10^k step.
 * `format` turns a value into its label (e.g. metres into "10 mm").
 *
 * @example legendTicks(0.02, (m) => `${m * 1000} mm`).map((t) => t.label) // ["0 mm", "5 mm", "10 mm", "15 mm", "20 mm"]
 */
export function legendTicks(max: number, format: (value: number) => string, maxTicks = 6): LegendTick[] {
  if (!(max > 0)) return [{ at: 0, value: 0, label: format(0) }];
  let step = niceCeil(max / (maxTicks - 1));
  while (max / step > maxTicks - 1 + 1e-9) step = niceCeil(step * 1.0001);
  const ticks: LegendTick[] = [];
  for (let k = 0; k * step <= max * (1 + 1e-9); k++) {
    const value = Math.round(k * step * 1e9) / 1e9;
    ticks.push({ at: value / max, value, label: format(value) });
  }
  return ticks;
}

/** Millimetres for legend labels: "0 mm", "2.5 mm", "10 mm". */
export function mmLabel(metres: number): string {
  const mm = Math.round(metres * 1e6) / 1e3;
  return `${Number.isInteger(mm) ? mm.toFixed(0) : String(mm)} mm`;
}
