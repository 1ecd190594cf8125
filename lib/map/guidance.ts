/**
 * Per-bed summary of an audit and the grower's one-line guidance per bed: can the records of this bed be relied on
 * for the operation of the audit's tolerance profile? Pure.
 *
 * A bed is judged with the one trust rule of the audit (lib/audit/trust.ts, groupTrust) applied to the bed's
 * checkpoints alone, so a bed gets the same word as the verdict and the breakdown tables would give it:
 *  - relied on ("meets"): the one-sided exact lower bound of the share within tolerance reaches the profile's
 *    required share, and the 95th percentile (Hyndman–Fan type 7) of every limited error is within its limit;
 *  - not relied on ("does not meet"): the observed share is below the required share, or a 95th percentile exceeds
 *    its limit;
 *  - not yet shown ("not enough evidence yet"): neither — the checkpoints look fine but are too few to show the share
 *    with the profile's confidence; the line says how many more checkpoints, all within, would settle it.
 * Applying the audit's criteria per bed is our rule (common practice, no source).
 */
import { clopperPearson } from "@/lib/audit/intervals";
import { quantileSorted } from "@/lib/audit/quantiles";
import { groupTrust, oneSidedLowerBound, type GroupTrust, type TrustWord } from "@/lib/audit/trust";
import { operationPhrase } from "./record-guidance";
import type { BedGuidance, BedState, BedStats, MapProfile } from "./types";

/** Ends every grower guidance text. */
export const RECORD_ACCURACY_REMINDER =
  "This map shows how accurate the plant records are, not whether a machine is safe to run.";

const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });

function p95(values: number[]): number | null {
  if (values.length === 0) return null;
  return quantileSorted(Float64Array.from(values).sort(), 0.95);
}

/**
 * Statistics per bed, beds in natural order ("2" before "10"), checkpoints without a bed last.
 * `within[i]` is 1 within tolerance, 0 out, −1 unknown; `cross`/`along` NaN where unknown. Metres.
 *
 * @example bedStats({ bed: ["1", "1"], radial: [0.002, 0.03], cross: [NaN, NaN], along: [NaN, NaN], within: [1, 0], confidence: 0.95 })[0].out // 1
 */
export function bedStats(input: {
  bed: readonly string[];
  radial: ArrayLike<number>;
  cross: ArrayLike<number>;
  along: ArrayLike<number>;
  within: ArrayLike<number>;
  confidence: number;
}): BedStats[] {
  const groups = new Map<string, number[]>();
  for (let i = 0; i < input.bed.length; i++) {
    const b = input.bed[i];
    let g = groups.get(b);
    if (!g) groups.set(b, (g = []));
    g.push(i);
  }
  const order = [...groups.keys()].sort((a, b) => (a === "" ? 1 : b === "" ? -1 : collator.compare(a, b)));
  return order.map((bed) => {
    const idx = groups.get(bed)!;
    let known = 0,
      within = 0,
      sumR = 0,
      nR = 0;
    const r: number[] = [],
      c: number[] = [],
      a: number[] = [];
    for (const i of idx) {
      const w = input.within[i];
      if (w === 0 || w === 1) {
        known++;
        within += w;
      }
      if (Number.isFinite(input.radial[i])) {
        r.push(input.radial[i]);
        sumR += input.radial[i];
        nR++;
      }
      if (Number.isFinite(input.cross[i])) c.push(Math.abs(input.cross[i]));
      if (Number.isFinite(input.along[i])) a.push(Math.abs(input.along[i]));
    }
    const ci = clopperPearson(within, known, input.confidence);
    return {
      bed,
      n: idx.length,
      known,
      within,
      out: known - within,
      share: known ? within / known : null,
      lower: ci?.lower ?? null,
      upper: ci?.upper ?? null,
      lowerOneSided: known ? oneSidedLowerBound(within, known, input.confidence) : null,
      p95Radial: p95(r),
      p95Cross: p95(c),
      p95Along: p95(a),
      meanRadial: nR ? sumR / nR : null,
    };
  });
}

const mm = (m: number) => `${(m * 1000).toFixed(1)} mm`;
const pct = (s: number) => `${(s * 100).toFixed(1)} %`;
const pct0 = (s: number) => `${Math.round(s * 1000) / 10} %`;

/** "Bed 3", or a plain phrase for checkpoints without a bed label. */
export function bedName(bed: string): string {
  return bed === "" ? "Checkpoints without a bed" : `Bed ${bed}`;
}

/** The profile's name as it reads inside a sentence ("in-row weeding around plants"). */
const operationWords = (profile: MapProfile) => operationPhrase(profile.name);

const LIMIT_WORDS: Record<GroupTrust["exceeded"][number]["limit"], string> = {
  radial: "radial errors",
  cross: "cross-row errors",
  along: "along-row errors",
};

