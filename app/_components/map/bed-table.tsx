import type { BedGuidance, BedState, BedStats } from "@/lib/map/types";
import { bedName } from "@/lib/map/guidance";
import { TableScroll } from "@/app/_components/ui";

const STATE_MARK: Record<BedState, { text: string; cls: string }> = {
  "relied-on": { text: "✓ meets — can be relied on", cls: "text-leaf" },
  "not-relied-on": { text: "✗ does not meet — do not rely on", cls: "text-alarm" },
  "not-shown": { text: "? not enough evidence yet", cls: "text-loam" },
  "no-checkpoints": { text: "– not checked", cls: "text-ink-faint" },
  "no-limits": { text: "– no limits", cls: "text-ink-faint" },
};

const mm = (m: number | null) => (m === null ? "–" : (m * 1000).toFixed(1));

/** Per-bed statistics with the one-line guidance of each bed. Works on the server and in the browser. */
export function BedTable({ beds, guidance, caption }: { beds: BedStats[]; guidance: BedGuidance[]; caption: string }) {
  if (beds.length === 0)
    return <p className="text-sm text-ink-faint">No checkpoints, so nothing to summarise per bed.</p>;
  const byBed = new Map(guidance.map((g) => [g.bed, g]));
  return (
    <div>
      <TableScroll label="Beds">
        <table className="w-full text-left text-sm" data-testid="bed-table">
          <caption className="sr-only">{caption}</caption>
          <thead className="text-ink-faint">
            <tr>
              <th className="py-1 font-medium">Bed</th>
              <th className="font-medium">Checkpoints</th>
              <th className="font-medium">Out of tolerance</th>
              <th className="font-medium">Mean radial mm</th>
              <th className="font-medium" title="95th percentile of the radial error">
                95 % radial mm
              </th>
              <th className="font-medium">Records</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-chalk-deep">
            {beds.map((s) => {
              const g = byBed.get(s.bed);
              const mark = g ? STATE_MARK[g.state] : null;
              return (
                <tr key={s.bed} data-testid="bed-row" data-bed={s.bed} data-state={g?.state} data-word={g?.word ?? ""}>
                  <td className="py-2 pr-2 font-medium">{bedName(s.bed).replace(/^Bed /, "")}</td>
                  <td>{s.n}</td>
                  <td className={s.out > 0 ? "text-alarm" : undefined}>
                    {s.known ? `${s.out} (${((s.out / s.known) * 100).toFixed(1)} %)` : "–"}
                  </td>
                  <td>{mm(s.meanRadial)}</td>
                  <td>{mm(s.p95Radial)}</td>
                  <td className={mark?.cls}>{mark?.text ?? "–"}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </TableScroll>
      <ul className="mt-3 grid gap-1 text-sm" data-testid="bed-guidance">
        {guidance.map((g) => (
          <li key={g.bed} data-bed={g.bed} data-state={g.state}>
            {g.line}
          </li>
        ))}
      </ul>
    </div>
  );
}
