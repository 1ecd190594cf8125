/**
 * The version of the audit engine's rules, stored in every summary it writes (`engineVersion`), so that
 * computing an audit again can tell a changed file or record from a changed rule.
 * 1 — summaries without the key: the share within tolerance judged by the two-sided Clopper–Pearson bound.
 * 2 — one trust rule: the one-sided exact lower bound and three words (lib/audit/trust.ts).
 * Raise it whenever a change makes the same files give different results.
 */
export const ENGINE_VERSION = 2;

/** The engine version a stored summary was computed by (1 for summaries written before versions were kept). */
export function engineVersionOf(summary: unknown): number {
  const v = (summary as { engineVersion?: unknown } | null)?.engineVersion;
  return typeof v === "number" && Number.isInteger(v) && v > 0 ? v : 1;
}
