import type { AuditDto, AuditSummary } from "@/lib/api-types";
import type { GroupRow } from "@/lib/audit/types";
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

/** Why a group is out of the profile's limits; empty when it is within them (or there is no profile). */
export function groupProblems(g: GroupRow, profile: AuditDto["profile"]): string[] {
  if (!profile) return [];
  const out: string[] = [];
  if (profile.radialM !== null && g.r95 > profile.radialM) out.push(`R95 ${formatMm(g.r95)} over the ${formatMm(profile.radialM)} radial limit`);
  if (g.lower95 !== null && g.lower95 < profile.requiredShare) {
    out.push(`share within tolerance at least ${formatPct(g.lower95)}, the profile asks for ${formatPct(profile.requiredShare)}`);
  }
  return out;
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
      <h2 id="groups-heading" className="mb-1 text-base font-semibold">Breakdown</h2>
      <p className="mb-3 text-sm text-ink-soft">
        {audit.profile
          ? "A group is marked out of limit when its 95 % radius is over the profile's radial limit, or when its checkpoints cannot show the required share within tolerance (small groups often cannot)."
          : "No profile: groups are not marked."}
      </p>
      <div className="grid gap-4 lg:grid-cols-2">
        {names.map((name) => {
          const rows = summary.groups[name]!;
          const meta = GROUP_TITLE[name] ?? { title: `By ${name}`, key: name };
          return (
            <div key={name} className="overflow-x-auto rounded-plot border border-chalk-line bg-white p-4">
              <table className="w-full text-left text-sm tabular-nums" data-testid={`group-${name}`}>
                <caption className="mb-2 text-left font-semibold">{meta.title}</caption>
                <thead className="text-xs text-ink-faint">
                  <tr>
                    <th scope="col" className="py-1 pr-2 font-medium">{meta.key}</th>
                    <th scope="col" className="pr-2 text-right font-medium">Pairs</th>
                    <th scope="col" className="pr-2 text-right font-medium">Bias E / N</th>
                    <th scope="col" className="pr-2 text-right font-medium">RMSE</th>
                    {hasRowFrame ? <th scope="col" className="pr-2 text-right font-medium">Cross RMSE</th> : null}
                    <th scope="col" className="pr-2 text-right font-medium">R95</th>
                    <th scope="col" className="pr-2 text-right font-medium">Within (interval)</th>
                    <th scope="col" className="font-medium">Limit</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-chalk-deep">
                  {rows.map((g) => {
                    const problems = groupProblems(g, audit.profile);
                    const bad = problems.length > 0;
                    return (
                      <tr key={g.key ?? "(missing)"} className={bad ? "bg-alarm-pale/60" : undefined} data-group-key={g.key ?? ""} data-out={bad ? "true" : "false"}>
                        <th scope="row" className="py-1.5 pr-2 font-medium">{g.key ?? <span className="text-ink-faint">missing</span>}</th>
                        <td className="pr-2 text-right">{g.pairs}</td>
                        <td className="pr-2 text-right whitespace-nowrap">{formatSignedMm(g.meanDE).replace(" mm", "")} / {formatSignedMm(g.meanDN)}</td>
                        <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.rmseR)}</td>
                        {hasRowFrame ? <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.rmseCross)}</td> : null}
                        <td className="pr-2 text-right whitespace-nowrap">{formatMm(g.r95)}</td>
                        <td className="pr-2 text-right whitespace-nowrap">
                          {g.withinShare === null ? "–" : <>{formatPct(g.withinShare, 0)} <span className="text-xs text-ink-faint">({formatPct(g.lower95, 0)}–{formatPct(g.upper95, 0)})</span></>}
                        </td>
                        <td>
                          {audit.profile ? (
                            <>
                              <PassMark passed={!bad} passWord="OK" failWord="Out" />
                              {bad ? <span className="block max-w-56 text-xs text-alarm">{problems.join("; ")}</span> : null}
                            </>
                          ) : "–"}
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
