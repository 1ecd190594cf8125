/**
 * proj4's extended transverse Mercator forward (Poder/Engsager series, `etmerc`, also behind `utm`) over whole
 * coordinate arrays: the same operations in the same order with the projection object's own coefficients, so
 * every result is bit-for-bit proj4's (index.test.ts compares them), without a call, an object and an array per
 * point. Source of the method: proj4js lib/projections/etmerc.js and lib/common (gatg, clens_cmplx, asinhy,
 * hypot, log1py, adjust_lon), after Poder & Engsager's implementation in PROJ.
 */

/** The fields of proj4's etmerc projection object that its forward reads. */
export interface TransverseMercatorParams {
  projName?: string;
  approx?: boolean;
  over?: boolean;
  a: number;
  x0: number;
  y0: number;
  long0: number;
  Qn: number;
  Zb: number;
  cbg: number[];
  gtu: number[];
}

/** True when `o` is a proj4 projection object whose forward is etmerc's (not the `+approx` series). */
export function isTransverseMercator(o: object): o is TransverseMercatorParams {
  const p = o as Partial<TransverseMercatorParams>;
  return (
    (p.projName === "etmerc" || p.projName === "utm" || p.projName === "tmerc") &&
    !p.approx &&
    Array.isArray(p.cbg) &&
    p.cbg.length === 6 &&
    Array.isArray(p.gtu) &&
    p.gtu.length === 6 &&
    typeof p.Qn === "number" &&
    typeof p.Zb === "number"
  );
}

// proj4's constants (lib/constants/values.js): SPI is slightly greater than π on purpose.
// biome-ignore lint/suspicious/noApproximativeNumericConstant: proj4's own value, deliberately not Math.PI
const SPI = 3.14159265359;
const TWO_PI = Math.PI * 2;

function hypot(x: number, y: number): number {
  x = Math.abs(x);
  y = Math.abs(y);
  const a = Math.max(x, y);
  const b = Math.min(x, y) / (a ? a : 1);
  return a * Math.sqrt(1 + b ** 2);
}

/**
 * Projects radians (`lam[i]`, `phi[i]` × `scale`) into `ox`, `oy` for i in [from, to). A point the series cannot
 * take (|Ce| beyond proj4's limit) gets Infinity, as proj4's forward gives; the caller decides what to do with it.
 */
export function transverseMercatorForward(
  t: TransverseMercatorParams,
  lam: Float64Array,
  phi: Float64Array,
  scale: number,
  ox: Float64Array,
  oy: Float64Array,
): void {
  const cbg = Float64Array.from(t.cbg),
    gtu = Float64Array.from(t.gtu);
  const { a, x0, y0, long0, Qn, Zb, over } = t;
  const n = lam.length;
  for (let i = 0; i < n; i++) {
    // adjust_lon
    let Ce = lam[i] * scale - long0;
    if (!over && !(Math.abs(Ce) <= SPI)) Ce = Ce - (Ce < 0 ? -1 : 1) * TWO_PI;
    // gatg(cbg, phi)
    const B = phi[i] * scale;
    const cos2B = 2 * Math.cos(2 * B);
    let h1 = cbg[5],
      h2 = 0,
      h = 0;
    for (let j = 4; j >= 0; j--) {
      h = -h2 + cos2B * h1 + cbg[j];
      h2 = h1;
      h1 = h;
    }
    let Cn = B + h * Math.sin(2 * B);
    const sinCn = Math.sin(Cn),
      cosCn = Math.cos(Cn),
      sinCe = Math.sin(Ce),
      cosCe = Math.cos(Ce);
    Cn = Math.atan2(sinCn, cosCe * cosCn);
    Ce = Math.atan2(sinCe * cosCn, hypot(sinCn, cosCn * cosCe));
    // asinhy(tan(Ce)) with log1py
    const tx = Math.tan(Ce);
    let y = Math.abs(tx);
    const u = y * (1 + y / (hypot(1, y) + 1));
    const u1 = 1 + u,
      z = u1 - 1;
    y = z === 0 ? u : (u * Math.log(u1)) / z;
    Ce = tx < 0 ? -y : y;
    // clens_cmplx(gtu, 2Cn, 2Ce): sinh and cosh from one exp, as proj4's sinh() and cosh() each compute it
    const ar = 2 * Cn,
      ai = 2 * Ce;
    const sinAr = Math.sin(ar),
      cosAr = Math.cos(ar);
    const e = Math.exp(ai);
    const sinhAi = (e - 1 / e) / 2,
      coshAi = (e + 1 / e) / 2;
    let r = 2 * cosAr * coshAi,
      im = -2 * sinAr * sinhAi;
    let hr = gtu[5],
      hi1 = 0,
      hr1 = 0,
      hi = 0,
      hr2 = 0,
      hi2 = 0;
    for (let j = 4; j >= 0; j--) {
      hr2 = hr1;
      hi2 = hi1;
      hr1 = hr;
      hi1 = hi;
      hr = -hr2 + r * hr1 - im * hi1 + gtu[j];
      hi = -hi2 + im * hr1 + r * hi1;
    }
    r = sinAr * coshAi;
    im = cosAr * sinhAi;
    Cn = Cn + (r * hr - im * hi);
    Ce = Ce + (r * hi + im * hr);
    if (Math.abs(Ce) <= 2.623395162778) {
      ox[i] = a * (Qn * Ce) + x0;
      oy[i] = a * (Qn * Cn + Zb) + y0;
    } else {
      ox[i] = Infinity;
      oy[i] = Infinity;
    }
  }
}
