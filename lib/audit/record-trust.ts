/**
 * Trust by cause, carried back to every as-planted record, surveyed or not. Pure.
 *
 * The rule (our own; common practice, no source), in the sentence the pages show ({@link RECORD_RULE_SENTENCE}):
 *  1. Causes first. The strata a record carries about how it was made — fix quality, tool arm, planting day — are
 *     judged with the one trust rule (trust.ts, groupTrust) on the checkpoints they hold. While some stratum
 *     "does not meet", the worst of them (lowest share within tolerance; then most checkpoints outside; then fix
 *     before arm before day) is named a cause, its checkpoints are set aside, and the others are judged again — so a
 *     float-fix stretch that also drags down arm 2 condemns the float records, not the whole arm.
 *  2. Then places. On the checkpoints left, each bed × row is judged; those that "do not meet" are named too (they
 *     do not overlap, so all at once).
 *  3. A record in a named stratum is "do not rely". A record whose own checkpoint is out of tolerance is "do not
 *     rely". A record whose fix quality, arm or planting day no checkpoint shares is "not yet shown". Every other
 *     record takes the word of all remaining checkpoints together: "meets" → rely; "not enough evidence yet" → not
 *     yet shown; "does not meet" → do not rely (no single cause found).
 */
import { quantileSorted } from "./quantiles";
import { groupTrust, type GroupTrust, type ShareRequirement } from "./trust";

/** The rule above in one sentence, as the grower's page states it. */
export const RECORD_RULE_SENTENCE =
  "A record is not to be relied on when the checkpoints sharing its fix quality, tool arm or planting day — or, " +
  "once those are set aside, the checkpoints of its own bed and row — do not meet the tolerance, or when its own " +
  "checkpoint is out; every other record is judged by all remaining checkpoints together.";

/** Strata that say how a record was made, judged first, in this order when tied. */
export const CAUSE_DIMENSIONS = ["fix", "arm", "day"] as const;
/** Every stratum dimension: the causes, then the place. */
export type StratumDimension = (typeof CAUSE_DIMENSIONS)[number] | "bedRow";

/** Record classes, stored as codes in {@link RecordTrust.recordClass}. */
export const RECORD_CLASS = { RELY: 0, DO_NOT_RELY: 1, NOT_SHOWN: 2 } as const;
export type RecordClassCode = (typeof RECORD_CLASS)[keyof typeof RECORD_CLASS];
/** Words of the record classes, indexed by code. */
export const RECORD_CLASS_WORDS = ["rely", "do not rely", "not yet shown"] as const;
export type RecordClassWord = (typeof RECORD_CLASS_WORDS)[number];

/** Why a record has its class (beside a named stratum, which is a non-negative index into `named`). */
export const RECORD_REASON = {
  /** Judged by all remaining checkpoints together. */
  REMAINDER: -1,
  /** Its own checkpoint is out of tolerance. */
  OWN_CHECKPOINT: -2,
  /** No checkpoint shares its fix quality, arm or planting day. */
  UNTESTED: -3,
} as const;

/** One stratum dimension: text keys and the key code of every pair and every record (−1 = no value). */
export interface StratumColumn {
  dimension: StratumDimension;
  values: readonly string[];
  pairCodes: Int32Array;
  recordCodes: Int32Array;
}

/** Input of {@link recordTrust}. Metres. */
export interface RecordTrustInput {
  recordCount: number;
  pairs: {
    /** 1 within every limit, 0 outside, −1 unknown (not judged). */
    within: Int8Array;
    radial: ArrayLike<number>;
    /** NaN where unknown. */
    cross: ArrayLike<number>;
    along: ArrayLike<number>;
    /** Index of the pair's own record, −1 when unknown. */
    record: Int32Array;
  };
  strata: readonly StratumColumn[];
  profile: ShareRequirement & { radialM: number | null; crossM: number | null; alongM: number | null };
}

/** A stratum judged by the rule. */
export interface StratumJudgement {
  dimension: StratumDimension;
  key: string;
  /** Records carrying this key. */
  records: number;
  /** The trust rule on all of the stratum's checkpoints, as a breakdown table judges it. */
  initial: GroupTrust;
  /** The trust rule on the stratum's checkpoints when it was judged last: when named, or after the named strata
   *  were set aside. */
  trust: GroupTrust;
  /** The round in which it was named (1-based, causes before places); null when not named. */
  namedInRound: number | null;
}

