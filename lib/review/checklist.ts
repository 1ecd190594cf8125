/**
 * The sign-off checklist: what a QA lead confirms before accepting an audit, checked against the
 * audit's own figures where they exist. Pure.
 */
import type { ToleranceProfile } from "@/lib/audit/profile";

/**
 * The checkpoints' survey should be at least this many times more precise than the tolerance being
 * tested. ASPRS Positional Accuracy Standards for Digital Geospatial Data, Ed. 1 (2014): checkpoints
 * "at least three times more accurate" than the data tested (from memory; a rule of thumb, not a law).
 */
export const INSTRUMENT_RATIO = 3;

export interface ChecklistContext {
  /** Pairs the audit formed. */
  pairs: number;
  /** The profile's minimum number of checkpoints. */
  minCheckpoints: number;
  /** The tightest limit of the profile (radial, cross-row or along-row), metres; null when none. */
  tightestLimitM: number | null;
  /** Median stated precision in the survey file, metres; null when the file has no precision column. */
  filePrecisionM: number | null;
  profileName: string;
  operation: string;
}

export interface ChecklistInput {
  checkpoints: boolean;
  instrument: boolean;
  /** The instrument's stated horizontal precision in millimetres; needed when the survey file does not state it. */
  instrumentPrecisionMm?: number | null;
  controlMark: boolean;
  /** Which mark, and how far off it was, in the signer's words. */
  controlMarkNote?: string | null;
  profileFits: boolean;
}

/** What is stored with the sign-off: every confirmation with the figures the signer saw. */
export interface ChecklistRecord {
  checkpoints: { confirmed: true; pairs: number; required: number };
  instrument: {
    confirmed: true;
    precisionMm: number;
    source: "survey file" | "signer";
    tightestLimitMm: number;
    ratio: number;
    requiredRatio: number;
  };
  controlMark: { confirmed: true; note: string | null };
  profileFits: { confirmed: true; profile: string; operation: string };
}

export interface ChecklistIssue {
  path: string[];
  message: string;
}

const mm = (m: number) => `${(m * 1000).toFixed(1)} mm`;

/** The tightest of the profile's limits, metres. */
export function tightestLimit(p: Pick<ToleranceProfile, "radialM" | "crossM" | "alongM">): number | null {
  const limits = [p.radialM, p.crossM, p.alongM].filter((x): x is number => x !== null && Number.isFinite(x) && x > 0);
  return limits.length ? Math.min(...limits) : null;
}

/**
 * Check the confirmations against the figures. Every item must be confirmed; "enough checkpoints"
 * cannot be confirmed when the audit has fewer pairs than the profile asks for, and "instrument" cannot
 * be confirmed when the stated precision is not at least INSTRUMENT_RATIO times finer than the tightest limit.
 *
 * @example evaluateChecklist(ctx, { checkpoints: true, instrument: true, controlMark: true, profileFits: true })
 */
export function evaluateChecklist(
  ctx: ChecklistContext,
  input: ChecklistInput,
): { ok: true; record: ChecklistRecord } | { ok: false; issues: ChecklistIssue[] } {
  const issues: ChecklistIssue[] = [];
  if (!input.checkpoints)
    issues.push({
      path: ["checklist", "checkpoints"],
      message: "Confirm that there are enough checkpoints for this profile.",
    });
  else if (ctx.pairs < ctx.minCheckpoints) {
    issues.push({
      path: ["checklist", "checkpoints"],
      message: `Only ${ctx.pairs} checkpoints were paired; the profile asks for at least ${ctx.minCheckpoints}. Return the audit for more checkpoints instead.`,
    });
  }

  const precisionM = ctx.filePrecisionM ?? (input.instrumentPrecisionMm ? input.instrumentPrecisionMm / 1000 : null);
  const source: "survey file" | "signer" = ctx.filePrecisionM !== null ? "survey file" : "signer";
  let instrument: ChecklistRecord["instrument"] | null = null;
  if (!input.instrument)
    issues.push({
      path: ["checklist", "instrument"],
      message: "Confirm that the survey instrument is precise enough for the tolerance.",
    });
  else if (ctx.tightestLimitM === null)
    issues.push({
      path: ["checklist", "instrument"],
      message: "The profile sets no limit to compare the instrument with.",
    });
  else if (precisionM === null || !(precisionM > 0)) {
    issues.push({
      path: ["checklist", "instrumentPrecisionMm"],
      message:
        "The survey file states no precision: enter the instrument's stated horizontal precision in millimetres.",
    });
  } else {
    const ratio = ctx.tightestLimitM / precisionM;
    if (ratio < INSTRUMENT_RATIO) {
      issues.push({
        path: ["checklist", "instrumentPrecisionMm"],
        message: `A survey precision of ${mm(precisionM)} is only ${ratio.toFixed(1)} times finer than the tightest limit (${mm(ctx.tightestLimitM)}); at least ${INSTRUMENT_RATIO} times is needed, i.e. ${mm(ctx.tightestLimitM / INSTRUMENT_RATIO)} or better.`,
      });
    } else {
      instrument = {
        confirmed: true,
        precisionMm: round(precisionM * 1000, 3),
        source,
        tightestLimitMm: round(ctx.tightestLimitM * 1000, 3),
        ratio: round(ratio, 2),
        requiredRatio: INSTRUMENT_RATIO,
      };
    }
  }
  if (!input.controlMark)
    issues.push({
      path: ["checklist", "controlMark"],
      message: "Confirm that the control mark was checked before the survey.",
    });
  if (!input.profileFits)
    issues.push({
      path: ["checklist", "profileFits"],
      message: `Confirm that "${ctx.profileName}" is the right profile for the next operation.`,
    });

  if (issues.length || !instrument) return { ok: false, issues };
  const note = input.controlMarkNote?.trim() || null;
  return {
    ok: true,
    record: {
      checkpoints: { confirmed: true, pairs: ctx.pairs, required: ctx.minCheckpoints },
      instrument,
      controlMark: { confirmed: true, note },
      profileFits: { confirmed: true, profile: ctx.profileName, operation: ctx.operation },
    },
  };
}

/** The median of the finite values, or null. */
export function medianFinite(values: ArrayLike<number> | null): number | null {
  if (!values) return null;
  const v = Array.from(values)
    .filter((x) => Number.isFinite(x))
    .sort((a, b) => a - b);
  if (v.length === 0) return null;
  const mid = v.length >> 1;
  return v.length % 2 ? v[mid] : (v[mid - 1] + v[mid]) / 2;
}

/** The signer's typed name must be their account name; case and spacing do not matter. */
export function namesMatch(typed: string, accountName: string): boolean {
  const norm = (s: string) => s.normalize("NFC").trim().replace(/\s+/g, " ").toLocaleLowerCase("en");
  return norm(typed).length > 0 && norm(typed) === norm(accountName);
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
