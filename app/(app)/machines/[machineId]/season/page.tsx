import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { AppError } from "@/lib/errors";
import { machineSeason } from "@/lib/server/season";
import { idFromParams } from "@/lib/validation/ids";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { Empty, formatMm, PageTitle, Panel, TableScroll, TextLink } from "@/app/_components/ui";
import { SeasonCharts } from "@/app/(app)/fields/[fieldId]/season/season-charts";

export const metadata: Metadata = { title: "Machine season" };

const th = "px-2 py-1 text-left font-medium text-ink-soft";
const td = "px-2 py-1 tabular-nums";

export default async function MachineSeasonPage({ params }: { params: Promise<{ machineId: string }> }) {
  const viewer = await requirePageViewer();
  const id = idFromParams(await params, "machineId") ?? notFound();
  let season: Awaited<ReturnType<typeof machineSeason>>;
  try {
    season = await machineSeason(viewer, { id });
  } catch (err) {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  }
  const { machine, points } = season;
  return (
    <div className="space-y-6">
      <PageTitle
        sub={
          <>
            {machine.toolArms} tool arms · its audits on every field ·{" "}
            <TextLink href="/machines">all machines</TextLink>
          </>
        }
      >
        Season: {machine.name}
      </PageTitle>
      {points.length ? (
        <>
          <SeasonCharts points={points} />
          <Panel title="Audits of the season">
            <TableScroll label="Audits of the season">
              <table className="w-full text-sm" data-testid="season-table">
                <thead>
                  <tr>
                    <th className={th}>Planted</th>
                    <th className={th}>Field</th>
                    <th className={th}>Audit</th>
                    <th className={th}>State</th>
                    <th className={th}>Verdict</th>
                    <th className={th}>RMSE_r</th>
                    <th className={th}>Arms with an offset</th>
                  </tr>
                </thead>
                <tbody>
                  {points.map((p) => (
                    <tr key={p.auditId} className="border-t border-chalk-line">
                      <td className={td}>{p.day}</td>
                      <td className="px-2 py-1">{p.fieldName}</td>
                      <td className="px-2 py-1">
                        <TextLink href={`/audits/${p.auditId}/diagnostics`}>{p.title}</TextLink>
                      </td>
                      <td className="px-2 py-1">{STATE_NAME[p.state as keyof typeof STATE_NAME] ?? p.state}</td>
                      <td className="px-2 py-1">{p.passed === null ? "–" : p.passed ? "passed" : "failed"}</td>
                      <td className={td}>{formatMm(p.rmseR)}</td>
                      <td className="px-2 py-1">
                        {p.arms
                          .filter((a) => a.significant)
                          .map((a) => `arm ${a.arm ?? "–"} (${formatMm(a.cross)} cross)`)
                          .join(", ") || "none"}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
          </Panel>
        </>
      ) : (
        <Empty>No audit of this machine's as-planted records has results yet. Name the machine when you upload.</Empty>
      )}
    </div>
  );
}
