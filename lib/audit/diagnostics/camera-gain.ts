/**
 * The camera correction's gain: how much closer to the plants the corrected records are than the raw GNSS positions.
 */
import type { DiagnosticPair } from "./types";

export interface CameraGain {
  /** Arm value; null = the arm-less group; "all" rows have `overall` true. */
  arm: string | null;
  overall: boolean;
  /** Pairs with a raw position. */
  pairs: number;
  /** Horizontal RMSE of the raw GNSS positions, m. */
  rmseRaw: number | null;
  /** Horizontal RMSE of the corrected records on the same pairs, m. */
  rmseCorrected: number | null;
  /** 1 − rmseCorrected/rmseRaw: the share of the raw error the correction removes (negative: it adds error). */
  gain: number | null;
}

const collator = new Intl.Collator("en", { numeric: true });

function gainOf(arm: string | null, overall: boolean, list: readonly DiagnosticPair[]): CameraGain {
  let ssRaw = 0;
  let ssCor = 0;
  let n = 0;
  for (const p of list) {
    if (p.rawDE === null || p.rawDN === null || !Number.isFinite(p.rawDE) || !Number.isFinite(p.rawDN)) continue;
    ssRaw += p.rawDE * p.rawDE + p.rawDN * p.rawDN;
    ssCor += p.dE * p.dE + p.dN * p.dN;
    n++;
  }
  if (n === 0) return { arm, overall, pairs: 0, rmseRaw: null, rmseCorrected: null, gain: null };
  const rmseRaw = Math.sqrt(ssRaw / n);
  const rmseCorrected = Math.sqrt(ssCor / n);
  return { arm, overall, pairs: n, rmseRaw, rmseCorrected, gain: rmseRaw > 0 ? 1 - rmseCorrected / rmseRaw : null };
}

/**
 * Horizontal RMSE (FGDC-STD-007.3-1998 Appendix 3-A) of the raw GNSS positions and of the corrected records on the
 * same pairs (those with a raw position), overall first, then per arm in natural order. Empty when no pair has a raw
 * position. Input not modified.
 *
 * @example cameraGain(pairs)[0] // { overall: true, rmseRaw: 0.021, rmseCorrected: 0.003, gain: 0.86, ... }
 */
export function cameraGain(pairs: readonly DiagnosticPair[]): CameraGain[] {
  const overall = gainOf(null, true, pairs);
  if (overall.pairs === 0) return [];
  const arms = new Map<string | null, DiagnosticPair[]>();
  for (const p of pairs) {
    let l = arms.get(p.arm);
    if (!l) arms.set(p.arm, (l = []));
    l.push(p);
  }
  const keys = [...arms.keys()].sort((a, b) => (a === null ? 1 : b === null ? -1 : collator.compare(a, b)));
  return [overall, ...keys.map((k) => gainOf(k, false, arms.get(k)!)).filter((g) => g.pairs > 0)];
}
