/**
 * How many checkpoints a survey plan asks for. Pure.
 *
 * The count that can show a tolerance profile's claim — "at least `requiredShare` of plants are within every limit,
 * with `confidence`" — is the smallest n for which n − c checkpoints within tolerance out of n give a one-sided exact
 * (Clopper–Pearson) lower bound reaching the required share, c being the failures the planner allows for. The bound
 * itself is the one trust rule of lib/audit/trust.ts; this module only asks it from the start (n = c checkpoints,
 * all c of them outside, then "how many more, all within?").
 *
 * The plan never asks for fewer than the standards' minimums: NSSDA (FGDC-STD-007.3-1998 §3.2.2) a minimum of 20
 * checkpoints; ASPRS Positional Accuracy Standards for Digital Geospatial Data, Edition 2, Version 1.0 (2023), which
 * raised the minimum for a product accuracy assessment from 20 to 30 (its summary of changes), nor fewer than the
 * profile's own minimum.
 */
import { moreCheckpointsNeeded, type ShareRequirement } from "@/lib/audit/trust";

/** Checkpoint minimums of the published standards. */
export const STANDARD_MINIMUMS = {
  /** FGDC-STD-007.3-1998 (NSSDA) §3.2.2: "a minimum of 20 check points". */
  nssda: 20,
  /** ASPRS Positional Accuracy Standards, Edition 2 (2023): minimum checkpoints raised from 20 to 30. */
  asprs2023: 30,
} as const;
export type StandardName = keyof typeof STANDARD_MINIMUMS;

export const STANDARD_LABEL: Record<StandardName, string> = {
  nssda: "NSSDA (FGDC-STD-007.3-1998 §3.2.2)",
  asprs2023: "ASPRS Positional Accuracy Standards, Edition 2 (2023)",
};

/** The largest failure allowance a plan accepts (beyond this the plan is no longer a check survey). */
export const MAX_ALLOWED_FAILURES = 10;

/**
 * Smallest number of checkpoints n such that n − `allowedFailures` within tolerance out of n shows the required
 * share at the profile's confidence (one-sided exact binomial). Null when no number can (required share 1).
 *
 * @example checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 0) // 59
 * @example checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 1) // 93
 */
export function checkpointsForShare(req: ShareRequirement, allowedFailures: number): number | null {
  if (!Number.isInteger(allowedFailures) || allowedFailures < 0 || allowedFailures > MAX_ALLOWED_FAILURES)
    throw new Error(
      `plan: the failures allowed for must be a whole number from 0 to ${MAX_ALLOWED_FAILURES}, got ${allowedFailures}`,
    );
  const more = moreCheckpointsNeeded(allowedFailures, allowedFailures, req);
  return more === null ? null : allowedFailures + more;
}

export interface SampleSizeInput extends ShareRequirement {
  /** Checkpoints outside tolerance the plan allows for (c). */
  allowedFailures: number;
  /** The profile's own minimum number of checkpoints. */
  profileMinimum: number;
  /** Which standards' minimums apply. */
  standards: readonly StandardName[];
}

export interface SampleSize {
  /** From the share and confidence with `allowedFailures` allowed; null when no number can show it. */
  byShare: number | null;
  allowedFailures: number;
  /** The largest minimum of the chosen standards, with its name; null when none chosen. */
  standardMinimum: { standard: StandardName; count: number } | null;
  profileMinimum: number;
  /** Checkpoints the plan asks for: the largest of the three. */
  required: number;
  /** Which figure decided `required`. */
  decidedBy: "share" | "standard" | "profile";
}

/**
 * The checkpoints a plan asks for: the largest of the count the share needs, the chosen standards' minimums and the
 * profile's minimum. Throws when the share can never be shown (required share 1).
 *
 * @example planSampleSize({ requiredShare: 0.9, confidence: 0.9, allowedFailures: 0, profileMinimum: 10, standards: ["asprs2023"] }).required // 30
 */
export function planSampleSize(input: SampleSizeInput): SampleSize {
  const byShare = checkpointsForShare(input, input.allowedFailures);
  if (byShare === null)
    throw new Error(
      `plan: a required share of ${input.requiredShare} can never be shown by a sample; lower it below 1 or survey every plant`,
    );
  let standardMinimum: SampleSize["standardMinimum"] = null;
  for (const s of input.standards) {
    const count = STANDARD_MINIMUMS[s];
    if (!standardMinimum || count > standardMinimum.count) standardMinimum = { standard: s, count };
  }
  const std = standardMinimum?.count ?? 0;
  const required = Math.max(byShare, std, input.profileMinimum);
  const decidedBy = required === byShare ? "share" : required === std ? "standard" : "profile";
  return {
    byShare,
    allowedFailures: input.allowedFailures,
    standardMinimum,
    profileMinimum: input.profileMinimum,
    required,
    decidedBy,
  };
}
