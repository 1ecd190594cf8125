/**
 * View helpers for the map's orthographic view (no base map): at zoom z one metre is 2^z pixels (deck.gl's
 * OrthographicView: "zoom 0 maps one unit distance to one pixel"), north up (grid north of the work CRS).
 */

export interface Bounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/**
 * Target and zoom that fit `bounds` (metres) into a `width` × `height` pixel viewport with `padding` pixels free on
 * every side: zoom = log2(min((width − 2·padding)/Δx, (height − 2·padding)/Δy)).
 *
 * @example fitBounds({ minX: -50, minY: -10, maxX: 50, maxY: 10 }, 1000, 400, 0) // { target: [0, 0], zoom: log2(10) ≈ 3.32 }
 */
export function fitBounds(
  bounds: Bounds,
  width: number,
  height: number,
  padding = 24,
): { target: [number, number]; zoom: number } {
  const dx = Math.max(bounds.maxX - bounds.minX, 1e-3),
    dy = Math.max(bounds.maxY - bounds.minY, 1e-3);
  const w = Math.max(width - 2 * padding, 1),
    h = Math.max(height - 2 * padding, 1);
  return {
    target: [(bounds.minX + bounds.maxX) / 2, (bounds.minY + bounds.maxY) / 2],
    zoom: Math.log2(Math.min(w / dx, h / dy)),
  };
}

/** Metres per screen pixel at a zoom level. */
export function metresPerPixel(zoom: number): number {
  return 2 ** -zoom;
}

/**
 * A scale bar of a round length (1, 2 or 5 × 10^k metres) no longer than `maxPx` pixels.
 * @example scaleBar(0.1, 120) // { metres: 10, px: 100, label: "10 m" }
 */
export function scaleBar(mPerPx: number, maxPx = 120): { metres: number; px: number; label: string } {
  if (!(mPerPx > 0) || !Number.isFinite(mPerPx)) return { metres: 0, px: 0, label: "" };
  const maxM = mPerPx * maxPx;
  const p = 10 ** Math.floor(Math.log10(maxM));
  const metres = [5, 2, 1].map((m) => m * p).find((m) => m <= maxM * (1 + 1e-9)) ?? p;
  return { metres, px: metres / mPerPx, label: lengthLabel(metres) };
}

/** "5 mm", "20 cm", "1 m", "2 km". */
export function lengthLabel(metres: number): string {
  const clean = (v: number) => String(Math.round(v * 1e6) / 1e6);
  if (metres >= 1000) return `${clean(metres / 1000)} km`;
  if (metres >= 1) return `${clean(metres)} m`;
  if (metres >= 0.01) return `${clean(metres * 100)} cm`;
  return `${clean(metres * 1000)} mm`;
}

/**
 * Grid convergence from two points given in longitude/latitude (degrees): the origin and a point a short way grid
 * north of it. Returns the angle from true north to grid north, degrees, positive when grid north lies east of true
 * north. Uses the initial bearing of the great circle between them (spherical; well below 0.01° off over 100 m).
 *
 * Source of the bearing formula: the forward azimuth on the sphere, θ = atan2(sin Δλ · cos φ₂, cos φ₁ · sin φ₂ −
 * sin φ₁ · cos φ₂ · cos Δλ) (common practice, no source).
 *
 * @example gridConvergenceDeg([5.3936, 52.5178], [5.39393, 52.51870]) // ≈ 1.9 (UTM 31N east of 3° E: grid north is east of true north)
 */
export function gridConvergenceDeg(
  origin: readonly [number, number],
  northOfOrigin: readonly [number, number],
): number {
  const r = Math.PI / 180;
  const f1 = origin[1] * r,
    f2 = northOfOrigin[1] * r,
    dl = (northOfOrigin[0] - origin[0]) * r;
  const theta = Math.atan2(
    Math.sin(dl) * Math.cos(f2),
    Math.cos(f1) * Math.sin(f2) - Math.sin(f1) * Math.cos(f2) * Math.cos(dl),
  );
  return theta / r;
}
