import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { chartData, getAuditById } from "@/db/queries/audits";
import { getDatasetById } from "@/db/queries/datasets";
import { checkpointSurveyPrecision } from "@/lib/server/audits/survey-precision";
import { getSignoff, userName } from "@/db/queries/review";
import { logActivity } from "@/db/queries/activity";
import { ROLE_LABEL, isRole } from "@/lib/roles";
import type { AuditSummary, DatasetDto } from "@/lib/api-types";
import { auditTrust } from "@/lib/audit/audit-trust";
import { Mark } from "@/app/_components/mark";
import { FieldTime, formatMm, TableScroll } from "@/app/_components/ui";
import { idFromParams } from "@/lib/validation/ids";
import { AccuracyStatementBlock } from "@/app/_components/audit/accuracy-statement";
import { ErrorScatterSvg } from "./error-scatter-svg";
import { PrintButton } from "./print-button";

export const metadata: Metadata = { title: "Sign-off report" };

// A4 with room for the page counter; the app's header and anything marked print:hidden stay off paper.
const PRINT_CSS = `
@page { size: A4; margin: 14mm 14mm 16mm 14mm; @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 8pt; color: #44524b; } }
@media print {
  html, body { background: #fff !important; }
  body > header, header:has(a[aria-label="Plotproof home"]) { display: none !important; }
  main { max-width: none !important; padding: 0 !important; }
  .report { font-size: 9.5pt; }
  .report section { break-inside: avoid; }
  .report table { page-break-inside: auto; }
  .report tr { break-inside: avoid; }
}`;

const GROUP_TITLE: Record<string, string> = {
  fix: "GNSS fix",
  arm: "Tool arm",
  bed: "Bed",
  crop: "Crop",
  day: "Planting day (local)",
};
const pct = (s: number | null | undefined) =>
  s === null || s === undefined || !Number.isFinite(s) ? "–" : `${(s * 100).toFixed(1)} %`;
const signedMm = (m: number | null | undefined) =>
  m === null || m === undefined || !Number.isFinite(m)
    ? "–"
    : `${m >= 0 ? "+" : "−"}${Math.abs(m * 1000).toFixed(1)} mm`;

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="mt-5" aria-label={title}>
      <h2 className="mb-1.5 border-b border-ink pb-0.5 text-sm font-semibold uppercase tracking-wide">{title}</h2>
      {children}
    </section>
  );
}