/** The bed state of each word of the trust rule. */
export const STATE_OF_WORD: Record<TrustWord, BedState> = {
  meets: "relied-on",
  "does not meet": "not-relied-on",
  "not enough evidence yet": "not-shown",
};

/** The trust rule (lib/audit/trust.ts) applied to one bed's statistics. */
export function bedTrust(s: BedStats, profile: MapProfile): GroupTrust {
  return groupTrust(
    { n: s.known, outside: s.out, p95Radial: s.p95Radial, p95Cross: s.p95Cross, p95Along: s.p95Along },
    profile,
  );
}

/**
 * The guidance of one bed (see the rule at the top of this file).
 * @example bedGuidance(stats, profile).line // "Bed 3: do not rely on the records for in-row weeding around plants — 13 of 67 checkpoints out of tolerance; …"
 */
export function bedGuidance(s: BedStats, profile: MapProfile | null): BedGuidance {
  const name = bedName(s.bed);
  if (!profile || (profile.radialM === null && profile.crossM === null && profile.alongM === null)) {
    return {
      bed: s.bed,
      state: "no-limits",
      word: null,
      line: `${name}: the audit's tolerance profile sets no limits, so there is nothing to judge against.`,
    };
  }
  const op = operationWords(profile);
  if (s.known === 0)
    return {
      bed: s.bed,
      state: "no-checkpoints",
      word: null,
      line: `${name}: no checkpoints here — the records of this bed are not checked.`,
    };
  const conf = pct0(profile.confidence);
  const t = bedTrust(s, profile);
  const base = { bed: s.bed, state: STATE_OF_WORD[t.word], word: t.word, moreNeeded: t.moreNeeded };
  if (t.word === "does not meet") {
    const parts = [`${s.out} of ${s.known} checkpoints out of tolerance`];
    const worst = t.exceeded[0];
    if (worst) parts.push(`95 % of ${LIMIT_WORDS[worst.limit]} within ${mm(worst.p95)}, limit ${mm(worst.limitM)}`);
    return { ...base, line: `${name}: do not rely on the records for ${op} — ${parts.join("; ")}.` };
  }
  if (t.word === "meets") {
    return {
      ...base,
      line: `${name}: the records can be relied on for ${op} — ${s.within} of ${s.known} checkpoints within tolerance, at least ${pct(t.lowerBound!)} with ${conf} confidence.`,
    };
  }
  const more =
    t.moreNeeded === null
      ? "no number of checkpoints can show it"
      : `survey ${t.moreNeeded} more here, all within tolerance, before relying on it for ${op}`;
  const line =
    s.out === 0
      ? `${name}: all ${s.known} checkpoints within tolerance, but too few to show ${pct0(profile.requiredShare)} with ${conf} confidence — ${more}.`
      : `${name}: ${s.out} of ${s.known} checkpoints out of tolerance, too many for so few checkpoints to show ${pct0(profile.requiredShare)} with ${conf} confidence — ${more}.`;
  return { ...base, line };
}

/** "1", "1 and 3", "1, 3 and 4". */
export function listWords(items: readonly string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/**
 * The one guidance line over all beds, ending with {@link RECORD_ACCURACY_REMINDER}.
 * @example overallGuidance(guidance, profile) // "At the tolerance “In-row weeding around plants”, the records can be relied on in no bed; not in bed 3; not yet shown in beds 1, 2, 4, 5 and 6. This map shows …"
 */
export function overallGuidance(guidance: readonly BedGuidance[], profile: MapProfile | null): string {
  const labelled = guidance.filter((g) => g.bed !== "");
  const noLimits = !profile || (profile.radialM === null && profile.crossM === null && profile.alongM === null);
  if (noLimits || labelled.length === 0) {
    const why = noLimits ? "The audit's profile sets no tolerance limits" : "The records carry no bed labels";
    return `${why}, so there is no guidance per bed. ${RECORD_ACCURACY_REMINDER}`;
  }
  const beds = (state: BedState) => labelled.filter((g) => g.state === state).map((g) => g.bed);
  const phrase = (list: string[]) =>
    list.length === 0 ? "no bed" : `${list.length === 1 ? "bed" : "beds"} ${listWords(list)}`;
  const parts = [`the records can be relied on in ${phrase(beds("relied-on"))}`];
  const not = beds("not-relied-on"),
    unshown = beds("not-shown"),
    unchecked = beds("no-checkpoints");
  if (not.length) parts.push(`not in ${phrase(not)}`);
  if (unshown.length) parts.push(`not yet shown in ${phrase(unshown)}`);
  if (unchecked.length) parts.push(`no checkpoints in ${phrase(unchecked)}`);
  return `At the tolerance “${profile.name}”, ${parts.join("; ")}. ${RECORD_ACCURACY_REMINDER}`;
}
