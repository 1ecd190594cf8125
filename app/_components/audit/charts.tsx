"use client";
import { useMemo } from "react";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto, ChartDataDto } from "@/lib/api-types";
import { ErrorScatter, type Ring } from "@/app/_components/charts/error-scatter";
import { CrossHistogram, RadialCumulative, RadialHistogram } from "@/app/_components/charts/error-histograms";
import { shareAtOrBelow } from "@/app/_components/charts/bins";
import { CHART } from "@/app/_components/charts/frame";
import { formatCount, formatMm, formatPct, formatSignedMm } from "./format";

const toMm = (a: readonly (number | null)[]) => a.map((v) => (v === null ? NaN : v * 1000));
// JSON turns a missing value (NaN) into null; those plants are left out of that chart.
const finiteMm = (a: readonly (number | null)[]) => toMm(a).filter(Number.isFinite);

/** The error charts of one audit, each with its key figures as a caption. */
export function AuditCharts({ audit }: { audit: AuditDto }) {
  const { data, error, isLoading } = useSWR<ChartDataDto>(keys.auditChartData(audit.id), fetcher, {
    revalidateOnFocus: false,
  });
  const s = audit.summary!;
  const profile = audit.profile;
  const mm = useMemo(
    () =>
      data
        ? {
            dE: toMm(data.dE),
            dN: toMm(data.dN),
            radial: toMm(data.radial),
            cross: data.cross ? finiteMm(data.cross) : null,
          }
        : null,
    [data],
  );

  const radialLimitMm = profile?.radialM != null ? profile.radialM * 1000 : null;
  const crossLimitMm = profile?.crossM != null ? profile.crossM * 1000 : null;

  const rings = useMemo<Ring[]>(() => {
    const r: Ring[] = [];
    if (radialLimitMm !== null)
      r.push({ id: "limit", label: "radial limit", radiusMm: radialLimitMm, colour: CHART.alarm, dash: "6 4" });
    if (s.cep50 !== null) r.push({ id: "cep", label: "CEP", radiusMm: s.cep50 * 1000, colour: CHART.ink });
    if (s.r95 !== null) r.push({ id: "r95", label: "R95", radiusMm: s.r95 * 1000, colour: CHART.stake, dash: "2 3" });
    return r;
  }, [radialLimitMm, s.cep50, s.r95]);

  if (error)
    return (
      <p role="alert" className="text-sm text-alarm">
        The chart data could not be loaded: {(error as Error).message}
      </p>
    );
  if (isLoading || !data || !mm)
    return (
      <p className="text-sm text-ink-faint" aria-busy="true">
        Loading charts…
      </p>
    );
  if (data.total === 0) return <p className="text-sm text-ink-faint">No pairs, so nothing to chart.</p>;

  const sample = data.sampled
    ? ` (drawn from an even subsample of ${formatCount(data.dE.length)} of ${formatCount(data.total)} pairs)`
    : "";
  const largest = mm.radial.reduce((m, v) => Math.max(m, v), 0);
  const outCount = data.within.filter((w) => w === false).length;
  const crossWithin = mm.cross && crossLimitMm !== null ? shareAtOrBelow(mm.cross.map(Math.abs), crossLimitMm) : null;

  return (
    <section aria-labelledby="charts-heading" data-testid="charts">
      <h2 id="charts-heading" className="mb-3 text-base font-semibold">
        Charts
      </h2>
      <div className="grid gap-4 lg:grid-cols-2">
        <ErrorScatter
          dE={mm.dE}
          dN={mm.dN}
          within={data.within}
          rings={rings}
          sampledFrom={data.sampled ? data.total : undefined}
          caption={
            <>
              Error of each plant, east against north (survey minus record), on equal scales{sample}. Bias{" "}
              {formatSignedMm(s.meanDE)} east, {formatSignedMm(s.meanDN)} north; half the plants lie within the CEP
              circle of {formatMm(s.cep50)}, 95 % within the R95 circle of {formatMm(s.r95)}
              {radialLimitMm !== null ? (
                <>
                  ; the radial limit circle is {formatMm(profile!.radialM)} and {formatCount(outCount)} plotted plants
                  are out of tolerance
                </>
              ) : null}
              .
            </>
          }
        />
        <RadialHistogram
          radialMm={mm.radial}
          limitMm={radialLimitMm}
          caption={
            <>
              How many plants have each size of radial error{sample}: CEP {formatMm(s.cep50)}, R95 {formatMm(s.r95)},
              largest {largest.toFixed(1)} mm
              {radialLimitMm !== null ? (
                <>
                  ; {formatPct(shareAtOrBelow(mm.radial, radialLimitMm))} of plants within the{" "}
                  {formatMm(profile!.radialM)} radial limit
                </>
              ) : null}
              .
            </>
          }
        />
        <RadialCumulative
          radialMm={mm.radial}
          limitMm={radialLimitMm}
          requiredShare={profile ? profile.requiredShare : null}
          caption={
            <>
              Share of plants within each radial error{sample}; the curve crosses 50 % at {formatMm(s.cep50)} and 95 %
              at {formatMm(s.r95)}
              {radialLimitMm !== null ? (
                <>
                  , and reaches {formatPct(shareAtOrBelow(mm.radial, radialLimitMm))} at the{" "}
                  {formatMm(profile!.radialM)} limit
                </>
              ) : null}
              {profile ? <>; the profile asks for {formatPct(profile.requiredShare, 0)}</> : null}.
            </>
          }
        />
        {mm.cross ? (
          <CrossHistogram
            crossMm={mm.cross}
            limitMm={crossLimitMm}
            caption={
              <>
                Cross-row errors (positive = right of the row direction){sample}: mean {formatSignedMm(s.meanCross)},
                RMSE {formatMm(s.rmseCross)}
                {crossLimitMm !== null && crossWithin !== null ? (
                  <>
                    ; {formatPct(crossWithin)} of plants within ±{formatMm(profile!.crossM)}
                  </>
                ) : null}
                .
              </>
            }
          />
        ) : (
          <p className="rounded-plot border border-chalk-line bg-white p-4 text-sm text-ink-faint">
            No row direction was known for this audit, so there is no cross-row chart.
          </p>
        )}
      </div>
    </section>
  );
}
