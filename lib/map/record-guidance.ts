/**
 * What the trust by cause (lib/audit/record-trust.ts) tells the grower, in words: the DTO of
 * GET /api/audits/:id/record-trust. Pure.
 */
import { stratumLabel } from "@/lib/audit/record-trust-input";
import {
  RECORD_RULE_SENTENCE,
  type RecordTrust,
  type StratumDimension,
  type StratumJudgement,
} from "@/lib/audit/record-trust";
import type { GroupTrust, TrustWord } from "@/lib/audit/trust";

/** A judged stratum as the page lists it. */
export interface StratumLine {
  dimension: StratumDimension;
  key: string;
  label: string;
  records: number;
  /** Checkpoints and those outside when judged last (for a named stratum: when it was named). */
  n: number;
  outside: number;
  word: TrustWord;
  /** The word on all of its checkpoints, as a breakdown table gives it. */
  initialWord: TrustWord;
  named: boolean;
  line: string;
}

/** GET /api/audits/:id/record-trust. */
export interface RecordTrustDto {
  audit: { id: string; title: string; revision: number; state: string };
  /** The operation the records are judged for; `own` when it is the audit's own profile. */
  profile: { id: string | null; name: string; own: boolean };
  rule: string;
  counts: { total: number; rely: number; doNotRely: number; notShown: number };
  /** One line over every record. */
  summary: string;
  named: StratumLine[];
  untested: { label: string; records: number }[];
  remainder: Pick<GroupTrust, "n" | "outside" | "share" | "lowerBound" | "word" | "moreNeeded"> | null;
  /** Every stratum with checkpoints. */
  strata: StratumLine[];
}

const nf = new Intl.NumberFormat("en-GB");
const count = (n: number, one: string, many = `${one}s`) => `${nf.format(n)} ${n === 1 ? one : many}`;
const pct = (s: number) => `${(s * 100).toFixed(1)} %`;

/** "inter-row hoeing" from "Inter-row hoeing"; a name starting with an acronym is kept. */
export function operationPhrase(name: string): string {
  const n = name.trim();
  return n.length > 1 && n[1] === n[1].toLowerCase() ? n[0].toLowerCase() + n.slice(1) : n;
}

function stratumLine(j: StratumJudgement): StratumLine {
  const label = stratumLabel(j.dimension, j.key);
  const t = j.trust;
  const named = j.namedInRound !== null;
  const evidence = `${t.outside} of ${t.n} checkpoints out of tolerance`;
  const line = named
    ? `${label}: do not rely on its ${count(j.records, "record")} — ${evidence}.`
    : j.initial.word === "does not meet" && t.word !== "does not meet"
      ? `${label}: ${j.initial.outside} of ${j.initial.n} checkpoints out, all explained by the causes above; the other ${t.n} are judged with the rest.`
      : `${label}: ${evidence}.`;
  return {
    dimension: j.dimension,
    key: j.key,
    label,
    records: j.records,
    n: t.n,
    outside: t.outside,
    word: t.word,
    initialWord: j.initial.word,
    named,
    line,
  };
}

/**
 * The page's words for a record trust.
 * @example recordTrustDto(trust, { audit, profile }).summary // "Do not rely on 160 of 4,800 records for inter-row hoeing: fix quality rtk-float. The other 4,640 can be relied on — …"
 */
export function recordTrustDto(
  trust: RecordTrust,
  ctx: { audit: RecordTrustDto["audit"]; profile: RecordTrustDto["profile"] },
): RecordTrustDto {
  const c = trust.counts;
  const total = c.rely + c["do not rely"] + c["not yet shown"];
  const op = operationPhrase(ctx.profile.name);
  const parts: string[] = [];
  const causes = trust.named.map((j) => stratumLabel(j.dimension, j.key));
  if (c["do not rely"] > 0) {
    const why = causes.length ? `: ${causes.join("; ")}` : "";
    parts.push(`Do not rely on ${nf.format(c["do not rely"])} of ${count(total, "record")} for ${op}${why}.`);
  }
  const r = trust.remainder;
  if (c.rely > 0 && r)
    parts.push(
      `${c["do not rely"] > 0 ? "The other" : "All"} ${nf.format(c.rely)} can be relied on — ${nf.format(r.n - r.outside)} of ${nf.format(r.n)} remaining checkpoints within tolerance, at least ${pct(r.lowerBound ?? 0)} with ${Math.round(r.confidence * 100)} % confidence.`,
    );
  if (c["not yet shown"] > 0) {
    const why =
      r && r.word === "not enough evidence yet" && r.moreNeeded !== null
        ? ` — too few checkpoints; ${r.moreNeeded} more, all within tolerance, would settle it`
        : trust.untested.length
          ? ` — no checkpoint shares their ${trust.untested.map((u) => stratumLabel(u.dimension, u.key)).join(", ")}`
          : "";
    parts.push(`${nf.format(c["not yet shown"])} not yet shown${why}.`);
  }
  if (parts.length === 0) parts.push("No record can be judged: the audit has no checkpoints judged against limits.");
  return {
    audit: ctx.audit,
    profile: ctx.profile,
    rule: RECORD_RULE_SENTENCE,
    counts: { total, rely: c.rely, doNotRely: c["do not rely"], notShown: c["not yet shown"] },
    summary: parts.join(" "),
    named: trust.named.map(stratumLine),
    untested: trust.untested.map((u) => ({ label: stratumLabel(u.dimension, u.key), records: u.records })),
    remainder: r
      ? {
          n: r.n,
          outside: r.outside,
          share: r.share,
          lowerBound: r.lowerBound,
          word: r.word,
          moreNeeded: r.moreNeeded,
        }
      : null,
    strata: trust.strata.map(stratumLine),
  };
}
