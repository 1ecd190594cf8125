import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { auditDiagnosticsFor } from "@/lib/server/audits/diagnostics";
import { idFromParams } from "@/lib/validation/ids";
import { AppError } from "@/lib/errors";
import type { Episode, MeanIntervalLike } from "./types";
import {
  Empty,
  FieldSafetyNote,
  formatMm,
  formatInZone,
  PageTitle,
  Panel,
  TableScroll,
  TextLink,
} from "@/app/_components/ui";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { PassChart } from "./pass-chart";
import { ClearancePanel } from "./clearance-panel";

export const metadata: Metadata = { title: "Diagnostics" };

const th = "px-2 py-1 text-left font-medium text-ink-soft";
const td = "px-2 py-1 tabular-nums";

function Interval({ mi }: { mi: MeanIntervalLike }) {
  if (mi.mean === null) return <>–</>;
  if (mi.lower === null || mi.upper === null) return <>{formatMm(mi.mean)}</>;
  return (
    <>
      {formatMm(mi.mean)}{" "}
      <span className="text-ink-faint">
        ({(mi.lower * 1000).toFixed(1)} to {(mi.upper * 1000).toFixed(1)})
      </span>
    </>
  );
}

function when(t: number | null, timeZone: string): string {
  return t === null ? "time unknown" : formatInZone(new Date(t).toISOString(), timeZone);
}

function EpisodeItem({ e, timeZone }: { e: Episode; timeZone: string }) {
  return (
    <li className="border-b border-chalk-line py-2 last:border-0" data-testid={`episode-${e.kind}`}>
      <p className="font-medium">
        {e.kind === "degraded-fix" ? `Degraded fix (${e.fixValues.join(", ")})` : "Jump in error"} ·{" "}
        {when(e.start, timeZone)} – {when(e.end, timeZone)}
      </p>
      <ul className="text-ink-soft">
        {e.parts.map((p, i) => (
          <li key={i}>
            Bed {p.bed ?? "–"}, row {p.row ?? "–"}
            {p.arm ? ` (arm ${p.arm})` : ""}: plants {p.firstPlantId ?? "?"} to {p.lastPlantId ?? "?"} ({p.count}{" "}
            {e.kind === "degraded-fix" ? "records" : "checkpoints"})
          </li>
        ))}
      </ul>
      <p className="text-ink-soft">
        {e.checkpoints} checkpoint{e.checkpoints === 1 ? "" : "s"} inside
        {e.meanRadial !== null ? `, mean error ${formatMm(e.meanRadial)}` : ""}
        {e.kind === "error-jump"
          ? e.duringDegradedFix
            ? " — explained by the degraded fix."
            : " — not explained by the fix: look for a mechanical cause."
          : "."}
      </p>
    </li>
  );
}

