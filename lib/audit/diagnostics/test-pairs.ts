/**
 * Test helper: simulated checkpoints of a fictional field ("Hollow Brook": rows running north, 4 arms, one plant
 * every 0.3 m, one checkpoint every 10th plant). Not used by production code.
 */
import { gaussian, mulberry32 } from "../test-helpers";
import type { DiagnosticPair } from "./types";

export interface SimOptions {
  seed?: number;
  rows?: number;
  checkpointsPerRow?: number;
  /** Cross-row bias per arm (arm = row index mod 4 + 1), metres. */
  armCross?: number[];
  sd?: number;
  /** Checkpoint indices k (per row) planted with a float fix, rows given. */
  float?: { rows: number[]; from: number; to: number; along: number; cross: number };
  /** Raw GNSS extra noise SD, metres; null = no raw positions. */
  rawSd?: number | null;
}

/** Rows run north (bearing 0): along = dN, cross = dE. Planting time: 3 s per plant, all rows side by side. */
export function simulatePairs(o: SimOptions = {}): DiagnosticPair[] {
  const g = gaussian(mulberry32(o.seed ?? 7));
  const rows = o.rows ?? 8;
  const per = o.checkpointsPerRow ?? 40;
  const sd = o.sd ?? 0.002;
  const pairs: DiagnosticPair[] = [];
  for (let r = 0; r < rows; r++) {
    for (let k = 0; k < per; k++) {
      const arm = String((r % 4) + 1);
      const isFloat = !!o.float && o.float.rows.includes(r + 1) && k >= o.float.from && k <= o.float.to;
      let along = g() * sd;
      let cross = (o.armCross?.[r % 4] ?? 0) + g() * sd;
      if (isFloat) {
        along += o.float!.along;
        cross += o.float!.cross;
      }
      const dE = cross;
      const dN = along;
      const rawDE = o.rawSd === null || o.rawSd === undefined ? null : dE + g() * o.rawSd;
      const rawDN = o.rawSd === null || o.rawSd === undefined ? null : dN + g() * o.rawSd;
      pairs.push({
        seq: pairs.length,
        plantId: `HB-${r + 1}-${String(k * 10 + 1).padStart(4, "0")}`,
        bed: String(Math.floor(r / 4) + 1),
        row: String((r % 4) + 1),
        arm,
        fix: isFloat ? "rtk-float" : "rtk-fixed",
        plantedE: 500_000 + r * 0.5,
        plantedN: 5_800_000 + k * 3,
        dE,
        dN,
        along,
        cross,
        radial: Math.hypot(dE, dN),
        outlier: false,
        time: Date.UTC(2026, 3, 14, 8) + (Math.floor(r / 4) * per + k) * 30_000,
        rawDE,
        rawDN,
      });
    }
  }
  return pairs;
}
