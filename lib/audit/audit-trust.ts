/**
 * The trust rule applied to a whole audit, as the report, the result page and the summary JSON show it: the word
 * for all pairs and for every breakdown row, from the stored summary and verdict. Pure.
 *
 * Works on summaries stored before the rule (no `within` per row): see groupRowTrust.
 */
import { groupRowTrust, type GroupRow } from "./groups";
import type { ToleranceProfile } from "./profile";
import { groupTrust, type GroupTrust } from "./trust";
import type { AuditSummary } from "./types";
import type { Verdict } from "./verdict";

/** The trust of an audit's pairs and of each breakdown row. */
export interface AuditTrust {
  /** All pairs; null without tolerance limits. */
  all: GroupTrust | null;
  /** Per grouping, one entry per row in the summary's order. */
  groups: Record<string, { key: string | null; trust: GroupTrust | null }[]>;
}

type TrustProfile = Pick<ToleranceProfile, "requiredShare" | "confidence" | "radialM" | "crossM" | "alongM">;

/**
 * The trust rule over all pairs and every breakdown row of a computed audit. The 95th percentiles of all pairs are
 * the summary's R95 and the verdict's cross/along figures (metres).
 *
 * @example auditTrust(summary, verdict, profile).all?.word // "meets"
 */
export function auditTrust(
  summary: Pick<AuditSummary, "withinTolerance" | "r95" | "groups">,
  verdict: Pick<Verdict, "criteria"> | null,
  profile: TrustProfile,
): AuditTrust {
  const w = summary.withinTolerance;
  const observed = (id: "cross" | "along") => verdict?.criteria.find((c) => c.id === id)?.observed ?? null;
  const all = w
    ? groupTrust(
        {
          n: w.n,
          outside: w.n - w.within,
          p95Radial: summary.r95,
          p95Cross: observed("cross"),
          p95Along: observed("along"),
        },
        profile,
      )
    : null;
  const groups: AuditTrust["groups"] = {};
  for (const [name, rows] of Object.entries(summary.groups) as [string, GroupRow[] | undefined][]) {
    if (!rows) continue;
    groups[name] = rows.map((row) => ({ key: row.key, trust: groupRowTrust(row, profile) }));
  }
  return { all, groups };
}
