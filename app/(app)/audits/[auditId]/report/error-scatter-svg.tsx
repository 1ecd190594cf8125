/** A small, print-friendly scatter of the errors (dE, dN in mm) with the tolerance and 95 % circles. Server-rendered SVG. */

const SIZE = 260;
const PAD = 28;
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
  const scale = (SIZE - 2 * PAD) / (2 * half);
  const x = (v: number) => PAD + (v + half) * scale;
  const y = (v: number) => SIZE - PAD - (v + half) * scale;
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
        width={SIZE}
        height={SIZE}
        viewBox={`0 0 ${SIZE} ${SIZE}`}
        role="img"
        aria-label="Scatter of east and north errors in millimetres"
      >
        <rect x={PAD} y={PAD} width={SIZE - 2 * PAD} height={SIZE - 2 * PAD} fill="#fff" stroke="#d9d3c4" />
        {ticks.map((t) => (
          <g key={t}>
            <line
              x1={x(t)}
              x2={x(t)}
              y1={PAD}
              y2={SIZE - PAD}
              stroke={t === 0 ? "#7b8781" : "#ebe7dc"}
              strokeWidth={t === 0 ? 0.8 : 0.5}
            />
            <line
              y1={y(t)}
              y2={y(t)}
              x1={PAD}
              x2={SIZE - PAD}
              stroke={t === 0 ? "#7b8781" : "#ebe7dc"}
              strokeWidth={t === 0 ? 0.8 : 0.5}
            />
            <text x={x(t)} y={SIZE - PAD + 11} fontSize={8} textAnchor="middle" fill="#44524b">
              {t}
            </text>
            <text x={PAD - 4} y={y(t) + 3} fontSize={8} textAnchor="end" fill="#44524b">
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
        <text x={SIZE / 2} y={SIZE - 4} fontSize={9} textAnchor="middle" fill="#1d2a24">
          east error (mm)
        </text>
        <text
          x={9}
          y={SIZE / 2}
          fontSize={9}
          textAnchor="middle"
          fill="#1d2a24"
          transform={`rotate(-90 9 ${SIZE / 2})`}
        >
          north error (mm)
        </text>
      </svg>
      <figcaption className="max-w-[260px] text-xs text-ink-soft">
        {n} pairs{stride > 1 ? `, every ${stride}th drawn` : ""}
        {hidden ? `, ${hidden} beyond the frame` : ""}. Green within tolerance, red outside.
        {toleranceMm ? ` Yellow circle: radial limit ${toleranceMm.toFixed(1)} mm.` : ""}
        {r95Mm ? ` Dashed: 95 % of errors within ${r95Mm.toFixed(1)} mm.` : ""}
      </figcaption>
    </figure>
  );
}
