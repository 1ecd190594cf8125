"use client";
import { legendTicks, mmLabel, VIRIDIS_STOPS } from "@/lib/map/colour-scale";
import { metresPerPixel, scaleBar } from "@/lib/map/view";
import { HEX, SIZES } from "./palette";

const gradient = `linear-gradient(to right, ${VIRIDIS_STOPS.map((c, i) => `rgb(${c.join(",")}) ${((i / (VIRIDIS_STOPS.length - 1)) * 100).toFixed(2)}%`).join(", ")})`;

/** Colour bar with ticks. `limit` (same unit as `max`) is marked when given. */
export function ColourLegend({
  title,
  max,
  format,
  limit,
  limitLabel,
  testId,
}: {
  title: string;
  max: number;
  format: (v: number) => string;
  limit?: number | null;
  limitLabel?: string;
  testId: string;
}) {
  const ticks = legendTicks(max, format);
  return (
    <figure className="w-64" data-testid={testId} data-max={max}>
      <figcaption className="mb-1 text-xs font-medium text-ink">{title}</figcaption>
      <div
        className="relative h-3 rounded-plot border border-chalk-line"
        style={{ background: gradient }}
        aria-hidden="true"
      >
        {limit !== null && limit !== undefined && limit <= max ? (
          <span className="absolute -top-1 h-5 w-0.5 bg-ink" style={{ left: `calc(${(limit / max) * 100}% - 1px)` }} />
        ) : null}
      </div>
      <div className="relative mt-0.5 h-4 text-xs text-ink-soft" aria-hidden="true">
        {ticks.map((t, i) => (
          <span
            key={t.value}
            className="absolute -translate-x-1/2 whitespace-nowrap"
            style={{ left: `${t.at * 100}%` }}
          >
            {i === ticks.length - 1 ? `≥ ${t.label}` : t.label}
          </span>
        ))}
      </div>
      <p className="sr-only">{`Colour from dark purple at ${ticks[0].label} to yellow at ${ticks[ticks.length - 1].label} or more.`}</p>
      {limit !== null && limit !== undefined ? (
        <p className="text-xs text-ink-soft">▮ {limitLabel ?? `limit ${format(limit)}`}</p>
      ) : null}
    </figure>
  );
}

/** The symbols of the point layer. */
export function SymbolKey({
  exaggeration,
  vectors,
  showUnpaired,
}: {
  exaggeration: number;
  vectors: boolean;
  showUnpaired: boolean;
}) {
  const dot = (r: number, fill: string, stroke?: string, sw = 0) => (
    <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true">
      <circle cx="8" cy="8" r={r} fill={fill} stroke={stroke} strokeWidth={sw} />
    </svg>
  );
  return (
    <ul className="grid gap-0.5 text-xs text-ink-soft" data-testid="symbol-key">
      <li className="flex items-center gap-1.5">
        {dot(SIZES.pairRadius, "rgb(33,145,140)", HEX.ink, SIZES.pointOutline)} checkpoint paired with its record
        (colour = error, dark edge)
      </li>
      <li className="flex items-center gap-1.5">
        {dot(SIZES.outRadius - 1, "rgb(253,231,37)", HEX.alarm, SIZES.outStroke)} out of tolerance (red ring, larger)
      </li>
      {vectors ? (
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true">
            <line x1="2" y1="12" x2="14" y2="4" stroke={HEX.ink} strokeWidth="1" />
          </svg>
          error vector, record → survey, drawn ×{exaggeration}
        </li>
      ) : null}
      {showUnpaired ? (
        <>
          <li className="flex items-center gap-1.5">
            {dot(SIZES.unpairedRadius + 1, "none", HEX.inkFaint, 1)} as-planted record without a checkpoint (not
            surveyed, or not found)
          </li>
          <li className="flex items-center gap-1.5">
            <svg width="16" height="16" aria-hidden="true">
              <path d="M8 2 L14 8 L8 14 L2 8 Z" fill={HEX.loam} />
            </svg>{" "}
            surveyed, but no record (e.g. a weed)
          </li>
          <li className="flex items-center gap-1.5">
            <svg width="16" height="16" aria-hidden="true">
              <path d="M8 2 L14 13 L2 13 Z" fill={HEX.stake} />
            </svg>{" "}
            survey point with two equally near records
          </li>
        </>
      ) : null}
    </ul>
  );
}

/** A round-length scale bar for the current zoom. */
export function ScaleBar({ zoom }: { zoom: number }) {
  const bar = scaleBar(metresPerPixel(zoom), 120);
  return (
    <div
      className="rounded-plot bg-white/90 px-2 py-1 text-xs text-ink"
      data-testid="scale-bar"
      data-metres={bar.metres}
      role="img"
      aria-label={`Scale: the bar is ${bar.label}`}
    >
      <div className="h-1.5 border-x-2 border-b-2 border-ink" style={{ width: `${bar.px}px` }} aria-hidden="true" />
      <span>{bar.label}</span>
    </div>
  );
}

/** North arrow: up is grid north of the work CRS; the convergence to true north is stated when known. */
export function NorthArrow({ crs, convergenceDeg }: { crs: string; convergenceDeg: number | null }) {
  const conv =
    convergenceDeg === null
      ? null
      : Math.abs(convergenceDeg) < 0.05
        ? "true north is the same direction here"
        : `true north is ${Math.abs(convergenceDeg).toFixed(1)}° ${convergenceDeg > 0 ? "west" : "east"} of it here`;
  return (
    <div
      className="flex items-center gap-1.5 rounded-plot bg-white/90 px-2 py-1 text-xs text-ink"
      data-testid="north-arrow"
    >
      <span className="flex flex-col items-center" aria-hidden="true">
        <svg width="18" height="22" viewBox="0 0 18 22" aria-hidden="true">
          <path d="M9 1 L16 22 L9 17 L2 22 Z" fill={HEX.ink} />
        </svg>
        <span className="text-xs font-semibold leading-none">N</span>
      </span>
      <span className="max-w-44 leading-tight">
        Up is grid north of {crs}
        {conv ? `; ${conv}` : ""}.
      </span>
    </div>
  );
}

export { mmLabel };
