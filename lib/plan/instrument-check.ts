/**
 * The instrument check on a control mark: the surveyor measures a mark of known position before and after the survey;
 * the differences are judged against the instrument's stated precision and the profile's tightest limit. Pure.
 *
 * Judgement (our words; thresholds common practice, no source, except the ratio to the limit):
 *  - "meets": every difference within 2 × the stated precision and within the tightest limit ÷ 3, mark re-measured
 *    after the survey;
 *  - "fails": a difference over 3 × the stated precision, or over the tightest limit ÷ 3 (checkpoints should be at
 *    least three times more accurate than the tolerance tested: ASPRS Positional Accuracy Standards Ed. 1 (2014),
 *    lib/review/checklist.ts INSTRUMENT_RATIO);
 *  - "check": anything between, or no measurement after the survey.
 * A measurement more than ten times the stated precision away is refused: it is almost surely the wrong mark, a
 * typing error or another CRS, not an instrument error.
 */
import { INSTRUMENT_RATIO } from "@/lib/review/checklist";

export const CHECK_WORDS = ["meets", "check", "fails"] as const;
export type CheckWord = (typeof CHECK_WORDS)[number];

/** Differences beyond this many times the stated precision are refused. */
export const REFUSE_FACTOR = 10;
const MEETS_FACTOR = 2;
const FAILS_FACTOR = 3;

export interface MarkPosition {
  e: number;
  n: number;
  h?: number | null;
}

export interface MarkDifference {
  /** Measured minus known, metres. */
  dE: number;
  dN: number;
  /** Horizontal distance, metres. */
  d: number;
  /** Height difference, metres; null when either height is missing. */
  dH: number | null;
}

export interface InstrumentCheck {
  markName: string;
  before: MarkDifference;
  after: MarkDifference | null;
  /** Horizontal distance between the two measurements, metres; null without an after-measurement. */
  drift: number | null;
  /** The largest horizontal difference, metres. */
  worstM: number;
  precisionM: number;
  tightestLimitM: number | null;
  /** Largest difference still "meets": min(2 × precision, tightest limit ÷ 3), metres. */
  meetsUpToM: number;
  word: CheckWord;
  /** Why, in words with the numbers. */
  reasons: string[];
}

const mm = (m: number) => `${Number((m * 1000).toFixed(1))} mm`;

function difference(known: MarkPosition, measured: MarkPosition): MarkDifference {
  const dE = measured.e - known.e;
  const dN = measured.n - known.n;
  const dH =
    known.h !== null && known.h !== undefined && measured.h !== null && measured.h !== undefined
      ? measured.h - known.h
      : null;
  return { dE, dN, d: Math.hypot(dE, dN), dH };
}

/**
 * Judge a control-mark check. Throws (a message with the numbers) when a measurement lies more than ten times the
 * stated precision from the known position, or the input is not usable.
 *
 * @example checkControlMark({ markName: "KF-03", known: { e: 0, n: 0 }, before: { e: 0.003, n: 0.004 }, after: { e: 0.001, n: 0 }, precisionMm: 5, tightestLimitM: 0.03 }).word // "meets"
 */
export function checkControlMark(input: {
  markName: string;
  known: MarkPosition;
  before: MarkPosition;
  after: MarkPosition | null;
  /** The instrument's stated horizontal precision, millimetres. */
  precisionMm: number;
  /** The profile's tightest limit, metres; null when it sets none. */
  tightestLimitM: number | null;
}): InstrumentCheck {
  if (!(input.precisionMm > 0) || !Number.isFinite(input.precisionMm))
    throw new Error(
      `control mark: the instrument's stated precision must be a number of millimetres above 0, got ${input.precisionMm}`,
    );
  for (const [what, p] of [
    ["known position", input.known],
    ["measurement before the survey", input.before],
    ...(input.after ? ([["measurement after the survey", input.after]] as const) : []),
  ] as const)
    if (!Number.isFinite(p.e) || !Number.isFinite(p.n))
      throw new Error(`control mark: the ${what} needs a finite easting and northing`);
  const precisionM = input.precisionMm / 1000;
  const before = difference(input.known, input.before);
  const after = input.after ? difference(input.known, input.after) : null;
  const refuse = REFUSE_FACTOR * precisionM;
  for (const [when, d] of [
    ["before", before],
    ["after", after],
  ] as const)
    if (d && d.d > refuse)
      throw new Error(
        `control mark: the measurement ${when} the survey lies ${mm(d.d)} from the known position of ${input.markName} (east ${mm(d.dE)}, north ${mm(d.dN)}), more than ten times the instrument's stated precision (${REFUSE_FACTOR} × ${mm(precisionM)} = ${mm(refuse)}). Check the mark's name, its known coordinates and the CRS of both; nothing was saved`,
      );
  const drift = after ? Math.hypot(input.after!.e - input.before.e, input.after!.n - input.before.n) : null;
  const worstM = Math.max(before.d, after?.d ?? 0);
  const limitShare = input.tightestLimitM !== null ? input.tightestLimitM / INSTRUMENT_RATIO : null;
  const meetsUpToM = Math.min(MEETS_FACTOR * precisionM, limitShare ?? Number.POSITIVE_INFINITY);
  const reasons: string[] = [];
  let word: CheckWord = "meets";
  if (worstM > FAILS_FACTOR * precisionM) {
    word = "fails";
    reasons.push(
      `the largest difference, ${mm(worstM)}, is over ${FAILS_FACTOR} × the stated precision (${mm(FAILS_FACTOR * precisionM)})`,
    );
  }
  if (limitShare !== null && worstM > limitShare) {
    word = "fails";
    reasons.push(
      `the largest difference, ${mm(worstM)}, is over a third of the tightest limit (${mm(input.tightestLimitM!)} ÷ ${INSTRUMENT_RATIO} = ${mm(limitShare)})`,
    );
  }
  if (word !== "fails" && worstM > MEETS_FACTOR * precisionM) {
    word = "check";
    reasons.push(
      `the largest difference, ${mm(worstM)}, is between ${MEETS_FACTOR} and ${FAILS_FACTOR} × the stated precision (${mm(MEETS_FACTOR * precisionM)}–${mm(FAILS_FACTOR * precisionM)})`,
    );
  }
  if (!after) {
    if (word === "meets") word = "check";
    reasons.push("the mark was not measured again after the survey, so a drift during the work cannot be ruled out");
  }
  if (word === "meets")
    reasons.push(
      `before ${mm(before.d)}, after ${mm(after!.d)}: both within ${mm(meetsUpToM)} (${MEETS_FACTOR} × the stated precision${limitShare !== null ? " and a third of the tightest limit" : ""})`,
    );
  return {
    markName: input.markName,
    before,
    after,
    drift,
    worstM,
    precisionM,
    tightestLimitM: input.tightestLimitM,
    meetsUpToM,
    word,
    reasons,
  };
}
