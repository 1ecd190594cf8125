"use client";
import { useMemo } from "react";
import {
  CartesianGrid,
  ReferenceLine,
  Scatter,
  ScatterChart,
  Tooltip,
  XAxis,
  YAxis,
  useXAxisScale,
  useYAxisScale,
} from "recharts";
import { ceilTo, niceStep, percentileSorted } from "./bins";
import { CHART, ChartFigure } from "./frame";

/** A reference circle around the origin. Radius in millimetres. */
export interface Ring {
  id: string;
  label: string;
  radiusMm: number;
  colour: string;
  dash?: string;
}

type Point = { x: number; y: number };

/** Above this many points the scatter draws an even subsample (the figures below it always use every pair). */
const MAX_DRAWN = 4000;

/** Errors dE/dN in mm on equal axes, with circles for the tolerance, CEP and R95. */
export function ErrorScatter({
  dE,
  dN,
  within,
  rings,
  caption,
  sampledFrom,
}: {
  /** Millimetres. */
  dE: readonly number[];
  dN: readonly number[];
  within: readonly (boolean | null)[];
  rings: Ring[];
  caption: React.ReactNode;
  /** Total number of pairs when the data is a subsample. */
  sampledFrom?: number;
}) {
  const { inside, outside, untested, half, step, hidden, drawn } = useMemo(() => {
    const n = dE.length;
    const stride = Math.max(1, Math.ceil(n / MAX_DRAWN));
    const inside: Point[] = [],
      outside: Point[] = [],
      untested: Point[] = [];
    const radii: number[] = [];
    for (let i = 0; i < n; i++) radii.push(Math.hypot(dE[i], dN[i]));
    radii.sort((a, b) => a - b);
    // Frame the bulk of the errors and every circle; a few far outliers may fall outside and are counted.
    const reach = Math.max(percentileSorted(radii, 0.99) || 0, ...rings.map((r) => r.radiusMm), 1) * 1.15;
    const step = niceStep(reach / 4);
    const half = ceilTo(reach, step);
    let hidden = 0,
      drawn = 0;
    for (let i = 0; i < n; i++) {
      if (Math.abs(dE[i]) > half || Math.abs(dN[i]) > half) hidden++;
      if (i % stride !== 0) continue;
      drawn++;
      const p = { x: dE[i], y: dN[i] };
      if (within[i] === true) inside.push(p);
      else if (within[i] === false) outside.push(p);
      else untested.push(p);
    }
    return { inside, outside, untested, half, step, hidden, drawn };
  }, [dE, dN, within, rings]);

  const ticks = useMemo(() => {
    const t: number[] = [];
    for (let v = -half; v <= half + 1e-9; v += step) t.push(Math.round(v * 1000) / 1000);
    return t;
  }, [half, step]);

  // Equal scales: a square chart with the same axis size on both sides gives a square plot area.
  const size = 420,
    axis = 44,
    pad = 12;
  return (
    <ChartFigure
      caption={caption}
      testId="chart-scatter"
      note={
        hidden > 0 || sampledFrom || drawn < dE.length ? (
          <>
            {hidden > 0
              ? `${hidden} plant${hidden === 1 ? " lies" : "s lie"} beyond ±${half} mm and ${hidden === 1 ? "is" : "are"} not drawn. `
              : ""}
            {sampledFrom
              ? `Drawn: ${drawn} of ${sampledFrom} pairs (an even subsample).`
              : drawn < dE.length
                ? `Drawn: ${drawn} of ${dE.length} pairs (an even subsample).`
                : ""}
          </>
        ) : null
      }
      legend={[
        { label: "plant within tolerance", swatch: <Swatch shape="circle" colour={CHART.leaf} /> },
        { label: "plant out of tolerance", swatch: <Swatch shape="cross" colour={CHART.alarm} /> },
        ...(untested.length
          ? [{ label: "plant (no tolerance set)", swatch: <Swatch shape="circle" colour={CHART.ink} /> }]
          : []),
        ...rings.map((r) => ({ label: `${r.label} ${r.radiusMm.toFixed(1)} mm`, swatch: <RingSwatch ring={r} /> })),
      ]}
    >
      <div style={{ width: "100%", maxWidth: size }}>
        <ScatterChart
          responsive
          style={{ width: "100%", aspectRatio: 1 }}
          margin={{ top: pad, right: pad, bottom: pad, left: pad }}
          accessibilityLayer={false}
        >
          <CartesianGrid stroke={CHART.grid} />
          <XAxis
            type="number"
            dataKey="x"
            name="dE"
            domain={[-half, half]}
            ticks={ticks}
            allowDataOverflow
            height={axis}
            label={{ value: "dE, east (mm)", position: "insideBottom", offset: 0, fontSize: 12 }}
            tick={{ fontSize: 12 }}
          />
          <YAxis
            type="number"
            dataKey="y"
            name="dN"
            domain={[-half, half]}
            ticks={ticks}
            allowDataOverflow
            width={axis}
            label={{ value: "dN, north (mm)", angle: -90, position: "insideLeft", offset: 4, fontSize: 12 }}
            tick={{ fontSize: 12 }}
          />
          <ReferenceLine x={0} stroke={CHART.axis} />
          <ReferenceLine y={0} stroke={CHART.axis} />
          <RingLayer rings={rings} />
          <Tooltip cursor={false} formatter={(v) => `${Number(v).toFixed(1)} mm`} />
          {untested.length ? (
            <Scatter name="plant" data={untested} fill={CHART.ink} shape="circle" isAnimationActive={false} />
          ) : null}
          <Scatter
            name="within tolerance"
            data={inside}
            fill={CHART.leaf}
            fillOpacity={0.7}
            shape="circle"
            isAnimationActive={false}
          />
          <Scatter name="out of tolerance" data={outside} fill={CHART.alarm} shape="cross" isAnimationActive={false} />
        </ScatterChart>
      </div>
    </ChartFigure>
  );
}