/** The result of {@link recordTrust}. */
export interface RecordTrust {
  /** Every stratum with at least one checkpoint, in dimension order, keys in their given order. */
  strata: StratumJudgement[];
  /** The strata named as not to rely on, in the order they were named. */
  named: StratumJudgement[];
  /** Keys of cause strata that no checkpoint covers, per dimension. */
  untested: { dimension: StratumDimension; key: string; records: number }[];
  /** The trust rule on all checkpoints outside the named strata; null when none is left. */
  remainder: GroupTrust | null;
  /** Per record: a {@link RECORD_CLASS} code. */
  recordClass: Uint8Array;
  /** Per record: index into `named`, or a {@link RECORD_REASON}. */
  recordReason: Int32Array;
  counts: Record<RecordClassWord, number>;
}

function p95(values: number[]): number | null {
  if (values.length === 0) return null;
  return quantileSorted(Float64Array.from(values).sort(), 0.95);
}

/** The trust rule over the pairs `idx` (all with a known within). */
function trustOf(idx: readonly number[], input: RecordTrustInput): GroupTrust {
  const { within, radial, cross, along } = input.pairs;
  let outside = 0;
  const r: number[] = [];
  const c: number[] = [];
  const a: number[] = [];
  for (const i of idx) {
    if (within[i] === 0) outside++;
    if (Number.isFinite(radial[i])) r.push(radial[i]);
    if (Number.isFinite(cross[i])) c.push(Math.abs(cross[i]));
    if (Number.isFinite(along[i])) a.push(Math.abs(along[i]));
  }
  return groupTrust({ n: idx.length, outside, p95Radial: p95(r), p95Cross: p95(c), p95Along: p95(a) }, input.profile);
}

function check(input: RecordTrustInput): void {
  const n = input.pairs.within.length;
  const { radial, cross, along, record } = input.pairs;
  if (radial.length !== n || cross.length !== n || along.length !== n || record.length !== n)
    throw new Error("recordTrust: pair columns differ in length");
  for (const s of input.strata) {
    if (s.pairCodes.length !== n) throw new Error(`recordTrust: ${s.dimension} has ${s.pairCodes.length} pair codes`);
    if (s.recordCodes.length !== input.recordCount)
      throw new Error(`recordTrust: ${s.dimension} has ${s.recordCodes.length} record codes`);
  }
}

/** Worse first: lower share, then more outside, then dimension order (given by `rank`). */
function worse(a: { t: GroupTrust; rank: number }, b: { t: GroupTrust; rank: number }): number {
  return (a.t.share ?? 1) - (b.t.share ?? 1) || b.t.outside - a.t.outside || a.rank - b.rank;
}

/**
 * Applies the rule of this module to every record.
 *
 * @example recordTrust(input).counts // { rely: 4640, "do not rely": 160, "not yet shown": 0 }
 */
