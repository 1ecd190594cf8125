"use client";
import { useCallback, useLayoutEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import DeckGL, { type DeckGLRef } from "@deck.gl/react";
import { type Layer, OrthographicView, type PickingInfo } from "@deck.gl/core";
import { PathLayer, ScatterplotLayer, SolidPolygonLayer, TextLayer } from "@deck.gl/layers";
import { fetcher } from "@/lib/fetcher";
import type { PlanRecordsPayload } from "@/lib/plan/plan-map";
import type { ControlMarkDto, PlanPointDto } from "@/lib/plan/dto";
import { keys } from "@/lib/swr-keys";
import { fitBounds } from "@/lib/map/view";
import { PLAN_COLOURS, PLAN_HEX as HEX } from "./plan-map-colours";
import { NorthArrow, ScaleBar } from "@/app/_components/map/map-overlays";

/** Pixel sizes: disc radius, diamond and triangle centre-to-corner, record dot radius. */
const SIZE = { checkpoint: 5, spare: 7, mark: 10, record: 1.5 };

const VIEW = new OrthographicView({ id: "plan", flipY: false });

interface ViewState {
  target: [number, number];
  zoom: number;
}

interface PlacedPoint {
  p: PlanPointDto;
  at: [number, number];
}
interface PlacedMark {
  m: ControlMarkDto;
  at: [number, number];
}

/** A diamond outline (closed path) and a triangle round `at`, `r` metres from the centre to a corner. */
const diamond = ([x, y]: [number, number], r: number): [number, number][] => [
  [x, y + r],
  [x + r, y],
  [x, y - r],
  [x - r, y],
  [x, y + r],
];
const triangle = ([x, y]: [number, number], r: number): [number, number][] => [
  [x, y + r],
  [x + r * 0.87, y - r * 0.5],
  [x - r * 0.87, y - r * 0.5],
];

function KeySymbol({ kind }: { kind: "checkpoint" | "spare" | "mark" | "record" }) {
  return (
    <svg width="18" height="18" viewBox="0 0 18 18" aria-hidden="true" className="shrink-0">
      {kind === "checkpoint" ? <circle cx="9" cy="9" r="5" fill={HEX.checkpoint} stroke={HEX.mark} /> : null}
      {kind === "spare" ? (
        <path d="M9 2.5 L15.5 9 L9 15.5 L2.5 9 Z" fill="none" stroke={HEX.spare} strokeWidth="2.5" />
      ) : null}
      {kind === "mark" ? <path d="M9 2 L16 15 L2 15 Z" fill={HEX.mark} /> : null}
      {kind === "record" ? <circle cx="9" cy="9" r="1.8" fill={HEX.record} opacity="0.6" /> : null}
    </svg>
  );
}

/**
 * The plan on a map of the field (deck.gl, north up, metres): every as-planted record faint, the planned checkpoints,
 * the spares and the control marks. The canvas takes keyboard focus (arrow keys pan, + and − zoom); the counts are
 * written beside it and the points are listed in the table below the map.
 */
export function PlanMap({
  planId,
  fieldName,
  crs,
  points,
  marks,
}: {
  planId: string;
  fieldName: string;
  crs: string;
  points: PlanPointDto[];
  marks: ControlMarkDto[];
}) {
  const { data, error } = useSWR<{ records: PlanRecordsPayload }>(keys.planRecords(planId), fetcher, {
    revalidateOnFocus: false,
  });
  const records = data?.records ?? null;
  const frameRef = useRef<HTMLDivElement>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const deckRef = useRef<DeckGLRef>(null);
  const draws = useRef(0);
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);
  const [view, setView] = useState<ViewState | null>(null);

  const placed = useMemo(() => {
    if (!records) return null;
    const [oe, on] = records.origin;
    const at = (e: number, n: number): [number, number] => [e - oe, n - on];
    const checkpoints: PlacedPoint[] = [];
    const spares: PlacedPoint[] = [];
    for (const p of points) (p.spare ? spares : checkpoints).push({ p, at: at(p.e, p.n) });
    const placedMarks: PlacedMark[] = marks.map((m) => ({ m, at: at(m.e, m.n) }));
    const positions = new Float32Array(records.xy.length);
    let minX = Number.POSITIVE_INFINITY;
    let minY = Number.POSITIVE_INFINITY;
    let maxX = Number.NEGATIVE_INFINITY;
    let maxY = Number.NEGATIVE_INFINITY;
    const grow = (x: number, y: number) => {
      minX = Math.min(minX, x);
      maxX = Math.max(maxX, x);
      minY = Math.min(minY, y);
      maxY = Math.max(maxY, y);
    };
    for (let i = 0; i < records.xy.length; i += 2) {
      positions[i] = records.xy[i] / 100;
      positions[i + 1] = records.xy[i + 1] / 100;
      grow(positions[i], positions[i + 1]);
    }
    for (const q of [...checkpoints, ...spares, ...placedMarks]) grow(q.at[0], q.at[1]);
    const bounds = Number.isFinite(minX) ? { minX, minY, maxX, maxY } : { minX: -1, minY: -1, maxX: 1, maxY: 1 };
    return { checkpoints, spares, marks: placedMarks, positions, bounds };
  }, [records, points, marks]);

  useLayoutEffect(() => {
    const el = frameRef.current;
    if (!el) return;
    const measure = () => setSize({ width: el.clientWidth, height: el.clientHeight });
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const fitToPlan = useCallback(() => {
    if (placed && size) setView(fitBounds(placed.bounds, size.width, size.height, 28));
  }, [placed, size]);
  useLayoutEffect(() => {
    if (!view) fitToPlan();
  }, [fitToPlan, view]);

  // Metres per screen pixel at the current zoom (deck.gl's OrthographicView: one unit = 2^zoom pixels).
  const px = view ? 2 ** -view.zoom : 0;
  const layers = useMemo(() => {
    if (!placed) return [];
    const list: Layer[] = [
      new ScatterplotLayer({
        id: "plan-records",
        data: {
          length: placed.positions.length / 2,
          attributes: { getPosition: { value: placed.positions, size: 2 } },
        },
        radiusUnits: "pixels",
        getRadius: SIZE.record,
        getFillColor: PLAN_COLOURS.record,
      }),
      new ScatterplotLayer<PlacedPoint>({
        id: "plan-checkpoints",
        data: placed.checkpoints,
        getPosition: (d) => d.at,
        pickable: true,
        radiusUnits: "pixels",
        getRadius: SIZE.checkpoint,
        getFillColor: PLAN_COLOURS.checkpoint,
        stroked: true,
        lineWidthUnits: "pixels",
        getLineWidth: 1,
        getLineColor: PLAN_COLOURS.mark,
      }),
      // Spares and marks are drawn in metres sized from the zoom, so they keep their size in pixels on screen.
      new PathLayer<PlacedPoint>({
        id: "plan-spares",
        data: placed.spares,
        getPath: (d) => diamond(d.at, SIZE.spare * px),
        pickable: true,
        widthUnits: "pixels",
        getWidth: 2.5,
        getColor: PLAN_COLOURS.spare,
        jointRounded: false,
        updateTriggers: { getPath: px },
      }),
      new SolidPolygonLayer<PlacedMark>({
        id: "plan-marks",
        data: placed.marks,
        getPolygon: (d) => triangle(d.at, SIZE.mark * px),
        pickable: true,
        getFillColor: PLAN_COLOURS.mark,
        updateTriggers: { getPolygon: px },
      }),
      new TextLayer<PlacedMark>({
        id: "plan-mark-names",
        data: placed.marks,
        getPosition: (d) => d.at,
        getText: (d) => d.m.name,
        getSize: 13,
        getColor: PLAN_COLOURS.mark,
        getPixelOffset: [12, 0],
        getTextAnchor: "start",
        getAlignmentBaseline: "center",
        background: true,
        getBackgroundColor: [255, 255, 255, 230],
        fontFamily: "system-ui, sans-serif",
        characterSet: "auto",
      }),
    ];
    return list;
  }, [placed, px]);

  const nCheck = points.filter((p) => !p.spare).length;
  const nSpare = points.length - nCheck;
  const markNames = marks.map((m) => m.name).join(", ");
  const summary = `${records ? `${records.count} as-planted records (faint dots), ` : ""}${nCheck} planned checkpoints (filled green discs), ${nSpare} spares (hollow brown diamonds) and ${marks.length} control mark${marks.length === 1 ? "" : "s"} (black triangles${markNames ? `: ${markNames}` : ""})`;
  const label = `Map of the plan on ${fieldName}: ${summary}. North up. Arrow keys pan, plus and minus zoom.`;
  const tooltip = (info: PickingInfo) => {
    const o = info.object as PlacedPoint | PlacedMark | undefined;
    if (!o) return null;
    if ("m" in o) return { text: `Control mark ${o.m.name}: E ${o.m.e.toFixed(3)}, N ${o.m.n.toFixed(3)}` };
    const p = o.p;
    return {
      text: `${p.spare ? "Spare" : "Checkpoint"} ${p.name}: plant ${p.plantId}${p.bed ? `, bed ${p.bed}` : ""}${p.row ? `, row ${p.row}` : ""}`,
    };
  };
  const zoomBy = (dz: number) => setView((v) => (v ? { ...v, zoom: v.zoom + dz } : v));
  const button = "min-h-11 rounded-plot border border-ink-faint bg-white px-3 py-1 text-sm hover:bg-chalk";

  return (
    <figure
      ref={rootRef}
      className="grid gap-2"
      data-testid="plan-map"
      data-records={records?.count ?? ""}
      data-checkpoints={nCheck}
      data-spares={nSpare}
      data-marks={marks.length}
      data-draws="0"
    >
      <div
        ref={frameRef}
        className="relative h-[50vh] min-h-[320px] overflow-hidden rounded-plot border border-chalk-line bg-white"
        data-testid="plan-map-frame"
      >
        {error ? (
          <p role="alert" className="p-4 text-sm text-alarm">
            The as-planted records could not be loaded for the map: {(error as Error).message}
          </p>
        ) : !records ? (
          <p className="p-4 text-sm text-ink-faint" aria-busy="true">
            Loading the map…
          </p>
        ) : null}
        {view && placed ? (
          <DeckGL
            ref={deckRef}
            views={VIEW}
            viewState={view}
            onViewStateChange={({ viewState: v }) => {
              const s = v as ViewState;
              setView({ target: [s.target[0], s.target[1]], zoom: s.zoom });
            }}
            controller={{ doubleClickZoom: true, keyboard: true, scrollZoom: true, dragPan: true, dragRotate: false }}
            layers={layers}
            pickingRadius={4}
            getTooltip={tooltip}
            onAfterRender={() => {
              draws.current++;
              if (rootRef.current) rootRef.current.dataset.draws = String(draws.current);
            }}
            onLoad={() => {
              // deck.gl's own event root is the map's one tab stop (its keyboard controller listens there): it gets
              // the name; the canvas inside it stays out of the tab order.
              const canvas = deckRef.current?.deck?.getCanvas();
              const root = frameRef.current?.querySelector<HTMLElement>(".deck-events-root") ?? canvas;
              if (root) {
                root.tabIndex = 0;
                root.setAttribute("role", "img");
                root.setAttribute("aria-label", label);
                root.dataset.testid = "plan-map-canvas";
              }
              if (canvas && canvas !== root) canvas.setAttribute("aria-hidden", "true");
            }}
          />
        ) : null}
        <div className="pointer-events-none absolute left-2 top-2">
          <NorthArrow crs={crs} convergenceDeg={null} />
        </div>
        <div className="absolute right-2 top-2 flex gap-1" role="group" aria-label="View">
          <button type="button" onClick={fitToPlan} className={button} data-testid="plan-map-fit">
            Fit to plan
          </button>
          <button type="button" onClick={() => zoomBy(1)} aria-label="Zoom in" className={`${button} min-w-11`}>
            +
          </button>
          <button type="button" onClick={() => zoomBy(-1)} aria-label="Zoom out" className={`${button} min-w-11`}>
            −
          </button>
        </div>
        {view ? (
          <div className="pointer-events-none absolute bottom-2 right-2">
            <ScaleBar zoom={view.zoom} />
          </div>
        ) : null}
      </div>
      <figcaption className="grid gap-1 text-sm">
        <p data-testid="plan-map-summary">The map shows {summary}. The same points are listed in the table below.</p>
        <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft" data-testid="plan-map-key">
          <li className="flex items-center gap-1.5">
            <KeySymbol kind="checkpoint" /> planned checkpoint
          </li>
          <li className="flex items-center gap-1.5">
            <KeySymbol kind="spare" /> spare (survey it only in place of a dead or missing checkpoint of its stratum)
          </li>
          <li className="flex items-center gap-1.5">
            <KeySymbol kind="mark" /> control mark
          </li>
          <li className="flex items-center gap-1.5">
            <KeySymbol kind="record" /> as-planted record
          </li>
        </ul>
      </figcaption>
    </figure>
  );
}
