import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { fieldSeason } from "@/lib/server/season";
import { idFromParams } from "@/lib/validation/ids";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { Empty, formatMm, PageTitle, Panel, TableScroll, TextLink } from "@/app/_components/ui";
import { SeasonCharts } from "./season-charts";

export const metadata: Metadata = { title: "Season" };

const th = "px-2 py-1 text-left font-medium text-ink-soft";
const td = "px-2 py-1 tabular-nums";

export default async function SeasonPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer();
  // The layout has already answered 404 for a malformed id or another organisation's field.
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const { field, points } = await fieldSeason(viewer, { fieldId });
  return (
    <div className="space-y-6">
      <PageTitle sub={<TextLink href={`/fields/${field.id}`}>back to the field</TextLink>}>
        Season: {field.name}
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
        <Empty>No audit of this field has results yet.</Empty>
      )}
    </div>
  );
}
