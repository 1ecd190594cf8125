"use client";
import { useCallback, useMemo, useRef } from "react";
import DeckGL, { type DeckGLRef } from "@deck.gl/react";
import { OrthographicView, type Layer, type PickingInfo } from "@deck.gl/core";
import { IconLayer, LineLayer, PathLayer, ScatterplotLayer, SolidPolygonLayer, TextLayer } from "@deck.gl/layers";
import type { BedLayout, Pt } from "@/lib/map/geometry";
import type { Cell } from "@/lib/map/cells";
import type { PointBuffer } from "@/lib/map/select";
import type { UnpairedKind } from "@/lib/map/types";
import { COLOURS, SIZES, shapeAtlas } from "./palette";

/** The world position at the centre and the zoom (one metre = 2^zoom pixels). */
export interface MapViewState {
  target: [number, number];
  zoom: number;
}

/** Something on the map the pointer is over or that is selected. */
export type MapTarget =
  | { kind: "pair"; seq: number }
  | { kind: "unpaired"; seq: number }
  | { kind: "cell"; cell: Cell };

export interface DeckLayersData {
  boundary: Pt[] | null;
  layout: BedLayout;
  rest: PointBuffer;
  out: PointBuffer;
  vectors: { length: number; index: Uint32Array; source: Float32Array; target: Float32Array } | null;
  unpaired: Record<UnpairedKind, PointBuffer> | null;
  cells: Cell[] | null;
  cellColour: (c: Cell) => [number, number, number, number];
  /** Changes whenever the cell colours change (for deck's updateTriggers). */
  cellKey: string;
  selectedAt: Pt | null;
  /** Records the trust by cause says not to rely on (ringed) and not yet shown (grower's map); null when not shown. */
  recordMarks: {
    doNotRely: { length: number; positions: Float32Array };
    notShown: { length: number; positions: Float32Array };
  } | null;
}

const VIEW = new OrthographicView({ id: "field", flipY: false });

const binary = (
  b: { length: number; positions: Float32Array },
  extra: Record<string, { value: Uint8Array | Float32Array; size: number; normalized?: boolean }> = {},
) => ({
  length: b.length,
  attributes: { getPosition: { value: b.positions, size: 2 }, ...extra },
});

/**
 * The deck.gl canvas: field outline, beds and rows, then cells or plants (checkpoints coloured by error, out of
 * tolerance outlined and on top, error vectors, unpaired points with their own shapes). Data arrive as typed arrays.
 */
