/**
 * The tolerance profile: the limits an audit is judged against (see verdict.ts). Declared once here;
 * the web app's profile DTO, the audit's profile copy and the map's profile extend it. Pure.
 */
import { z } from "zod";
import { NSSDA_MIN_CHECKPOINTS } from "./nssda";

/** Largest limit a profile may set, metres: a limit beyond it is almost certainly a unit slip (mm typed as m). */
export const TOLERANCE_LIMIT_CEILING_M = 1;

/** One limit of a profile: metres, more than 0 and at most {@link TOLERANCE_LIMIT_CEILING_M}; null = not checked. */
export const toleranceLimitSchema = z
  .number()
  .positive("Must be more than 0.")
  .max(TOLERANCE_LIMIT_CEILING_M, `Limits are in metres; ${TOLERANCE_LIMIT_CEILING_M} m is the largest accepted.`)
  .nullable();

/** Share of plants within every limit, 0 < s ≤ 1. */
export const requiredShareSchema = z.number().gt(0, "Must be more than 0 %.").max(1, "At most 100 %.");
/** Confidence level, 0.5–0.999. */
export const confidenceSchema = z.number().min(0.5, "At least 50 %.").max(0.999, "At most 99.9 %.");
/** Fewest checkpoints, a whole number from 1. */
export const minCheckpointsSchema = z.number().int().min(1).max(100_000);
/** Name of a profile. */
export const profileNameSchema = z.string().trim().min(1, "Give the profile a name.").max(80);

/**
 * A tolerance profile without its bookkeeping (id, operation, note). Limits in metres, null = not
 * checked; at least one limit must be set (see {@link hasAnyLimit}).
 */
export const toleranceProfileSchema = z.object({
  name: profileNameSchema,
  /** Largest 95th percentile of radial errors, metres. */
  radialM: toleranceLimitSchema.default(null),
  /** Largest 95th percentile of |cross-row error|, metres (needs a row bearing). */
  crossM: toleranceLimitSchema.default(null),
  /** Largest 95th percentile of |along-row error|, metres (needs a row bearing). */
  alongM: toleranceLimitSchema.default(null),
  /** Share of plants within every limit the lower confidence bound must reach, 0 < s ≤ 1. */
  requiredShare: requiredShareSchema,
  /** Confidence level of that lower bound (and of all intervals of the audit). */
  confidence: confidenceSchema.default(0.95),
  /** Fewest pairs (checkpoints) an audit needs to pass. */
  minCheckpoints: minCheckpointsSchema,
});

/** A tolerance profile as the engine and the verdict use it. */
export type ToleranceProfile = z.output<typeof toleranceProfileSchema>;

/** The rule every profile obeys: it checks something. */
export const NO_LIMIT_MESSAGE = "Set at least one limit (radial, cross-row or along-row).";

/**
 * True when the profile sets at least one limit.
 *
 * @example hasAnyLimit({ radialM: null, crossM: 0.01, alongM: null }) // true
 */
export function hasAnyLimit(p: Pick<ToleranceProfile, "radialM" | "crossM" | "alongM">): boolean {
  return p.radialM !== null || p.crossM !== null || p.alongM !== null;
}

/** Share of plants and confidence the radial-only shortcut profile asks for (common practice, no source). */
export const SHORTCUT_REQUIRED_SHARE = 0.95;
export const SHORTCUT_CONFIDENCE = 0.95;

/**
 * The profile meant by a bare radial tolerance (the command line's `--tolerance M`): 95 % of radial
 * errors within `radialM` metres, the share within it at least 95 % at 95 % confidence, and at least
 * the 20 checkpoints FGDC-STD-007.3-1998 §3.2.2 asks for.
 *
 * @example radialToleranceProfile(0.02).minCheckpoints // 20
 */
export function radialToleranceProfile(radialM: number): ToleranceProfile {
  if (!(radialM > 0 && radialM <= TOLERANCE_LIMIT_CEILING_M))
    throw new Error(`profile: a radial tolerance must be more than 0 and at most ${TOLERANCE_LIMIT_CEILING_M} m`);
  return {
    name: `radial ${radialM} m`,
    radialM,
    crossM: null,
    alongM: null,
    requiredShare: SHORTCUT_REQUIRED_SHARE,
    confidence: SHORTCUT_CONFIDENCE,
    minCheckpoints: NSSDA_MIN_CHECKPOINTS,
  };
}