export default async function DiagnosticsPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  const id = idFromParams(await params, "auditId") ?? notFound();
  let view: Awaited<ReturnType<typeof auditDiagnosticsFor>>;
  try {
    view = await auditDiagnosticsFor(viewer, { id });
  } catch (err) {
    if (err instanceof AppError && err.code === "conflict")
      return (
        <div className="space-y-4">
          <PageTitle>Diagnostics</PageTitle>
          <Empty>{err.message}</Empty>
          <TextLink href={`/audits/${id}`}>Back to the audit</TextLink>
        </div>
      );
    throw err;
  }
  const { audit, diagnostics: d, previous, machine } = view;
  const tz = audit.field.timeZone;
  const h = d.headline;
  const pct = Math.round(d.confidence * 100);
  return (
    <div className="space-y-6">
      <PageTitle
        sub={
          <>
            {audit.field.name} · {STATE_NAME[audit.state as keyof typeof STATE_NAME] ?? audit.state} ·{" "}
            <TextLink href={`/audits/${audit.id}`}>back to the result</TextLink> ·{" "}
            <a
              className="font-medium text-leaf underline-offset-2 hover:underline"
              href={`/api/audits/${audit.id}/diagnostics.csv`}
              download
              data-testid="diagnostics-csv"
            >
              Download the diagnostics (CSV)
            </a>{" "}
            · <TextLink href={`/fields/${audit.field.id}/season`}>the field's season</TextLink>
            {machine ? (
              <>
                {" "}
                · <TextLink href={`/machines/${machine.id}/season`}>{machine.name}'s season</TextLink>
              </>
            ) : null}
          </>
        }
      >
        Diagnostics: {audit.title}
      </PageTitle>

      <Panel title="Headline">
        <p className="text-sm" data-testid="diagnostics-headline">
          {h.pairs} checkpoints, {h.degraded} planted with a degraded fix. Horizontal RMSE {formatMm(h.rmseR)} (RTK
          fixed only: {formatMm(h.rmseRFixed)}); mean along-row {formatMm(h.meanAlong)}, cross-row{" "}
          {formatMm(h.meanCross)}.
        </p>
      </Panel>

      <Panel title="Tool arms">
        <p className="mb-2 text-sm text-ink-soft">
          Means of RTK-fixed checkpoints with {pct} % Student t intervals (Student 1908); degraded-fix checkpoints are
          shown apart. Errors are survey minus record: cross-row positive to the right of the row direction.
        </p>
        <TableScroll label="Tool arms">
          <table className="w-full text-sm" data-testid="arm-table">
            <thead>
              <tr>
                <th className={th}>Arm</th>
                <th className={th}>Checkpoints</th>
                <th className={th}>Along-row</th>
                <th className={th}>Cross-row</th>
                <th className={th}>Degraded fix (along / cross)</th>
                <th className={th}>Finding</th>
              </tr>
            </thead>
            <tbody>
              {d.arms.map((a) => (
                <tr key={a.arm ?? "none"} className="border-t border-chalk-line" data-testid={`arm-${a.arm ?? "none"}`}>
                  <td className={td}>{a.arm ?? "–"}</td>
                  <td className={td}>{a.along.n}</td>
                  <td className={td}>
                    <Interval mi={a.along} />
                  </td>
                  <td className={td}>
                    <Interval mi={a.cross} />
                  </td>
                  <td className={td}>
                    {a.degraded.cross.n
                      ? `${a.degraded.cross.n}: ${formatMm(a.degraded.along.mean)} / ${formatMm(a.degraded.cross.mean)}`
                      : "none"}
                  </td>
                  <td className="px-2 py-1">{a.sentence}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      </Panel>

      <Panel title="Along the pass">
        <PassChart
          pass={d.pass}
          caption={`${d.pass.length} checkpoints in planting order; ${d.episodes.length} episode${d.episodes.length === 1 ? "" : "s"} found.`}
        />
        {d.episodes.length ? (
          <ul className="mt-3 text-sm" data-testid="episodes">
            {d.episodes.map((e, i) => (
              <EpisodeItem key={i} e={e} timeZone={tz} />
            ))}
          </ul>
        ) : (
          <Empty>No stretch of degraded fix and no jump in error along the pass.</Empty>
        )}
      </Panel>

      <Panel title="Beds and rows">
        <TableScroll label="Beds and rows">
          <table className="w-full text-sm" data-testid="bed-row-table">
            <thead>
              <tr>
                <th className={th}>Bed</th>
                <th className={th}>Row</th>
                <th className={th}>Checkpoints</th>
                <th className={th}>Degraded fix</th>
                <th className={th}>Mean along</th>
                <th className={th}>Mean cross</th>
                <th className={th}>RMSE_r</th>
              </tr>
            </thead>
            <tbody>
              {d.bedRow.map((c, i) => (
                <tr key={i} className="border-t border-chalk-line">
                  <td className={td}>{c.bed ?? "–"}</td>
                  <td className={td}>{c.row ?? "–"}</td>
                  <td className={td}>{c.pairs}</td>
                  <td className={td}>{c.degraded}</td>
                  <td className={td}>{formatMm(c.meanAlong)}</td>
                  <td className={td}>{formatMm(c.meanCross)}</td>
                  <td className={td}>{formatMm(c.rmseR)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      </Panel>

      <Panel title="Camera correction">
        {d.cameraGain.length ? (
          <TableScroll label="Camera correction">
            <table className="w-full text-sm" data-testid="camera-gain">
              <thead>
                <tr>
                  <th className={th}>Arm</th>
                  <th className={th}>Checkpoints</th>
                  <th className={th}>Raw GNSS RMSE_r</th>
                  <th className={th}>Corrected RMSE_r</th>
                  <th className={th}>Error removed</th>
                </tr>
              </thead>
              <tbody>
                {d.cameraGain.map((g, i) => (
                  <tr key={i} className="border-t border-chalk-line">
                    <td className={td}>{g.overall ? "all" : (g.arm ?? "–")}</td>
                    <td className={td}>{g.pairs}</td>
                    <td className={td}>{formatMm(g.rmseRaw)}</td>
                    <td className={td}>{formatMm(g.rmseCorrected)}</td>
                    <td className={td}>{g.gain === null ? "–" : `${Math.round(g.gain * 100)} %`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        ) : (
          <Empty>The as-planted records carry no raw GNSS position, so the correction cannot be judged.</Empty>
        )}
      </Panel>

      <Panel title="Shift, rotation and scale">
        {d.similarity ? (
          <div className="space-y-2 text-sm" data-testid="similarity">
            <p className="text-ink-soft">
              Least-squares similarity fit about the checkpoints' centre ({d.similarity.pairs} checkpoints, IOGP 373-7-2
              method 9621); each part tested with Student's t at {pct} %.
            </p>
            <ul className="list-disc pl-5">
              {d.similarity.causes.map((c) => (
                <li key={c.part} className={c.significant ? "font-medium text-alarm" : ""}>
                  {c.sentence}
                </li>
              ))}
            </ul>
            <p className="text-ink-faint tabular-nums">
              Shift {formatMm(d.similarity.shiftE.value)} E, {formatMm(d.similarity.shiftN.value)} N (±{" "}
              {formatMm(d.similarity.shiftE.se)}); rotation {d.similarity.rotationArcsec.value.toFixed(1)}″ ±{" "}
              {d.similarity.rotationArcsec.se.toFixed(1)}″; scale {d.similarity.scalePpm.value.toFixed(0)} ±{" "}
              {d.similarity.scalePpm.se.toFixed(0)} ppm.
            </p>
          </div>
        ) : (
          <Empty>Too few checkpoints for the fit.</Empty>
        )}
      </Panel>

      <Panel title={previous ? `Compared with “${previous.title}”` : "Compared with the previous audit"}>
        {previous ? (
          <div className="space-y-2 text-sm" data-testid="comparison">
            <p className="text-ink-soft" data-testid="comparison-basis">
              {previous.basis === "machine"
                ? `The previous audit of the same machine${machine ? ` (${machine.name})` : ""}, on ${previous.fieldName}.`
                : machine
                  ? `The field's previous audit: this is the first audit of ${machine.name} with results.`
                  : "The field's previous audit (the as-planted upload names no machine)."}
            </p>
            <p className="font-medium">{previous.comparison.sentence}</p>
            <TableScroll label="Comparison by arm">
              <table className="w-full">
                <thead>
                  <tr>
                    <th className={th}>Arm</th>
                    <th className={th}>Component</th>
                    <th className={th}>Before</th>
                    <th className={th}>Now</th>
                    <th className={th}>Mean changed (Welch p)</th>
                    <th className={th}>Spread ratio (F-test p)</th>
                  </tr>
                </thead>
                <tbody>
                  {previous.comparison.arms.map((c, i) => (
                    <tr key={i} className="border-t border-chalk-line">
                      <td className={td}>{c.arm ?? "–"}</td>
                      <td className={td}>{c.component}</td>
                      <td className={td}>{formatMm(c.before)}</td>
                      <td className={td}>{formatMm(c.after)}</td>
                      <td className={`${td} ${c.meanSignificant ? "font-medium text-alarm" : ""}`}>
                        {c.mean ? `${formatMm(c.mean.difference)} (p = ${c.mean.p.toPrecision(2)})` : "–"}
                      </td>
                      <td className={`${td} ${c.spreadSignificant ? "font-medium text-alarm" : ""}`}>
                        {c.spread ? `${c.spread.ratio.toFixed(2)} (p = ${c.spread.p.toPrecision(2)})` : "–"}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
            <p className="text-ink-faint">{previous.comparison.methods}</p>
            <TextLink href={`/audits/${previous.id}/diagnostics`}>Diagnostics of the previous audit</TextLink>
          </div>
        ) : (
          <Empty>
            {machine
              ? `This is the first audit with results of this field and of ${machine.name}.`
              : "This is the field's first audit with results."}
          </Empty>
        )}
      </Panel>

      <Panel title="Clearance for the next operation">
        <ClearancePanel pass={d.pass} confidence={d.confidence} />
        <div className="mt-3">
          <FieldSafetyNote />
        </div>
      </Panel>
      <p className="text-xs text-ink-faint">
        <Link href={`/audits/${audit.id}`}>Back to the result</Link>
      </p>
    </div>
  );
}
