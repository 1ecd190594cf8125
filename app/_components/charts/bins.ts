/** Pure helpers that turn error arrays (millimetres) into chart rows. */

/** A "nice" step (1, 2, 2.5 or 5 × 10ⁿ) close to `raw`. */
export function niceStep(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const exp = Math.floor(Math.log10(raw));
  const base = 10 ** exp;
  const f = raw / base;
  const nice = f <= 1 ? 1 : f <= 2 ? 2 : f <= 2.5 ? 2.5 : f <= 5 ? 5 : 10;
  return nice * base;
}

/** Round `value` up to a multiple of `step`. */
export function ceilTo(value: number, step: number): number {
  return Math.ceil(value / step - 1e-9) * step;
}

/** Type-7 percentile of an ascending array. */
export function percentileSorted(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export interface Bin {
  /** Lower edge, inclusive. */
  from: number;
  /** Upper edge, exclusive (the last bin also holds everything beyond it). */
  to: number;
  /** Centre, used as the x value. */
  mid: number;
  count: number;
  /** True for the last bin when it also collects values beyond `to`. */
  overflow: boolean;
  /** True for the first bin when it also collects values below `from`. */
  underflow: boolean;
}

/**
 * Equal-width bins over [min, max). Values below min go into the first bin, values at or above max into the last,
 * so every value is counted once. NaN is skipped.
 */
export function histogram(values: ArrayLike<number>, min: number, max: number, step: number): Bin[] {
  const n = Math.max(1, Math.round((max - min) / step));
  const bins: Bin[] = Array.from({ length: n }, (_, i) => ({
    from: min + i * step,
    to: min + (i + 1) * step,
    mid: min + (i + 0.5) * step,
    count: 0,
    overflow: false,
    underflow: false,
  }));
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    let k = Math.floor((v - min) / step);
    if (k < 0) {
      k = 0;
      if (v < min) bins[0].underflow = true;
    }
    if (k >= n) {
      k = n - 1;
      if (v >= max) bins[n - 1].overflow = true;
    }
    bins[k].count++;
  }
  return bins;
}

/**
 * Empirical cumulative share (0–100 %) of the values at or below x, at up to `maxPoints` x positions
 * (all values when there are fewer). Input need not be sorted.
 */
export function cumulativeCurve(values: ArrayLike<number>, maxPoints = 240): { x: number; pct: number }[] {
  const sorted = Array.from(values)
    .filter((v) => !Number.isNaN(v))
    .sort((a, b) => a - b);
  const n = sorted.length;
  if (n === 0) return [];
  const points: { x: number; pct: number }[] = [{ x: 0, pct: 0 }];
  const stride = Math.max(1, Math.ceil(n / maxPoints));
  for (let i = stride - 1; i < n; i += stride) points.push({ x: sorted[i], pct: ((i + 1) / n) * 100 });
  if (points[points.length - 1].pct < 100) points.push({ x: sorted[n - 1], pct: 100 });
  return points;
}

/** Share (0–1) of values ≤ limit. */
export function shareAtOrBelow(values: ArrayLike<number>, limit: number): number {
  let k = 0,
    n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    n++;
    if (v <= limit) k++;
  }
  return n === 0 ? NaN : k / n;
}

/** Round-number ticks from `min` to `max` (both included when they are multiples of the step). */
export function niceTicks(min: number, max: number, target = 8): number[] {
  const step = niceStep((max - min) / target);
  const out: number[] = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + 1e-9; v += step) out.push(Math.round(v * 1e6) / 1e6);
  return out;
}
