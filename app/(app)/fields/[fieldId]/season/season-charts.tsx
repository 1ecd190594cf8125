"use client";
import { CartesianGrid, Legend, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from "recharts";
import type { SeasonPoint } from "@/lib/season-types";
import { CHART, ChartFigure } from "@/app/_components/charts/frame";

const ARM_COLOURS = [CHART.leaf, CHART.loam, CHART.alarm, CHART.stake, CHART.soft, CHART.ink];
const dayMs = (day: string) => Date.parse(`${day}T12:00:00Z`);
const dayLabel = (ms: number) =>
  new Date(ms).toLocaleDateString("en-GB", { day: "numeric", month: "short", timeZone: "UTC" });

type Dot = { x: number; y: number; signed: boolean; title: string };

/** A dot: filled for a signed-off audit, hollow for the others. */
function DotShape(colour: string) {
  return (props: { cx?: number; cy?: number; payload?: Dot }) => {
    const { cx = 0, cy = 0, payload } = props;
    return (
      <circle
        cx={cx}
        cy={cy}
        r={5}
        fill={payload?.signed ? colour : "#ffffff"}
        stroke={colour}
        strokeWidth={2}
        data-signed={payload?.signed ? "yes" : "no"}
      />
    );
  };
}

function Frame({ children }: { children: React.ReactNode }) {
  return (
    <ScatterChart
      responsive
      style={{ width: "100%", height: 280 }}
      margin={{ top: 8, right: 12, bottom: 8, left: 8 }}
      accessibilityLayer={false}
    >
      {children}
    </ScatterChart>
  );
}

export function SeasonCharts({ points }: { points: SeasonPoint[] }) {
  const xs = points.map((p) => dayMs(p.day));
  const domain = [Math.min(...xs) - 5 * 86_400_000, Math.max(...xs) + 5 * 86_400_000];
  const headline: Dot[] = points
    .filter((p) => p.rmseR !== null)
    .map((p) => ({ x: dayMs(p.day), y: p.rmseR! * 1000, signed: p.signed, title: p.title }));
  const arms = [...new Set(points.flatMap((p) => p.arms.map((a) => a.arm)))];
  const x = (
    <XAxis
      type="number"
      dataKey="x"
      domain={domain}
      scale="time"
      tickFormatter={dayLabel}
      tick={{ fontSize: 12 }}
      label={{ value: "planting day", position: "insideBottom", offset: -4, fontSize: 12 }}
    />
  );
  const legendNote = "Filled: signed off; hollow: not (yet) signed off.";
  return (
    <div className="space-y-4">
      <ChartFigure
        caption={`Horizontal RMSE of ${headline.length} audits over the season. ${legendNote}`}
        testId="season-headline"
      >
        <Frame>
          <CartesianGrid stroke={CHART.grid} />
          {x}
          <YAxis
            type="number"
            dataKey="y"
            tick={{ fontSize: 12 }}
            label={{ value: "RMSE_r (mm)", angle: -90, position: "insideLeft", fontSize: 12 }}
          />
          <Tooltip formatter={(v) => `${Number(v).toFixed(1)}`} labelFormatter={() => ""} />
          <Scatter
            name="horizontal RMSE"
            data={headline}
            line={{ stroke: CHART.leaf }}
            shape={DotShape(CHART.leaf)}
            isAnimationActive={false}
          />
        </Frame>
      </ChartFigure>
      <ChartFigure
        caption={`Mean cross-row error of each tool arm (RTK-fixed checkpoints). ${legendNote}`}
        testId="season-arms"
      >
        <Frame>
          <CartesianGrid stroke={CHART.grid} />
          {x}
          <YAxis
            type="number"
            dataKey="y"
            tick={{ fontSize: 12 }}
            label={{ value: "cross-row (mm)", angle: -90, position: "insideLeft", fontSize: 12 }}
          />
          <Tooltip formatter={(v) => `${Number(v).toFixed(1)}`} labelFormatter={() => ""} />
          <Legend verticalAlign="top" height={24} />
          {arms.map((arm, i) => {
            const colour = ARM_COLOURS[i % ARM_COLOURS.length];
            const data: Dot[] = points.flatMap((p) => {
              const a = p.arms.find((q) => q.arm === arm);
              return a && a.cross !== null
                ? [{ x: dayMs(p.day), y: a.cross * 1000, signed: p.signed, title: p.title }]
                : [];
            });
            return (
              <Scatter
                key={arm ?? "none"}
                name={`arm ${arm ?? "–"}`}
                data={data}
                line={{ stroke: colour }}
                fill={colour}
                shape={DotShape(colour)}
                isAnimationActive={false}
              />
            );
          })}
        </Frame>
      </ChartFigure>
    </div>
  );
}
