/** A small, print-friendly scatter of the errors (dE, dN in mm) with the tolerance and 95 % circles. Server-rendered SVG. */

// The square plot and the margins its 12 px labels need (no text under 12 px on screen, WCAG 1.4.4 practice).
const PLOT = 220;
const LEFT = 54;
const BOTTOM = 40;
const EDGE = 10;
const WIDTH = LEFT + PLOT + EDGE;
const HEIGHT = EDGE + PLOT + BOTTOM;
const LABEL = 12;
const MAX_POINTS = 3000;

function niceStep(span: number): number {
  const raw = span / 4;
  const p = 10 ** Math.floor(Math.log10(raw));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

export function ErrorScatterSvg({
  dE,
  dN,
  within,
  toleranceMm,
  r95Mm,
}: {
  dE: number[];
  dN: number[];
  within: (boolean | null)[];
  toleranceMm: number | null;
  r95Mm: number | null;
}) {
  const n = dE.length;
  const mmE = dE.map((v) => v * 1000),
    mmN = dN.map((v) => v * 1000);
  const radii = mmE.map((e, i) => Math.hypot(e, mmN[i])).sort((a, b) => a - b);
  const p99 = radii.length ? radii[Math.min(radii.length - 1, Math.floor(radii.length * 0.99))] : 1;
  const reach = Math.max(p99, toleranceMm ?? 0, r95Mm ?? 0, 2) * 1.15;
  const step = niceStep(reach);
  const half = Math.ceil(reach / step) * step;
  const scale = PLOT / (2 * half);
  const x = (v: number) => LEFT + (v + half) * scale;
  const y = (v: number) => EDGE + PLOT - (v + half) * scale;
  const stride = Math.max(1, Math.ceil(n / MAX_POINTS));
  const ticks: number[] = [];
  for (let t = -half; t <= half + 1e-9; t += step) ticks.push(Math.round(t * 1000) / 1000);
  let hidden = 0;
  const dots: React.ReactNode[] = [];
  for (let i = 0; i < n; i += stride) {
    if (Math.abs(mmE[i]) > half || Math.abs(mmN[i]) > half) {
      hidden++;
      continue;
    }
    const colour = within[i] === true ? "#2f6b45" : within[i] === false ? "#b3362b" : "#7b8781";
    dots.push(
      <circle key={i} cx={x(mmE[i]).toFixed(1)} cy={y(mmN[i]).toFixed(1)} r={1.6} fill={colour} fillOpacity={0.75} />,
    );
  }
  return (
    <figure className="inline-block" data-testid="report-scatter">
      <svg
        width={WIDTH}
        height={HEIGHT}
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        role="img"
        aria-label="Scatter of east and north errors in millimetres"
      >
        <rect x={LEFT} y={EDGE} width={PLOT} height={PLOT} fill="#fff" stroke="#d9d3c4" />
        {ticks.map((t) => (
          <g key={t}>
            <line
              x1={x(t)}
              x2={x(t)}
              y1={EDGE}
              y2={EDGE + PLOT}
              stroke={t === 0 ? "#7b8781" : "#ebe7dc"}
              strokeWidth={t === 0 ? 0.8 : 0.5}
            />
            <line
              y1={y(t)}
              y2={y(t)}
              x1={LEFT}
              x2={LEFT + PLOT}
              stroke={t === 0 ? "#7b8781" : "#ebe7dc"}
              strokeWidth={t === 0 ? 0.8 : 0.5}
            />
            <text x={x(t)} y={EDGE + PLOT + 14} fontSize={LABEL} textAnchor="middle" fill="#44524b">
              {t}
            </text>
            <text x={LEFT - 4} y={y(t) + 4} fontSize={LABEL} textAnchor="end" fill="#44524b">
              {t}
            </text>
          </g>
        ))}
        {dots}
        {toleranceMm ? (
          <circle cx={x(0)} cy={y(0)} r={toleranceMm * scale} fill="none" stroke="#d99a1e" strokeWidth={1.4} />
        ) : null}
        {r95Mm ? (
          <circle
            cx={x(0)}
            cy={y(0)}
            r={r95Mm * scale}
            fill="none"
            stroke="#1d2a24"
            strokeWidth={1}
            strokeDasharray="3 2"
          />
        ) : null}
        <text x={LEFT + PLOT / 2} y={HEIGHT - 6} fontSize={LABEL} textAnchor="middle" fill="#1d2a24">
          east error (mm)
        </text>
        <text
          x={12}
          y={EDGE + PLOT / 2}
          fontSize={LABEL}
          textAnchor="middle"
          fill="#1d2a24"
          transform={`rotate(-90 12 ${EDGE + PLOT / 2})`}
        >
          north error (mm)
        </text>
      </svg>
      <figcaption className="max-w-[284px] text-xs text-ink-soft">
        {n} pairs{stride > 1 ? `, every ${stride}th drawn` : ""}
        {hidden ? `, ${hidden} beyond the frame` : ""}. Green within tolerance, red outside.
        {toleranceMm ? ` Yellow circle: radial limit ${toleranceMm.toFixed(1)} mm.` : ""}
        {r95Mm ? ` Dashed: 95 % of errors within ${r95Mm.toFixed(1)} mm.` : ""}
      </figcaption>
    </figure>
  );
}
