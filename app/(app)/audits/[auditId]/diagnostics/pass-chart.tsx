"use client";
import { CartesianGrid, Legend, ReferenceLine, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from "recharts";
import type { PassPoint } from "@/lib/audit/diagnostics";
import { CHART, ChartFigure } from "@/app/_components/charts/frame";

/** Along- and cross-row errors of the checkpoints in planting order; degraded-fix plants drawn as crosses. */
export function PassChart({ pass, caption }: { pass: PassPoint[]; caption: string }) {
  const cross = pass.map((p, i) => ({ x: i + 1, y: p.cross === null ? null : p.cross * 1000, degraded: p.degraded }));
  const along = pass.map((p, i) => ({ x: i + 1, y: p.along === null ? null : p.along * 1000, degraded: p.degraded }));
  const fixed = (d: typeof cross) => d.filter((p) => p.y !== null && !p.degraded);
  const degraded = (d: typeof cross) => d.filter((p) => p.y !== null && p.degraded);
  return (
    <ChartFigure caption={caption} testId="chart-pass">
      <ScatterChart
        responsive
        style={{ width: "100%", height: 300 }}
        margin={{ top: 8, right: 12, bottom: 8, left: 8 }}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={CHART.grid} />
        <XAxis
          type="number"
          dataKey="x"
          name="checkpoint"
          domain={[1, Math.max(1, pass.length)]}
          label={{ value: "checkpoint in planting order", position: "insideBottom", offset: -4, fontSize: 12 }}
          tick={{ fontSize: 12 }}
        />
        <YAxis
          type="number"
          dataKey="y"
          name="error"
          label={{ value: "error (mm)", angle: -90, position: "insideLeft", fontSize: 12 }}
          tick={{ fontSize: 12 }}
        />
        <ReferenceLine y={0} stroke={CHART.axis} />
        <Tooltip cursor={false} formatter={(v) => `${Number(v).toFixed(1)}`} />
        <Legend verticalAlign="top" height={24} />
        <Scatter
          name="cross-row, RTK fixed"
          data={fixed(cross)}
          fill={CHART.leaf}
          shape="circle"
          isAnimationActive={false}
        />
        <Scatter
          name="along-row, RTK fixed"
          data={fixed(along)}
          fill={CHART.loam}
          shape="triangle"
          isAnimationActive={false}
        />
        <Scatter
          name="cross-row, degraded fix"
          data={degraded(cross)}
          fill={CHART.alarm}
          shape="cross"
          isAnimationActive={false}
        />
        <Scatter
          name="along-row, degraded fix"
          data={degraded(along)}
          fill={CHART.stake}
          shape="cross"
          isAnimationActive={false}
        />
      </ScatterChart>
    </ChartFigure>
  );
}
