/**
 * Alert thresholds of an organisation checked against one computed audit: an arm's cross-row offset above a
 * limit, the horizontal RMSE up by more than a share from the previous audit of the same machine (else field),
 * and a failed verdict. Pure: the caller gathers the figures (diagnostics, verdict, previous audit).
 *
 * The thresholds themselves are the organisation's choice (common practice, no source).
 */

/** The organisation's thresholds; a null threshold (or false) is not checked. */
export interface AlertThresholds {
  /** Metres: alert when an arm's mean cross-row error on fixed-fix checkpoints is significant and larger than this. */
  armCrossOffsetM: number | null;
  /** Share: 0.3 alerts when the horizontal RMSE is more than 30 % above the previous audit's. */
  rmseRise: number | null;
  failedVerdict: boolean;
}

/** The figures of the audit just computed. Metres. */
export interface AlertAuditFigures {
  arms: {
    arm: string | null;
    /** Mean cross-row error (survey − planted) on the arm's fixed-fix checkpoints; null without any. */
    crossMean: number | null;
    /** Whether its confidence interval excludes zero (an offset, not noise). */
    crossSignificant: boolean;
    n: number;
    /** "fixed": RTK-fixed checkpoints only; "all": the records state no fix quality, so every checkpoint. */
    basis?: "fixed" | "all";
  }[];
  rmseR: number | null;
  /** The verdict's result; null when the audit has none. */
  passed: boolean | null;
  /** Sentences of the verdict's failed criteria. */
  failedCriteria: string[];
}

/** The previous audit the RMSE is compared with. */
export interface AlertPrevious {
  auditId: string;
  title: string;
  /** Whether it is the previous audit of the same machine or, without one, of the same field. */
  basis: "machine" | "field";
  rmseR: number | null;
}

export type AlertKind = "arm-cross-offset" | "rmse-rise" | "failed-verdict";

export interface AlertFinding {
  kind: AlertKind;
  /** One plain sentence with the figures. */
  message: string;
  detail: Record<string, string | number | boolean | null>;
}

/** Millimetres with one decimal; metres from a metre up (a wrong reference frame is off by metres, not millimetres). */
const mm = (m: number) => (Math.abs(m) >= 1 ? `${m.toFixed(2)} m` : `${(m * 1000).toFixed(1)} mm`);
const armName = (arm: string | null) => (arm === null ? "records without an arm" : `arm ${arm}`);

/** One finding for all arms over the limit; when every arm is, the whole pass is more likely shifted. */
function armFinding(over: AlertAuditFigures["arms"], limit: number, everyArm: boolean): AlertFinding {
  const basis = (a: AlertAuditFigures["arms"][number]) =>
    a.basis === "all" ? "checkpoints, the records state no fix" : "fixed-fix checkpoints";
  // survey − planted < 0: the plants lie left of the records, so the records sit right of the plants.
  const side = (m: number) => (m < 0 ? "records right of the plants" : "records left of the plants");
  const parts = over.map(
    (a) => `${armName(a.arm)} ${mm(Math.abs(a.crossMean!))} (${side(a.crossMean!)}, ${a.n} ${basis(a)})`,
  );
  const head = over.length === 1 ? "Mean cross-row error of" : "Mean cross-row errors of";
  const shift = everyArm
    ? " Every arm is off, so a shift of the whole pass (base-station coordinates, reference frame) is more likely than the arms' calibration."
    : "";
  return {
    kind: "arm-cross-offset",
    message: `${head} ${parts.join(", ")}, above the ${mm(limit)} limit.${shift}`,
    detail: {
      arms: over.map((a) => a.arm ?? "").join(","),
      largestM: Math.max(...over.map((a) => Math.abs(a.crossMean!))),
      limitM: limit,
      everyArm,
    },
  };
}
const pct = (share: number) => `${(share * 100).toFixed(0)} %`;

/**
 * The thresholds the audit breaches, in a fixed order (arms, then the RMSE rise, then the verdict). A cross-row
 * offset breaches when |mean| > limit and the offset is significant; all arms over the limit make one finding; the RMSE rise when
 * rmseR/previous.rmseR − 1 > rise (not checked without a previous audit or with a previous RMSE of zero). Inputs
 * are not modified.
 *
 * @example evaluateAlerts({ armCrossOffsetM: 0.002, rmseRise: null, failedVerdict: false },
 *   { arms: [{ arm: "3", crossMean: -0.003, crossSignificant: true, n: 40 }], rmseR: 0.01, passed: true, failedCriteria: [] },
 *   null) // [{ kind: "arm-cross-offset", message: "Mean cross-row error of arm 3 3.0 mm (records right of the plants, 40 fixed-fix checkpoints), above the 2.0 mm limit.", … }]
 */
export function evaluateAlerts(
  thresholds: AlertThresholds,
  figures: AlertAuditFigures,
  previous: AlertPrevious | null,
): AlertFinding[] {
  const found: AlertFinding[] = [];
  const limit = thresholds.armCrossOffsetM;
  if (limit !== null) {
    if (!(limit > 0)) throw new Error(`evaluateAlerts: armCrossOffsetM must be above 0 m, got ${limit}`);
    const measured = figures.arms.filter((a) => a.crossMean !== null && a.crossSignificant);
    const over = measured.filter((a) => Math.abs(a.crossMean!) > limit);
    if (over.length) found.push(armFinding(over, limit, over.length >= 2 && over.length === figures.arms.length));
  }
  const rise = thresholds.rmseRise;
  if (rise !== null) {
    if (!(rise > 0)) throw new Error(`evaluateAlerts: rmseRise must be above 0, got ${rise}`);
    const before = previous?.rmseR ?? null;
    const after = figures.rmseR;
    if (previous && before !== null && before > 0 && after !== null) {
      const relative = after / before - 1;
      if (relative > rise)
        found.push({
          kind: "rmse-rise",
          message: `Horizontal RMSE ${mm(after)} is ${pct(relative)} above the ${mm(before)} of the previous audit of the same ${previous.basis} (“${previous.title}”); the limit is ${pct(rise)}.`,
          detail: {
            rmseRM: after,
            previousRmseRM: before,
            relative,
            limit: rise,
            previousAuditId: previous.auditId,
            basis: previous.basis,
          },
        });
    }
  }
  if (thresholds.failedVerdict && figures.passed === false) {
    const reasons = figures.failedCriteria.length
      ? ` ${figures.failedCriteria.map((c) => c.replace(/[.\s]+$/, "")).join("; ")}.`
      : "";
    found.push({
      kind: "failed-verdict",
      message: `The audit failed its tolerance profile.${reasons}`,
      detail: { failedCriteria: figures.failedCriteria.length },
    });
  }
  return found;
}