export function recordTrust(input: RecordTrustInput): RecordTrust {
  check(input);
  const nPairs = input.pairs.within.length;
  const active = new Uint8Array(nPairs);
  for (let i = 0; i < nPairs; i++) active[i] = input.pairs.within[i] === -1 ? 0 : 1;

  const causes = CAUSE_DIMENSIONS.map((d) => input.strata.find((s) => s.dimension === d)).filter(
    (s): s is StratumColumn => s !== undefined,
  );
  const places = input.strata.filter((s) => s.dimension === "bedRow");
  const ordered = [...causes, ...places];

  const recordsOf = ordered.map((s) => {
    const counts = new Int32Array(s.values.length);
    for (const c of s.recordCodes) if (c >= 0) counts[c]++;
    return counts;
  });
  const pairsOf = ordered.map((s) => {
    const lists: number[][] = s.values.map(() => []);
    for (let i = 0; i < nPairs; i++) if (active[i] && s.pairCodes[i] >= 0) lists[s.pairCodes[i]].push(i);
    return lists;
  });
  const judgements = new Map<string, StratumJudgement>();
  const keyOf = (d: number, k: number) => `${d}:${k}`;
  // Every stratum judged on all its checkpoints first, as a breakdown table judges it.
  for (let d = 0; d < ordered.length; d++)
    for (let k = 0; k < ordered[d].values.length; k++) {
      if (pairsOf[d][k].length === 0) continue;
      const t = trustOf(pairsOf[d][k], input);
      judgements.set(keyOf(d, k), {
        dimension: ordered[d].dimension,
        key: ordered[d].values[k],
        records: recordsOf[d][k],
        initial: t,
        trust: t,
        namedInRound: null,
      });
    }
  const judge = (d: number, k: number): GroupTrust | null => {
    const idx = pairsOf[d][k].filter((i) => active[i] === 1);
    if (idx.length === 0) return null;
    const t = trustOf(idx, input);
    judgements.get(keyOf(d, k))!.trust = t;
    return t;
  };
  const named: StratumJudgement[] = [];
  const name = (d: number, k: number, round: number) => {
    const j = judgements.get(keyOf(d, k))!;
    j.namedInRound = round;
    named.push(j);
    for (const i of pairsOf[d][k]) active[i] = 0;
  };

  // 1. Causes, one at a time, judging again after each.
  let round = 0;
  const namedSet = new Set<string>();
  for (;;) {
    let worst: { d: number; k: number; t: GroupTrust; rank: number } | null = null;
    for (let d = 0; d < causes.length; d++)
      for (let k = 0; k < causes[d].values.length; k++) {
        if (namedSet.has(keyOf(d, k))) continue;
        const t = judge(d, k);
        if (t?.word !== "does not meet") continue;
        const candidate = { d, k, t, rank: d };
        if (!worst || worse(candidate, worst) < 0) worst = candidate;
      }
    if (!worst) break;
    round++;
    namedSet.add(keyOf(worst.d, worst.k));
    name(worst.d, worst.k, round);
  }
  // 2. Places, all at once: bed × row strata do not overlap.
  for (let d = causes.length; d < ordered.length; d++) {
    const failing: number[] = [];
    for (let k = 0; k < ordered[d].values.length; k++) if (judge(d, k)?.word === "does not meet") failing.push(k);
    if (failing.length) round++;
    for (const k of failing) name(d, k, round);
  }

  const remaining: number[] = [];
  for (let i = 0; i < nPairs; i++) if (active[i]) remaining.push(i);
  const remainder = remaining.length ? trustOf(remaining, input) : null;

  // 3. Every record.
  const recordClass = new Uint8Array(input.recordCount);
  const recordReason = new Int32Array(input.recordCount);
  const pooledClass: RecordClassCode =
    remainder?.word === "meets"
      ? RECORD_CLASS.RELY
      : remainder?.word === "does not meet"
        ? RECORD_CLASS.DO_NOT_RELY
        : RECORD_CLASS.NOT_SHOWN;
  recordClass.fill(pooledClass);
  recordReason.fill(RECORD_REASON.REMAINDER);

  const untested: RecordTrust["untested"] = [];
  for (let d = 0; d < causes.length; d++) {
    const s = causes[d];
    const covered = new Uint8Array(s.values.length);
    for (let i = 0; i < nPairs; i++)
      if (input.pairs.within[i] !== -1 && s.pairCodes[i] >= 0) covered[s.pairCodes[i]] = 1;
    for (let k = 0; k < s.values.length; k++)
      if (!covered[k] && recordsOf[d][k] > 0)
        untested.push({ dimension: s.dimension, key: s.values[k], records: recordsOf[d][k] });
    for (let r = 0; r < input.recordCount; r++) {
      const c = s.recordCodes[r];
      if (c >= 0 && !covered[c]) {
        recordClass[r] = RECORD_CLASS.NOT_SHOWN;
        recordReason[r] = RECORD_REASON.UNTESTED;
      }
    }
  }
  for (let i = 0; i < nPairs; i++) {
    const r = input.pairs.record[i];
    if (r >= 0 && input.pairs.within[i] === 0) {
      recordClass[r] = RECORD_CLASS.DO_NOT_RELY;
      recordReason[r] = RECORD_REASON.OWN_CHECKPOINT;
    }
  }
  // Named strata last; a record in several takes the one named first.
  const namedIndex = ordered.map((s) => new Int32Array(s.values.length).fill(-1));
  named.forEach((j, m) => {
    const d = ordered.findIndex((s) => s.dimension === j.dimension);
    namedIndex[d][ordered[d].values.indexOf(j.key)] = m;
  });
  for (let r = 0; r < input.recordCount; r++) {
    let first = -1;
    for (let d = 0; d < ordered.length; d++) {
      const c = ordered[d].recordCodes[r];
      const m = c >= 0 ? namedIndex[d][c] : -1;
      if (m >= 0 && (first < 0 || m < first)) first = m;
    }
    if (first >= 0) {
      recordClass[r] = RECORD_CLASS.DO_NOT_RELY;
      recordReason[r] = first;
    }
  }

  const counts: Record<RecordClassWord, number> = { rely: 0, "do not rely": 0, "not yet shown": 0 };
  for (const c of recordClass) counts[RECORD_CLASS_WORDS[c]]++;
  const strata: StratumJudgement[] = [];
  for (let d = 0; d < ordered.length; d++)
    for (let k = 0; k < ordered[d].values.length; k++) {
      const j = judgements.get(keyOf(d, k));
      if (j) strata.push(j);
    }
  return { strata, named, untested, remainder, recordClass, recordReason, counts };
}
