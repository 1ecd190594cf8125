"use client";
import { useMemo } from "react";
import { Bar, BarChart, CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { ceilTo, cumulativeCurve, histogram, niceStep, niceTicks, percentileSorted, type Bin } from "./bins";
import { CHART, ChartFigure } from "./frame";

const TARGET_BINS = 24;

function limitLabel(value: string, position: "insideTopRight" | "insideBottomRight" = "insideTopRight") {
  return { value, position, fontSize: 12, fill: CHART.alarm };
}

function LimitSwatch({ colour = CHART.alarm, dash = "5 3" }: { colour?: string; dash?: string }) {
  return (
    <svg width="22" height="14" viewBox="0 0 22 14" aria-hidden="true">
      <line x1="1" y1="7" x2="21" y2="7" stroke={colour} strokeWidth="2" strokeDasharray={dash} />
    </svg>
  );
}
function BarSwatch({ colour }: { colour: string }) {
  return (
    <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
      <rect x="1" y="3" width="12" height="10" fill={colour} />
    </svg>
  );
}

function binLabel(b: Bin): string {
  const f = (v: number) => (Math.round(v * 100) / 100).toString();
  if (b.overflow) return `${f(b.from)} mm and more`;
  if (b.underflow) return `below ${f(b.to)} mm`;
  return `${f(b.from)}–${f(b.to)} mm`;
}

/** Histogram of radial errors (mm) with the radial limit marked. */
export function RadialHistogram({
  radialMm,
  limitMm,
  caption,
}: {
  radialMm: readonly number[];
  limitMm: number | null;
  caption: React.ReactNode;
}) {
  const { bins, max, step } = useMemo(() => {
    const sorted = [...radialMm].sort((a, b) => a - b);
    const reach = Math.max(percentileSorted(sorted, 0.99) || 0, limitMm ? limitMm * 1.2 : 0, 1);
    const step = niceStep(reach / TARGET_BINS);
    const max = ceilTo(reach, step);
    return { bins: histogram(radialMm, 0, max, step).map((b) => ({ ...b, label: binLabel(b) })), max, step };
  }, [radialMm, limitMm]);
  return (
    <ChartFigure
      caption={caption}
      testId="chart-radial-histogram"
      legend={[
        { label: `plants per ${step} mm of radial error`, swatch: <BarSwatch colour={CHART.bar} /> },
        ...(limitMm !== null ? [{ label: `radial limit ${limitMm.toFixed(1)} mm`, swatch: <LimitSwatch /> }] : []),
      ]}
      note={bins[bins.length - 1].overflow ? `The last bar also counts every plant beyond ${max} mm.` : undefined}
    >
      <BarChart
        responsive
        style={{ width: "100%", aspectRatio: 1.8 }}
        data={bins}
        margin={{ top: 16, right: 12, bottom: 8, left: 0 }}
        barCategoryGap={1}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={CHART.grid} vertical={false} />
        <XAxis
          type="number"
          dataKey="mid"
          domain={[0, max]}
          ticks={niceTicks(0, max)}
          tick={{ fontSize: 12 }}
          height={40}
          label={{ value: "radial error (mm)", position: "insideBottom", offset: 0, fontSize: 12 }}
        />
        <YAxis
          allowDecimals={false}
          tick={{ fontSize: 12 }}
          width={44}
          label={{ value: "plants", angle: -90, position: "insideLeft", offset: 10, fontSize: 12 }}
        />
        <Tooltip
          labelFormatter={(_, p) => (p?.[0]?.payload as { label?: string } | undefined)?.label ?? ""}
          formatter={(v) => [`${v} plants`, "count"]}
        />
        <Bar dataKey="count" fill={CHART.bar} isAnimationActive={false} />
        {limitMm !== null ? (
          <ReferenceLine
            x={limitMm}
            stroke={CHART.alarm}
            strokeWidth={2}
            strokeDasharray="5 3"
            label={limitLabel("limit")}
          />
        ) : null}
      </BarChart>
    </ChartFigure>
  );
}

/** Cumulative share of plants (0–100 %) within each radial error, with the limit and the required share marked. */
export function RadialCumulative({
  radialMm,
  limitMm,
  requiredShare,
  caption,
}: {
  radialMm: readonly number[];
  limitMm: number | null;
  requiredShare: number | null;
  caption: React.ReactNode;
}) {
  const { points, max } = useMemo(() => {
    const points = cumulativeCurve(radialMm);
    const sorted = [...radialMm].sort((a, b) => a - b);
    const reach = Math.max(percentileSorted(sorted, 0.995) || 0, limitMm ? limitMm * 1.2 : 0, 1);
    const max = ceilTo(reach, niceStep(reach / 6));
    return { points: points.filter((p) => p.x <= max), max };
  }, [radialMm, limitMm]);
  return (
    <ChartFigure
      caption={caption}
      testId="chart-radial-cumulative"
      legend={[
        { label: "share of plants within that radial error", swatch: <LimitSwatch colour={CHART.leaf} dash="" /> },
        ...(limitMm !== null ? [{ label: `radial limit ${limitMm.toFixed(1)} mm`, swatch: <LimitSwatch /> }] : []),
        ...(requiredShare !== null
          ? [
              {
                label: `required share ${(requiredShare * 100).toFixed(0)} %`,
                swatch: <LimitSwatch colour={CHART.stake} />,
              },
            ]
          : []),
      ]}
    >
      <LineChart
        responsive
        style={{ width: "100%", aspectRatio: 1.8 }}
        data={points}
        margin={{ top: 16, right: 12, bottom: 8, left: 0 }}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={CHART.grid} />
        <XAxis
          type="number"
          dataKey="x"
          domain={[0, max]}
          ticks={niceTicks(0, max)}
          allowDataOverflow
          tick={{ fontSize: 12 }}
          height={40}
          label={{ value: "radial error (mm)", position: "insideBottom", offset: 0, fontSize: 12 }}
        />
        <YAxis
          type="number"
          domain={[0, 100]}
          ticks={[0, 25, 50, 75, 100]}
          tick={{ fontSize: 12 }}
          width={44}
          label={{ value: "plants within (%)", angle: -90, position: "insideLeft", offset: 10, fontSize: 12 }}
        />
        <Tooltip
          labelFormatter={(v) => `${Number(v).toFixed(1)} mm`}
          formatter={(v) => [`${Number(v).toFixed(1)} %`, "plants within"]}
        />
        <Line
          type="stepAfter"
          dataKey="pct"
          stroke={CHART.leaf}
          strokeWidth={2}
          dot={false}
          isAnimationActive={false}
        />
        {limitMm !== null ? (
          <ReferenceLine
            x={limitMm}
            stroke={CHART.alarm}
            strokeWidth={2}
            strokeDasharray="5 3"
            label={limitLabel("limit", "insideBottomRight")}
          />
        ) : null}
        {requiredShare !== null ? (
          <ReferenceLine y={requiredShare * 100} stroke={CHART.stake} strokeWidth={2} strokeDasharray="5 3" />
        ) : null}
      </LineChart>
    </ChartFigure>
  );
}

/** Histogram of cross-row errors (mm; positive = right of the row direction) with ± the cross-row limit. */
export function CrossHistogram({
  crossMm,
  limitMm,
  caption,
}: {
  crossMm: readonly number[];
  limitMm: number | null;
  caption: React.ReactNode;
}) {
  const { bins, half, step } = useMemo(() => {
    const abs = crossMm.map(Math.abs).sort((a, b) => a - b);
    const reach = Math.max(percentileSorted(abs, 0.99) || 0, limitMm ? limitMm * 1.2 : 0, 1);
    const step = niceStep((2 * reach) / TARGET_BINS);
    const half = ceilTo(reach, step);
    return { bins: histogram(crossMm, -half, half, step).map((b) => ({ ...b, label: binLabel(b) })), half, step };
  }, [crossMm, limitMm]);
  const edgeNote =
    bins[0].underflow || bins[bins.length - 1].overflow
      ? `The outer bars also count every plant beyond ±${half} mm.`
      : undefined;
  return (
    <ChartFigure
      caption={caption}
      testId="chart-cross-histogram"
      note={edgeNote}
      legend={[
        { label: `plants per ${step} mm of cross-row error`, swatch: <BarSwatch colour={CHART.loam} /> },
        ...(limitMm !== null ? [{ label: `cross-row limit ±${limitMm.toFixed(1)} mm`, swatch: <LimitSwatch /> }] : []),
      ]}
    >
      <BarChart
        responsive
        style={{ width: "100%", aspectRatio: 1.8 }}
        data={bins}
        margin={{ top: 16, right: 12, bottom: 8, left: 0 }}
        barCategoryGap={1}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={CHART.grid} vertical={false} />
        <XAxis
          type="number"
          dataKey="mid"
          domain={[-half, half]}
          ticks={niceTicks(-half, half)}
          tick={{ fontSize: 12 }}
          height={40}
          label={{
            value: "cross-row error (mm, + = right of row direction)",
            position: "insideBottom",
            offset: 0,
            fontSize: 12,
          }}
        />
        <YAxis
          allowDecimals={false}
          tick={{ fontSize: 12 }}
          width={44}
          label={{ value: "plants", angle: -90, position: "insideLeft", offset: 10, fontSize: 12 }}
        />
        <Tooltip
          labelFormatter={(_, p) => (p?.[0]?.payload as { label?: string } | undefined)?.label ?? ""}
          formatter={(v) => [`${v} plants`, "count"]}
        />
        <Bar dataKey="count" fill={CHART.loam} fillOpacity={0.8} isAnimationActive={false} />
        <ReferenceLine x={0} stroke={CHART.axis} />
        {limitMm !== null ? (
          <ReferenceLine
            x={-limitMm}
            stroke={CHART.alarm}
            strokeWidth={2}
            strokeDasharray="5 3"
            label={limitLabel("−limit")}
          />
        ) : null}
        {limitMm !== null ? (
          <ReferenceLine
            x={limitMm}
            stroke={CHART.alarm}
            strokeWidth={2}
            strokeDasharray="5 3"
            label={limitLabel("+limit")}
          />
        ) : null}
      </BarChart>
    </ChartFigure>
  );
}
