"use client";
import { useMemo } from "react";
import { area } from "@turf/turf";
import type { BoundaryPolygon } from "./schema";

const SIZE = 140;

/** Outline of a boundary (north up, longitudes scaled by cos(latitude)) with its area and corner count. */
export function BoundaryPreview({ polygon, source }: { polygon: BoundaryPolygon; source: string }) {
  const { path, hectares, corners } = useMemo(() => {
    const ring = polygon.coordinates[0];
    const lat0 = ring.reduce((s, p) => s + p[1], 0) / ring.length;
    const k = Math.cos((lat0 * Math.PI) / 180);
    const xs = ring.map((p) => p[0] * k),
      ys = ring.map((p) => p[1]);
    const minX = Math.min(...xs),
      maxX = Math.max(...xs),
      minY = Math.min(...ys),
      maxY = Math.max(...ys);
    const span = Math.max(maxX - minX, maxY - minY) || 1;
    const pad = 8,
      scale = (SIZE - 2 * pad) / span;
    const d = polygon.coordinates
      .map(
        (r) =>
          r
            .map(
              (p, i) =>
                `${i ? "L" : "M"}${(pad + (p[0] * k - minX) * scale).toFixed(1)},${(SIZE - pad - (p[1] - minY) * scale).toFixed(1)}`,
            )
            .join("") + "Z",
      )
      .join("");
    return {
      path: d,
      hectares: area({ type: "Feature", properties: {}, geometry: polygon }) / 10_000,
      corners: ring.length - 1,
    };
  }, [polygon]);
  return (
    <figure className="flex items-center gap-4" data-testid="boundary-preview">
      <svg
        width={SIZE}
        height={SIZE}
        viewBox={`0 0 ${SIZE} ${SIZE}`}
        role="img"
        aria-label={`Outline of the boundary, ${hectares.toFixed(2)} hectares`}
        className="rounded-plot border border-chalk-line bg-chalk"
      >
        <path d={path} fill="#dcebdf" stroke="#2f6b45" strokeWidth={1.5} fillRule="evenodd" />
      </svg>
      <figcaption className="text-sm text-ink-soft">
        <span className="block font-medium text-ink">
          {hectares.toLocaleString("en-GB", { maximumFractionDigits: 2 })} ha
        </span>
        {corners} corners{polygon.coordinates.length > 1 ? `, ${polygon.coordinates.length - 1} hole(s)` : ""}
        <span className="block text-xs text-ink-faint">{source}</span>
      </figcaption>
    </figure>
  );
}
