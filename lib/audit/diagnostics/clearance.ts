/**
 * Clearance: the share of plants a tool would touch when it keeps a given clearance from each recorded plant.
 */
import { clopperPearson } from "../intervals";
import { mean, sampleSd } from "../rmse";
import { normalCdf } from "./normal";
import type { DiagnosticPair } from "./types";

/** Which error the operation is sensitive to: all round the plant, across the row, or along it. */
export type ClearanceMode = "radial" | "cross" | "along";

export interface ClearanceResult {
  mode: ClearanceMode;
  /** Clearance kept from each recorded plant position, metres. */
  clearanceM: number;
  /** Pairs used. */
  pairs: number;
  /** Share of checkpoints whose error reaches the clearance, with its exact (Clopper–Pearson) interval. */
  empirical: { touched: number; share: number; lower: number; upper: number } | null;
  /** Share from the normal model: N(mean, sd) for a row component, circular normal (Rayleigh) about 0 for radial. */
  model: number | null;
}

function component(p: DiagnosticPair, mode: ClearanceMode): number | null {
  return mode === "radial" ? p.radial : mode === "cross" ? p.cross : p.along;
}

/**
 * Expected share of plants touched by a tool that is steered by the records and keeps `clearanceM` from each
 * recorded plant: a plant is touched when its error reaches the clearance (|cross|, |along| or the radial error ≥ c;
 * the plant's own size is not included — add it to the clearance). Empirical share of the checkpoints with a
 * two-sided Clopper–Pearson interval, and a normal model: P(|X| ≥ c) = Φ((−c − μ)/σ) + 1 − Φ((c − μ)/σ) for a row
 * component with its sample mean and SD; exp(−c²/2σ_c²), σ_c = RMSE_r/√2, for the radial error (Rayleigh).
 *
 * Source: Clopper & Pearson, Biometrika 26 (1934) 404–413; normal and Rayleigh distributions as in normal.ts and
 * radii.ts (Lord Rayleigh 1880).
 *
 * @example clearanceShare(pairs, 0.02, "cross") // { empirical: { share: 0.004, ... }, model: 0.002, ... }
 */
export function clearanceShare(
  pairs: readonly DiagnosticPair[],
  clearanceM: number,
  mode: ClearanceMode,
  confidence = 0.95,
): ClearanceResult {
  if (!(clearanceM >= 0) || !Number.isFinite(clearanceM))
    throw new Error(`clearanceShare: clearance must be a finite number ≥ 0 metres, got ${clearanceM}`);
  const values: number[] = [];
  for (const p of pairs) {
    const v = component(p, mode);
    if (v !== null && Number.isFinite(v)) values.push(v);
  }
  const n = values.length;
  if (n === 0) return { mode, clearanceM, pairs: 0, empirical: null, model: null };
  const touched = values.filter((v) => Math.abs(v) >= clearanceM).length;
  const ci = clopperPearson(touched, n, confidence)!;
  let model: number | null = null;
  if (mode === "radial") {
    let ss = 0;
    for (const v of values) ss += v * v;
    const sigma2 = ss / n / 2;
    model = sigma2 > 0 ? Math.exp((-clearanceM * clearanceM) / (2 * sigma2)) : clearanceM > 0 ? 0 : 1;
  } else if (n >= 2) {
    const m = mean(values);
    const sd = sampleSd(values, m);
    model = sd > 0 ? normalCdf((-clearanceM - m) / sd) + 1 - normalCdf((clearanceM - m) / sd) : null;
  }
  return {
    mode,
    clearanceM,
    pairs: n,
    empirical: { touched, share: touched / n, lower: ci.lower, upper: ci.upper },
    model,
  };
}

/** Clearances offered when none is asked for, metres (near-row tools work some 5–12 cm from the crop row). */
export const DEFAULT_CLEARANCES_M = [0.005, 0.01, 0.015, 0.02, 0.03, 0.05] as const;
