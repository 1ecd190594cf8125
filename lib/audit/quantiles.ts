/**
 * Sample quantiles by linear interpolation between order statistics (Hyndman & Fan type 7,
 * the default of R's `quantile` and numpy's `percentile`), computed by selection so that a
 * million values need no full sort.
 */

/**
 * Type-7 quantile of an already sorted sample: h = (n − 1)·p, Q = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]) (0-based).
 * Returns NaN for an empty sample.
 *
 * Source: Hyndman & Fan, "Sample quantiles in statistical packages", The American Statistician 50 (1996) 361–365, definition 7.
 *
 * @example quantileSorted(Float64Array.of(1, 2, 3, 4), 0.5) // 2.5
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  assertP(p);
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo >= n - 1) return sorted[n - 1];
  const frac = h - lo;
  return frac === 0 ? sorted[lo] : sorted[lo] + frac * (sorted[lo + 1] - sorted[lo]);
}

function assertP(p: number): void {
  if (!(p >= 0 && p <= 1)) throw new Error(`quantile: p must be in [0, 1], got ${p}`);
}

/**
 * Rearranges a[left..right] so that a[k] holds the value it would have after sorting, everything before it is ≤ a[k]
 * and everything after it is ≥ a[k]. Floyd & Rivest, "Algorithm 489: SELECT", Comm. ACM 18 (1975) 173: partition
 * around an element chosen from a small recursive sample, so about n + min(k, n − k) comparisons are expected.
 * Falls back to sorting the remaining range if partitioning makes too little progress (worst case O(n log n)).
 * Input must be NaN-free.
 */
function selectInPlace(a: Float64Array, k: number, left: number, right: number): void {
  let budget = 4 * Math.ceil(Math.log2(right - left + 2)) + 16;
  while (right > left) {
    if (budget-- <= 0) {
      a.subarray(left, right + 1).sort();
      return;
    }
    if (right - left > 600) {
      // Narrow the range with a sample first (constants as published).
      const n = right - left + 1;
      const i = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (i - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (i * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - i) * s) / n + sd));
      selectInPlace(a, k, newLeft, newRight);
    }
    const t = a[k];
    let i = left;
    let j = right;
    swap(a, left, k);
    if (a[right] > t) swap(a, right, left);
    while (i < j) {
      swap(a, i, j);
      i++;
      j--;
      while (a[i] < t) i++;
      while (a[j] > t) j--;
    }
    if (a[left] === t) swap(a, left, j);
    else {
      j++;
      swap(a, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * Several type-7 quantiles of `scratch`, which is REORDERED in place (pass a copy if the order matters).
 * Expected O(n) per quantile. Returns NaN for each p when the sample is empty. Values must not be NaN.
 *
 * Source: Hyndman & Fan (1996), definition 7 (see {@link quantileSorted}).
 *
 * @example quantilesInPlace(Float64Array.of(4, 1, 3, 2), [0.5, 0.95]) // [2.5, 3.85]
 */
export function quantilesInPlace(scratch: Float64Array, ps: readonly number[]): number[] {
  for (const p of ps) assertP(p);
  const n = scratch.length;
  if (n === 0) return ps.map(() => Number.NaN);
  const order = ps.map((_, i) => i).sort((i, j) => ps[i] - ps[j]);
  const out = new Array<number>(ps.length);
  let from = 0; // everything before `from` is ≤ everything from `from` on
  for (const idx of order) {
    const h = (n - 1) * ps[idx];
    const lo = Math.min(Math.floor(h), n - 1);
    selectInPlace(scratch, lo, from, n - 1);
    from = lo;
    const frac = h - lo;
    if (frac === 0 || lo === n - 1) {
      out[idx] = scratch[lo];
      continue;
    }
    // next order statistic = minimum of the part after lo
    let next = Infinity;
    for (let i = lo + 1; i < n; i++) if (scratch[i] < next) next = scratch[i];
    out[idx] = scratch[lo] + frac * (next - scratch[lo]);
  }
  return out;
}

/**
 * Type-7 quantiles of `values` (not modified). Unit: that of the values.
 *
 * @example quantiles(Float64Array.of(0.01, 0.03, 0.02), [0.5]) // [0.02]
 */
export function quantiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  return quantilesInPlace(values instanceof Float64Array ? values.slice() : Float64Array.from(values), ps);
}

/**
 * Median (type-7 quantile at 0.5, i.e. the usual median) of `values`, not modified; NaN when empty.
 *
 * @example median(Float64Array.of(3, 1, 2, 10)) // 2.5
 */
export function median(values: ArrayLike<number>): number {
  return quantiles(values, [0.5])[0];
}

/**
 * Median absolute deviation about `centre` (default: the median): median(|x − centre|), unscaled. NaN when empty.
 *
 * Source: Hampel, J. Amer. Statist. Assoc. 69 (1974) 383–393; Rousseeuw & Croux, J. Amer. Statist. Assoc. 88 (1993) 1273–1283.
 *
 * @example medianAbsoluteDeviation(Float64Array.of(1, 2, 3, 4, 100)) // 1
 */
export function medianAbsoluteDeviation(values: ArrayLike<number>, centre?: number): number {
  const c = centre ?? median(values);
  const n = values.length;
  const dev = new Float64Array(n);
  for (let i = 0; i < n; i++) dev[i] = Math.abs(values[i] - c);
  return quantilesInPlace(dev, [0.5])[0];
}
