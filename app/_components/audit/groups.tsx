import type { AuditDto, AuditSummary } from "@/lib/api-types";
import type { GroupRow } from "@/lib/audit/types";
import { groupRowTrust } from "@/lib/audit/groups";
import type { TrustWord } from "@/lib/audit/trust";
import { PassMark } from "./pass-mark";
import { formatMm, formatPct, formatSignedMm } from "./format";

type GroupName = keyof AuditSummary["groups"];

const GROUP_TITLE: Partial<Record<GroupName, { title: string; key: string }>> = {
  arm: { title: "By tool arm", key: "Arm" },
  crop: { title: "By crop", key: "Crop" },
  bed: { title: "By bed", key: "Bed" },
  row: { title: "By row", key: "Row" },
  fix: { title: "By GNSS fix", key: "Fix" },
  day: { title: "By planting day (field's local date)", key: "Day" },
  method: { title: "By planting method", key: "Method" },
  cell: { title: "By cell", key: "Cell" },
};
const ORDER: GroupName[] = ["arm", "crop", "bed", "fix", "day", "row", "method", "cell"];

export interface GroupJudgement {
  /** "out": does not meet; "unproven": not enough evidence yet; "ok": meets (lib/audit/trust.ts). */
  status: "ok" | "out" | "unproven";
  word: TrustWord;
  /** The one-sided decision bound of the group's share within tolerance. */
  lowerBound: number | null;
  reasons: string[];
}

const STATUS_OF_WORD: Record<TrustWord, GroupJudgement["status"]> = {
  meets: "ok",
  "does not meet": "out",
  "not enough evidence yet": "unproven",
};
const LIMIT_WORDS = { radial: "radial", cross: "cross-row", along: "along-row" } as const;

/** How a group stands against the profile: the one trust rule (lib/audit/trust.ts) applied to the group. */
export function judgeGroup(g: GroupRow, profile: AuditDto["profile"]): GroupJudgement | null {
  if (!profile) return null;
  const t = groupRowTrust(g, profile);
  if (!t) return null;
  const reasons: string[] = [];
  for (const e of t.exceeded)
    reasons.push(
      `95 % of ${LIMIT_WORDS[e.limit]} errors within ${formatMm(e.p95)}, over the ${formatMm(e.limitM)} limit`,
    );
  if (t.share !== null && t.share < t.requiredShare)
    reasons.push(`${formatPct(t.share)} within tolerance, the profile asks for ${formatPct(t.requiredShare)}`);
  if (t.word === "not enough evidence yet")
    reasons.push(
      `${g.pairs} checkpoints show only at least ${formatPct(t.lowerBound)} within tolerance (one-sided, ${Math.round(t.confidence * 100)} %); the profile asks for ${formatPct(t.requiredShare)}${t.moreNeeded !== null ? ` — ${t.moreNeeded} more, all within, would settle it` : ""}`,
    );
  return { status: STATUS_OF_WORD[t.word], word: t.word, lowerBound: t.lowerBound, reasons };
}

