/**
 * Diagnostics of one audit (see index.ts): everything the diagnostics page shows, from the pairs and the records.
 */
import { mean } from "../rmse";
import { type ArmDiagnostics, armDiagnostics } from "./arm-offsets";
import { type BedRowCell, bedRowTable } from "./bed-row";
import { type CameraGain, cameraGain } from "./camera-gain";
import { type ClearanceMode, type ClearanceResult, clearanceShare, DEFAULT_CLEARANCES_M } from "./clearance";
import {
  degradedFixEpisodes,
  type Episode,
  errorJumps,
  type PassPoint,
  type PlantedTrack,
  passSeries,
} from "./episodes";
import { type SimilarityDiagnosis, similarityDiagnosis } from "./similarity-causes";
import { type DiagnosticPair, fixClass } from "./types";

export interface DiagnosticsHeadline {
  pairs: number;
  /** Pairs planted with a degraded fix. */
  degraded: number;
  /** Horizontal RMSE of all pairs, metres. */
  rmseR: number | null;
  /** Horizontal RMSE of the RTK-fixed pairs, metres. */
  rmseRFixed: number | null;
  meanAlong: number | null;
  meanCross: number | null;
}

export interface AuditDiagnostics {
  confidence: number;
  headline: DiagnosticsHeadline;
  arms: ArmDiagnostics[];
  bedRow: BedRowCell[];
  pass: PassPoint[];
  /** Degraded-fix episodes and error jumps, by start time. */
  episodes: Episode[];
  cameraGain: CameraGain[];
  similarity: SimilarityDiagnosis | null;
  clearance: Record<ClearanceMode, ClearanceResult[]>;
}

function rmseROf(list: readonly DiagnosticPair[]): number | null {
  if (!list.length) return null;
  let ss = 0;
  for (const p of list) ss += p.dE * p.dE + p.dN * p.dN;
  return Math.sqrt(ss / list.length);
}

/**
 * Everything the diagnostics page shows for one audit: headline, per-arm offsets (arm-offsets.ts), bed × row table,
 * errors along the pass with episodes (episodes.ts), camera gain, similarity fit with causes and a clearance table.
 * `track` (the as-planted records) gives exact plant ranges of degraded-fix stretches; without it they are found
 * from the checkpoints alone. Inputs not modified.
 *
 * @example diagnoseAudit({ pairs, track, confidence: 0.95 }).arms[2].sentence // "Arm 3: move its records 3.0 ± 0.6 mm to the left …"
 */
export function diagnoseAudit(input: {
  pairs: readonly DiagnosticPair[];
  track: PlantedTrack | null;
  confidence?: number;
  clearancesM?: readonly number[];
}): AuditDiagnostics {
  const confidence = input.confidence ?? 0.95;
  const { pairs } = input;
  const degradedPairs = pairs.filter((p) => fixClass(p.fix) === "degraded");
  const fixed = pairs.filter((p) => fixClass(p.fix) === "fixed");
  const along = pairs.filter((p) => p.along !== null).map((p) => p.along!);
  const cross = pairs.filter((p) => p.cross !== null).map((p) => p.cross!);
  const degraded = input.track ? degradedFixEpisodes(input.track, pairs) : checkpointFixEpisodes(pairs);
  const jumps = errorJumps(pairs, degraded);
  const episodes = [...degraded, ...jumps].sort(
    (a, b) => (a.start ?? Infinity) - (b.start ?? Infinity) || (a.kind < b.kind ? -1 : 1),
  );
  const clearances = input.clearancesM ?? DEFAULT_CLEARANCES_M;
  const clearance = {} as Record<ClearanceMode, ClearanceResult[]>;
  for (const mode of ["radial", "cross", "along"] as const)
    clearance[mode] = clearances.map((c) => clearanceShare(pairs, c, mode, confidence));
  return {
    confidence,
    headline: {
      pairs: pairs.length,
      degraded: degradedPairs.length,
      rmseR: rmseROf(pairs),
      rmseRFixed: rmseROf(fixed),
      meanAlong: along.length ? mean(along) : null,
      meanCross: cross.length ? mean(cross) : null,
    },
    arms: armDiagnostics(pairs, confidence),
    bedRow: bedRowTable(pairs),
    pass: passSeries(pairs),
    episodes,
    cameraGain: cameraGain(pairs),
    similarity: similarityDiagnosis(pairs, confidence),
    clearance,
  };
}

/** Without the records, degraded-fix stretches are found among the checkpoints themselves. */
function checkpointFixEpisodes(pairs: readonly DiagnosticPair[]): Episode[] {
  const track: PlantedTrack = {
    length: pairs.length,
    time: Float64Array.from(pairs, (p) => p.time ?? Number.NaN),
    id: (i) => pairs[i].plantId,
    fix: (i) => pairs[i].fix,
    bed: (i) => pairs[i].bed,
    row: (i) => pairs[i].row,
    arm: (i) => pairs[i].arm,
  };
  return degradedFixEpisodes(track, pairs);
}