export function DeckView({
  layers: d,
  viewState,
  onViewStateChange,
  onHover,
  onSelect,
  onDrawn,
  label,
}: {
  layers: DeckLayersData;
  viewState: MapViewState;
  onViewStateChange: (v: MapViewState) => void;
  onHover: (target: MapTarget | null, x: number, y: number) => void;
  onSelect: (target: MapTarget | null) => void;
  onDrawn: () => void;
  label: string;
}) {
  const deckRef = useRef<DeckGLRef>(null);
  const atlas = useMemo(() => shapeAtlas(), []);

  const layers = useMemo(() => {
    const list: Layer[] = [];
    if (d.boundary && d.boundary.length >= 3) {
      list.push(
        new SolidPolygonLayer<Pt[]>({
          id: "field",
          data: [d.boundary],
          getPolygon: (p) => p,
          getFillColor: COLOURS.field,
        }),
      );
      list.push(
        new PathLayer<Pt[]>({
          id: "field-edge",
          data: [[...d.boundary, d.boundary[0]]],
          getPath: (p) => p,
          getColor: COLOURS.inkSoft,
          widthUnits: "pixels",
          getWidth: 1.5,
        }),
      );
    }
    list.push(
      new SolidPolygonLayer({
        id: "beds",
        data: d.layout.beds,
        getPolygon: (b) => b.outline,
        getFillColor: COLOURS.bed,
      }),
    );
    const rows = d.layout.beds.flatMap((b) => b.rows.map((r) => r.path));
    list.push(
      new LineLayer<[Pt, Pt]>({
        id: "rows",
        data: rows,
        getSourcePosition: (r) => r[0],
        getTargetPosition: (r) => r[1],
        getColor: COLOURS.row,
        widthUnits: "pixels",
        getWidth: 1,
      }),
    );
    if (d.cells) {
      list.push(
        new SolidPolygonLayer<Cell>({
          id: "cells",
          data: d.cells,
          getPolygon: (c) => c.polygon,
          getFillColor: d.cellColour,
          pickable: true,
          updateTriggers: { getFillColor: d.cellKey },
        }),
      );
    }
    if (d.unpaired?.["planted-not-found"].length) {
      list.push(
        new ScatterplotLayer({
          id: "planted-unpaired",
          data: binary(d.unpaired["planted-not-found"]),
          pickable: true,
          filled: false,
          stroked: true,
          radiusUnits: "pixels",
          getRadius: SIZES.unpairedRadius,
          lineWidthUnits: "pixels",
          getLineWidth: 1,
          getLineColor: COLOURS.ring,
        }),
      );
    }
    if (d.vectors?.length) {
      list.push(
        new LineLayer({
          id: "vectors",
          data: {
            length: d.vectors.length,
            attributes: {
              getSourcePosition: { value: d.vectors.source, size: 2 },
              getTargetPosition: { value: d.vectors.target, size: 2 },
            },
          },
          getColor: COLOURS.vector,
          widthUnits: "pixels",
          getWidth: 1,
        }),
      );
    }
    if (d.rest.length) {
      list.push(
        new ScatterplotLayer({
          id: "pairs",
          data: binary(d.rest, { getFillColor: { value: d.rest.colours!, size: 4, normalized: true } }),
          pickable: true,
          radiusUnits: "pixels",
          getRadius: SIZES.pairRadius,
          stroked: true,
          lineWidthUnits: "pixels",
          getLineWidth: SIZES.pointOutline,
          getLineColor: COLOURS.pointOutline,
        }),
      );
    }
    if (d.out.length) {
      list.push(
        new ScatterplotLayer({
          id: "pairs-out",
          data: binary(d.out, { getFillColor: { value: d.out.colours!, size: 4, normalized: true } }),
          pickable: true,
          radiusUnits: "pixels",
          getRadius: SIZES.outRadius,
          stroked: true,
          lineWidthUnits: "pixels",
          getLineWidth: SIZES.outStroke,
          getLineColor: COLOURS.out,
          antialiasing: true,
        }),
      );
    }
    if (d.recordMarks) {
      for (const [id, b, colour] of [
        ["records-not-shown", d.recordMarks.notShown, COLOURS.ambiguous],
        ["records-do-not-rely", d.recordMarks.doNotRely, COLOURS.out],
      ] as const) {
        if (!b.length) continue;
        list.push(
          new ScatterplotLayer({
            id,
            data: binary(b),
            filled: false,
            stroked: true,
            radiusUnits: "pixels",
            getRadius: SIZES.outRadius + 2,
            lineWidthUnits: "pixels",
            getLineWidth: 2,
            getLineColor: colour,
          }),
        );
      }
    }
    if (d.unpaired) {
      for (const [kind, icon, colour] of [
        ["surveyed-not-planted", "diamond", COLOURS.surveyOnly],
        ["ambiguous", "triangle", COLOURS.ambiguous],
      ] as const) {
        const b = d.unpaired[kind];
        if (!b.length) continue;
        list.push(
          new IconLayer({
            id: kind,
            data: binary(b),
            pickable: true,
            iconAtlas: atlas.url,
            iconMapping: atlas.mapping,
            getIcon: () => icon,
            sizeUnits: "pixels",
            getSize: SIZES.icon,
            getColor: colour,
          }),
        );
      }
    }
    const labelled = d.layout.beds.filter((b) => b.label !== "");
    if (labelled.length) {
      list.push(
        new TextLayer<(typeof labelled)[number]>({
          id: "bed-labels",
          data: labelled,
          getText: (b) => `Bed ${b.label}`,
          getPosition: (b) => b.labelAt,
          getSize: 12,
          getColor: COLOURS.inkSoft,
          getTextAnchor: "middle",
          getAlignmentBaseline: "center",
          fontFamily: "system-ui, sans-serif",
          characterSet: "auto",
        }),
      );
    }
    if (d.selectedAt) {
      list.push(
        new ScatterplotLayer<Pt>({
          id: "selected",
          data: [d.selectedAt],
          getPosition: (p) => p,
          filled: false,
          stroked: true,
          radiusUnits: "pixels",
          getRadius: 10,
          lineWidthUnits: "pixels",
          getLineWidth: 2.5,
          getLineColor: COLOURS.selected,
        }),
      );
    }
    return list;
  }, [d, atlas]);

  const toTarget = useCallback(
    (info: PickingInfo): MapTarget | null => {
      if (info.index < 0 || !info.layer) return null;
      const id = info.layer.id;
      if (id === "cells") return info.object ? { kind: "cell", cell: info.object as Cell } : null;
      const buffer =
        id === "pairs"
          ? d.rest
          : id === "pairs-out"
            ? d.out
            : id === "planted-unpaired"
              ? d.unpaired?.["planted-not-found"]
              : id === "surveyed-not-planted"
                ? d.unpaired?.["surveyed-not-planted"]
                : id === "ambiguous"
                  ? d.unpaired?.ambiguous
                  : undefined;
      if (!buffer || info.index >= buffer.length) return null;
      const seq = buffer.index[info.index];
      return id === "pairs" || id === "pairs-out" ? { kind: "pair", seq } : { kind: "unpaired", seq };
    },
    [d],
  );

  return (
    <DeckGL
      ref={deckRef}
      views={VIEW}
      viewState={viewState}
      onViewStateChange={({ viewState: v }) =>
        onViewStateChange({
          target: [(v as MapViewState).target[0], (v as MapViewState).target[1]],
          zoom: (v as MapViewState).zoom,
        })
      }
      controller={{ doubleClickZoom: true, keyboard: true, scrollZoom: true, dragPan: true, dragRotate: false }}
      layers={layers}
      pickingRadius={4}
      getCursor={({ isHovering, isDragging }) => (isDragging ? "grabbing" : isHovering ? "pointer" : "grab")}
      onHover={(info) => onHover(toTarget(info), info.x, info.y)}
      onClick={(info) => onSelect(toTarget(info))}
      onAfterRender={onDrawn}
      onLoad={() => {
        performance.mark("plotproof:map-gl-ready");
        // The canvas takes keyboard focus so the arrow keys pan and +/− zoom.
        const canvas = deckRef.current?.deck?.getCanvas();
        if (canvas) {
          canvas.tabIndex = 0;
          canvas.setAttribute("role", "img");
          canvas.setAttribute("aria-label", label);
        }
      }}
    />
  );
}