export default async function ReportPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  const db = await getDb();
  const audit = await getAuditById(db, { id: auditId, orgId: viewer.orgId });
  if (!audit) notFound();
  const [signoff, planted, survey, chart] = await Promise.all([
    getSignoff(db, { auditId, orgId: viewer.orgId }),
    audit.planted ? getDatasetById(db, { id: audit.planted.id, orgId: viewer.orgId }) : null,
    audit.survey ? getDatasetById(db, { id: audit.survey.id, orgId: viewer.orgId }) : null,
    audit.summary ? chartData(db, { auditId }) : null,
  ]);
  const uploaders = new Map<string, string>();
  for (const d of [planted, survey])
    if (d?.uploadedBy && !uploaders.has(d.uploadedBy))
      uploaders.set(d.uploadedBy, (await userName(db, { userId: d.uploadedBy }))?.name ?? "—");
  if (signoff)
    await logActivity(db, {
      orgId: viewer.orgId,
      actorId: viewer.userId,
      action: "report.opened",
      subjectType: "audit",
      subjectId: auditId,
      detail: { kind: "signoff" },
    });

  const s = audit.summary as AuditSummary | null;
  const { rmseH: surveyRmseH, source: surveySource } = await checkpointSurveyPrecision(db, {
    audit,
    orgId: viewer.orgId,
  });
  const p = audit.profile;
  const datasets = [planted, survey].filter((d): d is DatasetDto => !!d);
  const trust = s && p ? auditTrust(s, audit.verdict, p) : null;
  const groups = s
    ? (
        Object.entries(s.groups) as [string, NonNullable<AuditSummary["groups"][keyof AuditSummary["groups"]]>][]
      ).filter(([, rows]) => rows && rows.length > 1 && rows.length <= 12)
    : [];

  return (
    <article
      className="report mx-auto max-w-[190mm] bg-white p-3 text-ink sm:p-6 shadow-sm print:p-0 print:shadow-none"
      data-testid="signoff-report"
      data-signed={!!signoff}
    >
      <style>{PRINT_CSS}</style>
      <div className="mb-4 flex items-center justify-between gap-4 print:hidden">
        <Link href={`/audits/${auditId}/review`} className="text-sm font-medium text-leaf hover:underline">
          ← Back to the review
        </Link>
        <PrintButton />
      </div>

      <header className="flex items-start justify-between gap-4 border-b-2 border-ink pb-3">
        <div>
          <p className="text-xs uppercase tracking-wide text-ink-soft">{viewer.orgName} · Plotproof sign-off report</p>
          <h1 className="text-xl font-semibold leading-tight">
            {audit.title}
            {audit.revision > 1 ? <span className="font-normal"> · revision {audit.revision}</span> : null}
          </h1>
          <p className="text-sm">
            Field <strong>{audit.field.name}</strong> · CRS {audit.field.crs} · time zone {audit.field.timeZone}
          </p>
        </div>
        <Mark size={40} />
      </header>

      {signoff ? (
        <p
          className={`mt-3 rounded-plot border-l-4 p-2 text-sm ${signoff.deviation ? "border-stake bg-stake-pale" : "border-leaf bg-leaf-pale"}`}
          data-testid="report-status"
        >
          <strong>Signed off{signoff.deviation ? " with deviation" : ""}</strong> by {signoff.signerName} (
          {isRole(signoff.signerRole) ? ROLE_LABEL[signoff.signerRole] : signoff.signerRole}) on{" "}
          <FieldTime iso={signoff.signedAt} timeZone={audit.field.timeZone} /> · revision {signoff.revision}
        </p>
      ) : (
        <p
          className="mt-3 rounded-plot border-4 border-alarm p-2 text-center text-base font-bold uppercase tracking-wide text-alarm"
          data-testid="report-status"
        >
          Not signed off — draft for information only
        </p>
      )}

      <Section title="Inputs">
        <TableScroll label="Input files">
          {" "}
          <table className="w-full text-left text-xs [&_td]:pr-3 [&_th]:pr-3">
            <thead className="text-ink-soft">
              <tr>
                <th className="py-0.5 font-medium">File</th>
                <th className="font-medium">Kind</th>
                <th className="font-medium">Rows</th>
                <th className="font-medium">CRS</th>
                <th className="whitespace-nowrap font-medium">Uploaded</th>
              </tr>
            </thead>
            <tbody>
              {datasets.map((d) => (
                <tr key={d.id} className="border-t border-chalk-deep align-top">
                  <td className="py-1">
                    <span className="font-medium">{d.fileName}</span>
                    <br />
                    <span className="font-mono text-xs print:text-[9px] break-all" data-testid={`report-sha-${d.kind}`}>
                      SHA-256 {d.sha256}
                    </span>
                  </td>
                  <td>{d.kind === "planted" ? "as-planted records" : "survey"}</td>
                  <td className="tabular-nums">{d.rowCount}</td>
                  <td className="whitespace-nowrap">{d.crs}</td>
                  <td className="whitespace-nowrap">
                    <FieldTime iso={d.uploadedAt} timeZone={audit.field.timeZone} />
                    {d.uploadedBy ? (
                      <>
                        <br />
                        {uploaders.get(d.uploadedBy)}
                      </>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
        {audit.settings ? (
          <p className="mt-1 text-xs text-ink-soft">
            Pairing:{" "}
            {audit.settings.match === "auto"
              ? "plant id, then position"
              : audit.settings.match === "id"
                ? "plant id only"
                : "position only"}
            , at most {formatMm(audit.settings.maxDistanceM)} apart · work CRS {audit.settings.workCrs} · row bearing{" "}
            {s?.rowBearingDeg !== null && s?.rowBearingDeg !== undefined
              ? `${s.rowBearingDeg.toFixed(1)}° (${s.rowBearingSource})`
              : "none"}{" "}
            · computed {audit.computedAt ? <FieldTime iso={audit.computedAt} timeZone={audit.field.timeZone} /> : "–"}
          </p>
        ) : null}
      </Section>

      {p ? (
        <Section title="Tolerance profile">
          <p className="text-sm">
            <strong>{p.name}</strong> — {p.operation}
          </p>
          <p className="text-xs text-ink-soft">
            Limits (95 % of errors): radial {formatMm(p.radialM)}, cross-row {formatMm(p.crossM)}, along-row{" "}
            {formatMm(p.alongM)} · at least {pct(p.requiredShare)} of plants within every limit (one-sided lower bound
            at {Math.round(p.confidence * 100)} % confidence) · at least {p.minCheckpoints} checkpoints.
          </p>
        </Section>
      ) : null}

      {audit.verdict ? (
        <Section title={`Verdict: ${audit.verdict.passed ? "passed" : "failed"}`}>
          <table className="w-full text-left text-xs" data-testid="report-verdict">
            <tbody>
              {audit.verdict.criteria.map((c) => (
                <tr key={c.id} className="border-t border-chalk-deep">
                  <td className={`w-12 py-1 font-semibold ${c.passed ? "text-leaf" : "text-alarm"}`}>
                    {c.passed ? "Pass" : "Fail"}
                  </td>
                  <td>{c.text}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Section>
      ) : null}

      {s ? (
        <div className="grid grid-cols-1 gap-6 sm:grid-cols-[1fr_auto] print:grid-cols-[1fr_auto]">
          <Section title="Headline figures">
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-xs" data-testid="report-figures">
              <dt className="text-ink-soft">Pairs</dt>
              <dd>
                {s.pairs} ({s.pairedById} by id, {s.pairedByPosition} by position; {s.unmatchedPlanted} records and{" "}
                {s.unmatchedSurvey} survey points unpaired)
              </dd>
              <dt className="text-ink-soft">Bias east / north</dt>
              <dd>
                {signedMm(s.meanDE)} / {signedMm(s.meanDN)}
              </dd>
              <dt className="text-ink-soft">RMSE horizontal</dt>
              <dd>
                {formatMm(s.rmseR)} (east {formatMm(s.rmseE)}, north {formatMm(s.rmseN)})
              </dd>
              <dt className="text-ink-soft">RMSE cross / along row</dt>
              <dd>
                {formatMm(s.rmseCross)} / {formatMm(s.rmseAlong)}
              </dd>
              <dt className="text-ink-soft">CEP (50 %)</dt>
              <dd>{formatMm(s.cep50)}</dd>
              <dt className="text-ink-soft">95 % radius</dt>
              <dd>{formatMm(s.r95)}</dd>
              <dt className="text-ink-soft">NSSDA 95 %</dt>
              <dd>{formatMm(s.nssda95)}</dd>
              <dt className="text-ink-soft">Within tolerance</dt>
              <dd>
                {s.withinTolerance
                  ? `${pct(s.withinTolerance.share)} (${s.withinTolerance.within} of ${s.withinTolerance.n})${trust?.all ? `; decision bound: at least ${pct(trust.all.lowerBound)} at ${Math.round(s.withinTolerance.confidence * 100)} % confidence (one-sided) — ${trust.all.word}` : ""}; two-sided interval, a description: ${pct(s.withinTolerance.lower95)} – ${pct(s.withinTolerance.upper95)}`
                  : "no limits"}
              </dd>
              <dt className="text-ink-soft">Outliers flagged</dt>
              <dd>{s.outliers.count}</dd>
            </dl>
          </Section>
          <Section title="Accuracy statement">
            <AccuracyStatementBlock summary={s} compact surveyRmseH={surveyRmseH} surveySource={surveySource} />
          </Section>
          {chart ? (
            <Section title="Errors">
              <ErrorScatterSvg
                dE={chart.dE}
                dN={chart.dN}
                within={chart.within}
                toleranceMm={p?.radialM ? p.radialM * 1000 : null}
                r95Mm={s.r95 !== null ? s.r95 * 1000 : null}
              />
            </Section>
          ) : null}
        </div>
      ) : null}

      {groups.length ? (
        <Section title="Breakdown">
          <div className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2 print:grid-cols-2">
            {groups.map(([name, rows]) => (
              <table
                key={name}
                className="w-full text-left text-xs print:text-[10px]"
                data-testid={`report-group-${name}`}
              >
                <caption className="text-left text-xs font-semibold">{GROUP_TITLE[name] ?? name}</caption>
                <thead className="text-ink-soft">
                  <tr>
                    <th className="font-medium">Value</th>
                    <th className="font-medium">Pairs</th>
                    <th className="font-medium">RMSE</th>
                    <th className="font-medium">Cross</th>
                    <th className="font-medium">Along</th>
                    <th className="font-medium">95 %</th>
                    <th className="font-medium">Within</th>
                    <th className="font-medium">Against the profile</th>
                  </tr>
                </thead>
                <tbody>
                  {rows.map((g, i) => {
                    const t = trust?.groups[name]?.[i]?.trust ?? null;
                    return (
                      <tr
                        key={String(g.key)}
                        className={`border-t border-chalk-deep ${t?.word === "does not meet" ? "text-alarm" : ""}`}
                        data-word={t?.word ?? ""}
                      >
                        <td>{g.key ?? "(none)"}</td>
                        <td>{g.pairs}</td>
                        <td>{formatMm(g.rmseR)}</td>
                        <td>{formatMm(g.rmseCross)}</td>
                        <td>{formatMm(g.rmseAlong)}</td>
                        <td>{formatMm(g.r95)}</td>
                        <td>{pct(g.withinShare)}</td>
                        <td>{t ? `${t.word} (≥ ${pct(t.lowerBound)})` : "–"}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            ))}
          </div>
        </Section>
      ) : null}

      {signoff ? (
        <Section title="Sign-off">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-xs" data-testid="report-signoff">
            <dt className="text-ink-soft">Signed by</dt>
            <dd>
              {signoff.signerName}, {isRole(signoff.signerRole) ? ROLE_LABEL[signoff.signerRole] : signoff.signerRole} —
              typed name “{signoff.typedName}”
            </dd>
            <dt className="text-ink-soft">Signed at</dt>
            <dd>
              <FieldTime iso={signoff.signedAt} timeZone={audit.field.timeZone} />
            </dd>
            <dt className="text-ink-soft">Confirmed</dt>
            <dd>
              {signoff.checklist.checkpoints.pairs} checkpoints (at least {signoff.checklist.checkpoints.required}{" "}
              asked) · survey instrument {signoff.checklist.instrument.precisionMm} mm,{" "}
              {signoff.checklist.instrument.ratio}× finer than the tightest limit (
              {signoff.checklist.instrument.tightestLimitMm} mm) · control mark checked before the survey
              {signoff.checklist.controlMark.note ? ` (${signoff.checklist.controlMark.note})` : ""} · profile right
              for: {signoff.checklist.profileFits.operation}
            </dd>
            {signoff.comment ? (
              <>
                <dt className="text-ink-soft">{signoff.deviation ? "Deviation accepted" : "Comment"}</dt>
                <dd>“{signoff.comment}”</dd>
              </>
            ) : null}
            <dt className="text-ink-soft">SHA-256</dt>
            <dd className="font-mono text-xs print:text-[9px] break-all" data-testid="report-hash">
              {signoff.sha256}
            </dd>
          </dl>
          <p className="mt-1 text-xs print:text-[10px] text-ink-soft">
            The hash covers the raw files&apos; hashes, the pairing settings, the profile, the summary, the verdict, a
            digest of every per-plant residual and unpaired point, the stored CSV reports and this sign-off. Anyone in{" "}
            {viewer.orgName} can re-compute the audit from the raw files and check it on the audit&apos;s review page
            (Verify).
          </p>
        </Section>
      ) : null}

      <section
        className="mt-5 rounded-plot border-l-4 border-stake bg-stake-pale p-2 text-xs"
        aria-label="Scope of this report"
        data-testid="report-caution"
      >
        <p className="font-semibold">What this report certifies</p>
        <p>
          It certifies only how accurately the planting machine recorded where it put each plant, measured against the
          survey above. It does not certify that any machine is safe to operate: follow the maker&apos;s instructions
          and your lock-out procedure around autonomous machines. Boundary and legal surveys follow local codes and
          licensed practice.
        </p>
      </section>
      <p className="mt-3 text-xs print:text-[10px] text-ink-faint">
        Printed from Plotproof by {viewer.name} · audit {audit.id}
      </p>
    </article>
  );
}