const LABEL_ANGLES = [Math.PI / 4, -Math.PI / 6, (5 * Math.PI) / 6];

function RingLayer({ rings }: { rings: Ring[] }) {
  const xs = useXAxisScale();
  const ys = useYAxisScale();
  if (!xs || !ys) return null;
  const cx = xs(0),
    cy = ys(0);
  if (cx === undefined || cy === undefined) return null;
  return (
    // biome-ignore lint/a11y/noAriaHiddenOnFocusable: an SVG group is not focusable; the rings repeat figures the table gives.
    <g aria-hidden="true">
      {rings.map((r, i) => {
        const ex = xs(r.radiusMm),
          ey = ys(r.radiusMm);
        if (ex === undefined || ey === undefined) return null;
        const rx = Math.abs(ex - cx),
          ry = Math.abs(ey - cy);
        // Each ring's label sits at its own angle so small, close rings stay readable.
        const a = LABEL_ANGLES[i % LABEL_ANGLES.length];
        const lx = cx + rx * Math.cos(a),
          ly = cy - ry * Math.sin(a);
        return (
          <g key={r.id} data-ring={r.id}>
            <ellipse
              cx={cx}
              cy={cy}
              rx={rx}
              ry={ry}
              fill="none"
              stroke={r.colour}
              strokeWidth={1.6}
              strokeDasharray={r.dash}
            />
            <text
              x={lx + (Math.cos(a) >= 0 ? 3 : -3)}
              y={ly + (Math.sin(a) >= 0 ? -3 : 11)}
              textAnchor={Math.cos(a) >= 0 ? "start" : "end"}
              fontSize={12}
              fill={r.colour}
              paintOrder="stroke"
              stroke="#fff"
              strokeWidth={3}
            >
              {r.label}
            </text>
          </g>
        );
      })}
    </g>
  );
}

function Swatch({ shape, colour }: { shape: "circle" | "cross"; colour: string }) {
  return (
    <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
      {shape === "circle" ? (
        <circle cx="7" cy="7" r="4" fill={colour} />
      ) : (
        <path d="M5 1h4v4h4v4H9v4H5V9H1V5h4z" fill={colour} />
      )}
    </svg>
  );
}

function RingSwatch({ ring }: { ring: Ring }) {
  return (
    <svg width="22" height="14" viewBox="0 0 22 14" aria-hidden="true">
      <line x1="1" y1="7" x2="21" y2="7" stroke={ring.colour} strokeWidth="2" strokeDasharray={ring.dash} />
    </svg>
  );
}
