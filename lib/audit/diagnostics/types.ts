/**
 * Input of the diagnostics: one paired plant as the audit stored it, with its planting time and its raw GNSS error
 * looked up in the as-planted records. Errors are survey minus planted, metres, in the work CRS.
 */
export interface DiagnosticPair {
  /** Pairing order of the audit (its residual row number). */
  seq: number;
  plantId: string | null;
  bed: string | null;
  row: string | null;
  arm: string | null;
  /** Fix quality as recorded (normalised by the reader, e.g. "rtk-fixed", "rtk-float"); null when not recorded. */
  fix: string | null;
  plantedE: number;
  plantedN: number;
  dE: number;
  dN: number;
  /** Along-row error (positive in the row direction); null without a row bearing. */
  along: number | null;
  /** Cross-row error (positive right of the row direction); null without a row bearing. */
  cross: number | null;
  radial: number;
  outlier: boolean;
  /** Planting time, epoch milliseconds UTC; null when unknown. */
  time: number | null;
  /** Raw GNSS error east (survey − raw position before camera correction); null when the record has none. */
  rawDE: number | null;
  rawDN: number | null;
}

/** How a fix quality counts for the diagnostics. */
export type FixClass = "fixed" | "degraded" | "unknown";

const FIXED = new Set(["rtk-fixed", "fixed", "rtk fixed", "rtkfixed", "4"]);

/**
 * Classifies a recorded fix quality: RTK fixed, anything else recorded (float, DGNSS, autonomous…) as degraded,
 * an empty cell as unknown. NMEA 0183 GGA quality 4 is RTK fixed (from memory).
 *
 * @example fixClass("rtk-float") // "degraded"
 */
export function fixClass(fix: string | null): FixClass {
  if (fix === null) return "unknown";
  const t = fix.trim().toLowerCase();
  if (t === "") return "unknown";
  return FIXED.has(t) ? "fixed" : "degraded";
}