/** Breakdown tables, one per grouping in the summary, with groups out of limit marked. */
export function BreakdownTables({ audit }: { audit: AuditDto }) {
  const summary = audit.summary!;
  const names = ORDER.filter((n) => summary.groups[n]?.length).concat(
    (Object.keys(summary.groups) as GroupName[]).filter((n) => !ORDER.includes(n) && summary.groups[n]?.length),
  );
  if (names.length === 0) return null;
  const hasRowFrame = summary.rowBearingDeg !== null;
  return (
    <section aria-labelledby="groups-heading" data-testid="breakdowns">
      <h2 id="groups-heading" className="mb-1 text-base font-semibold">
        Breakdown
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        {audit.profile
          ? "Each group is judged by the same rule as the verdict. Does not meet: a 95 % error figure is over its limit, or fewer of its plants than required are within tolerance. Not enough evidence yet: the plants look within tolerance, but the group has too few checkpoints to show the required share with the profile's confidence (one-sided bound). The interval in brackets is the two-sided interval, a description only."
          : "No profile: groups are not marked."}
      </p>
      <div className="grid gap-4">
        {names.map((name) => {
          const rows = summary.groups[name]!;
          const meta = GROUP_TITLE[name] ?? { title: `By ${name}`, key: name };
          return (
            <div
              key={name}
              className="relative overflow-x-auto rounded-plot border border-chalk-line bg-white p-4"
              role="region"
              aria-label={meta.title}
              // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard
              tabIndex={0}
            >
              <table className="w-full text-left text-sm tabular-nums" data-testid={`group-${name}`}>
                <caption className="mb-2 text-left font-semibold">{meta.title}</caption>
                <thead className="text-xs text-ink-faint">
                  <tr>
                    <th scope="col" className="py-1 pr-2 font-medium">
                      {meta.key}
                    </th>
                    <th scope="col" className="pr-2 text-right font-medium">
                      Pairs
                    </th>
                    <th scope="col" className="pr-2 text-right font-medium">
                      Bias E / N
                    </th>
                    <th scope="col" className="pr-2 text-right font-medium">
                      RMSE
                    </th>
                    {hasRowFrame ? (
                      <th scope="col" className="pr-2 text-right font-medium">
                        Cross RMSE
                      </th>
                    ) : null}
                    <th scope="col" className="pr-2 text-right font-medium">
                      R95
                    </th>
                    <th scope="col" className="pr-2 text-right font-medium">
                      Within · decision bound (two-sided interval)
                    </th>
                    <th scope="col" className="font-medium">
                      Against the profile
                    </th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-chalk-deep">
                  {rows.map((g) => {
                    const j = judgeGroup(g, audit.profile);
                    return (
                      <tr
                        key={g.key ?? "(missing)"}
                        className={j?.status === "out" ? "bg-alarm-pale/60" : undefined}
                        data-group-key={g.key ?? ""}
                        data-out={j?.status === "out" ? "true" : "false"}
                        data-status={j?.status ?? "none"}
                        data-word={j?.word ?? ""}
                      >
                        <th scope="row" className="py-1.5 pr-2 font-medium whitespace-nowrap">
                          {g.key ?? <span className="text-ink-faint">missing</span>}
                        </th>
                        <td className="pr-2 text-right">{g.pairs}</td>
                        <td className="pr-2 text-right whitespace-nowrap">
                          {formatSignedMm(g.meanDE).replace(" mm", "")} / {formatSignedMm(g.meanDN)}
                        </td>
                        <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.rmseR)}</td>
                        {hasRowFrame ? (
                          <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.rmseCross)}</td>
                        ) : null}
                        <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.r95)}</td>
                        <td className="pr-2 text-right whitespace-nowrap">
                          {g.withinShare === null ? (
                            "–"
                          ) : (
                            <>
                              {formatPct(g.withinShare, 0)}
                              {j ? <> · ≥ {formatPct(j.lowerBound, 1)}</> : null}{" "}
                              <span className="text-xs text-ink-faint">
                                ({formatPct(g.lower95, 0)}–{formatPct(g.upper95, 0)})
                              </span>
                            </>
                          )}
                        </td>
                        <td className="min-w-64 py-1.5">
                          {!j ? (
                            "–"
                          ) : j.status === "unproven" ? (
                            <span className="inline-flex items-center gap-1.5 text-sm font-semibold text-loam">
                              <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
                                <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
                                <path
                                  d="M8 4.5v4.2M8 11.2v.3"
                                  stroke="currentColor"
                                  strokeWidth="1.8"
                                  strokeLinecap="round"
                                />
                              </svg>
                              Not enough evidence yet
                            </span>
                          ) : (
                            <PassMark passed={j.status === "ok"} passWord="Meets" failWord="Does not meet" />
                          )}
                          {j?.reasons.length ? (
                            <span className={`block text-xs ${j.status === "out" ? "text-alarm" : "text-ink-soft"}`}>
                              {j.reasons.join("; ")}
                            </span>
                          ) : null}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          );
        })}
      </div>
    </section>
  );
}
