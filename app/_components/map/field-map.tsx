"use client";
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import { type ApiError, fetcher, toApiError } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto } from "@/lib/api-types";
import { AuditProgress } from "@/app/_components/audit/progress";
import { FilterDrawer } from "./filter-drawer";
import { decodeMapPayload } from "@/lib/map/binary";
import { mapKeys } from "@/lib/map/keys";
import { aggregateCells, type Cell } from "@/lib/map/cells";
import { errorDomain, mmLabel, viridis } from "@/lib/map/colour-scale";
import { bedLayout, boundsOf, type Pt } from "@/lib/map/geometry";
import { bedGuidance, bedStats, overallGuidance } from "@/lib/map/guidance";
import {
  isOut,
  metricValues,
  pairBuffers,
  selectPairs,
  selectUnpaired,
  unpairedBuffers,
  vectorBuffers,
  codeText,
  type ErrorMetric,
} from "@/lib/map/select";
import { fitBounds } from "@/lib/map/view";
import { PAIR_FLAG, type MapData } from "@/lib/map/types";
import { formatCount } from "@/app/_components/audit/format";
import { DeckView, type DeckLayersData, type MapTarget, type MapViewState } from "./deck-view";
import { MapControls } from "./map-controls";
import { ColourLegend, NorthArrow, ScaleBar, SymbolKey } from "./map-overlays";
import { DetailsPanel, tooltipText } from "./map-details";
import { BedTable } from "./bed-table";
import { initialSettings, METRIC_LABEL, type MapMode, type MapSettings } from "./map-state";

/** Fetch and decode the binary payload; marks let a test measure the time to first draw. */
async function fetchMapData(url: string): Promise<MapData> {
  performance.mark("plotproof:map-request");
  const res = await fetch(url, { headers: { accept: "application/octet-stream" } });
  if (!res.ok) throw await toApiError(res);
  const buffer = await res.arrayBuffer();
  performance.mark("plotproof:map-received");
  const data = decodeMapPayload(buffer);
  performance.mark("plotproof:map-decoded");
  return data;
}

const GREY: [number, number, number, number] = [205, 201, 190, 255];
const COMPUTING_POLL_MS = 1500;

function limitOf(data: MapData, metric: ErrorMetric): number | null {
  const p = data.meta.profile;
  if (!p) return null;
  return metric === "radial" ? p.radialM : metric === "cross" ? p.crossM : p.alongM;
}

/** Positions of the records not relied on or not yet shown (trust by cause), relative to the map's origin. */
function useRecordMarks(auditId: string | null, meta: MapData["meta"]): DeckLayersData["recordMarks"] {
  const { data } = useSWR<{ marks: { crs: string; x: number[]; y: number[]; cls: number[] } | null }>(
    auditId ? `/api/audits/${auditId}/record-trust?marks=1` : null,
    fetcher,
  );
  return useMemo(() => {
    const m = data?.marks;
    if (!m || m.crs !== meta.crs) return null;
    const pick = (cls: number) => {
      const idx = m.cls.flatMap((c, i) => (c === cls ? [i] : []));
      const positions = new Float32Array(2 * idx.length);
      idx.forEach((i, k) => {
        positions[2 * k] = m.x[i] - meta.origin[0];
        positions[2 * k + 1] = m.y[i] - meta.origin[1];
      });
      return { length: idx.length, positions };
    };
    return { doNotRely: pick(1), notShown: pick(2) };
  }, [data, meta]);
}

/** The map of one audit: controls, deck.gl canvas, legend, tooltip, details panel and per-bed summary. */
export function FieldMap({ auditId, mode }: { auditId: string; mode: MapMode }) {
  // An audit still computing has nothing to map yet: show its progress and load the map when it is done.
  const { data: status } = useSWR<{ audit: AuditDto }>(keys.audit(auditId), fetcher, {
    refreshInterval: (latest) => (latest?.audit.state === "computing" ? COMPUTING_POLL_MS : 0),
  });
  const computing = status?.audit.state === "computing";
  const { data, error } = useSWR<MapData>(status && !computing ? mapKeys.auditMapData(auditId) : null, fetchMapData, {
    revalidateOnFocus: false,
    revalidateIfStale: false,
    revalidateOnReconnect: false,
  });
  if (computing) {
    return (
      <div className="space-y-2" data-testid="map-waiting">
        <AuditProgress audit={status.audit} />
        <p className="text-sm text-ink-soft">The map appears here when the audit has finished.</p>
      </div>
    );
  }
  if (error) {
    const e = error as ApiError;
    return (
      <div
        role="alert"
        className="rounded-plot border-l-4 border-alarm bg-alarm-pale p-4 text-sm"
        data-testid="map-error"
        data-status={e.status ?? ""}
      >
        {e.status === 409 ? e.message : `The map could not be loaded: ${e.message}`}
      </div>
    );
  }
  if (!data)
    return (
      <p className="text-sm text-ink-faint" aria-busy="true" data-testid="map-loading">
        Loading the map data…
      </p>
    );
  return <LoadedMap data={data} auditId={auditId} mode={mode} />;
}

function LoadedMap({ data, auditId, mode }: { data: MapData; auditId: string; mode: MapMode }) {
  const { meta, arrays } = data;
  const [settings, setSettings] = useState<MapSettings>(() => initialSettings(mode, arrays.pairFlags.length));
  const [hover, setHover] = useState<{ target: MapTarget; x: number; y: number } | null>(null);
  const [selected, setSelectedState] = useState<MapTarget | null>(null);
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);
  const [viewState, setViewState] = useState<MapViewState | null>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const frameRef = useRef<HTMLDivElement>(null);
  const draws = useRef(0);
  // The control that opened the details panel (a button, the canvas) gets focus back when it closes (WCAG 2.4.3).
  const opener = useRef<HTMLElement | null>(null);
  // `from`: the element the choice was made on when that is not the focused one (a tap on the canvas leaves focus where
  // it was, e.g. on the zoom button tapped before).
  const setSelected = (t: MapTarget | null, from?: HTMLElement | null) => {
    if (t) {
      const active = from ?? (document.activeElement as HTMLElement | null);
      if (active && active !== document.body && !active.closest('[data-testid="map-details"]')) opener.current = active;
      setSelectedState(t);
      return;
    }
    setSelectedState(null);
    const back = opener.current?.isConnected ? opener.current : frameRef.current?.querySelector("canvas");
    requestAnimationFrame(() => back?.focus());
  };
  const hasAlong = useMemo(() => arrays.pairAlong.some(Number.isFinite), [arrays]);
  const hasVerdict = useMemo(() => arrays.pairFlags.some((f) => (f & PAIR_FLAG.WITHIN_KNOWN) !== 0), [arrays]);

  // Everything below is derived from the payload and the settings (typed arrays in, typed arrays out).
  const values = useMemo(() => metricValues(arrays, settings.metric), [arrays, settings.metric]);
  const limit = limitOf(data, settings.metric);
  const domain = useMemo(() => errorDomain(values, limit), [values, limit]);
  const pairsShown = useMemo(() => selectPairs(arrays, settings.filter), [arrays, settings.filter]);
  const unpairedShown = useMemo(
    () =>
      settings.showUnpaired && settings.layer === "points"
        ? selectUnpaired(arrays, settings.filter)
        : new Uint32Array(0),
    [arrays, settings.filter, settings.showUnpaired, settings.layer],
  );
  const layout = useMemo(() => {
    // Beds are placed by every record drawn: paired plants and planted records without a checkpoint.
    const planted: number[] = [];
    for (let i = 0; i < arrays.unpairedKind.length; i++) if (arrays.unpairedKind[i] === 0) planted.push(i);
    const n = arrays.pairFlags.length;
    const xy = new Float32Array(2 * (n + planted.length));
    xy.set(arrays.pairXY, 0);
    planted.forEach((i, k) => {
      xy[2 * (n + k)] = arrays.unpairedXY[2 * i];
      xy[2 * (n + k) + 1] = arrays.unpairedXY[2 * i + 1];
    });
    const label = (name: "bed" | "row") => (i: number) =>
      i < n
        ? codeText(meta.dict[name], arrays.pairCodes[name], i)
        : codeText(meta.dict[name], arrays.unpairedCodes[name], planted[i - n]);
    return bedLayout({
      bearingDeg: meta.rowBearingDeg,
      bedSpacingM: meta.field.bedSpacingM,
      rowsPerBed: meta.field.rowsPerBed,
      rowSpacingM: meta.field.rowSpacingM,
      points: { xy, bed: label("bed"), row: label("row") },
    });
  }, [arrays, meta]);
  const boundary = useMemo<Pt[] | null>(() => {
    const r = meta.boundary.ring;
    if (r.length < 6) return null;
    const pts: Pt[] = [];
    for (let i = 0; i + 1 < r.length; i += 2) pts.push([r[i], r[i + 1]]);
    return pts;
  }, [meta]);
  const bounds = useMemo(() => boundsOf(meta.boundary.ring, arrays.pairXY, arrays.unpairedXY), [meta, arrays]);
  const recordMarks = useRecordMarks(mode === "grower" ? auditId : null, meta);
  // A plant's or a cell's details belong to the layer they were picked on: switching layers closes the panel.
  // biome-ignore lint/correctness/useExhaustiveDependencies: runs on a layer change only
  useEffect(() => setSelectedState(null), [settings.layer]);

  const cells = useMemo<Cell[] | null>(() => {
    if (settings.layer !== "cells") return null;
    const beds =
      layout.anchoredBy && layout.beds.length
        ? {
            centres: layout.beds.map((b) => ({ label: b.label, centre: b.centre })),
            spacingM: layout.bedSpacingM!,
            halfWidth: layout.halfWidth!,
          }
        : null;
    return aggregateCells({
      xy: arrays.pairXY,
      values,
      flags: arrays.pairFlags,
      indices: pairsShown,
      bearingDeg: meta.rowBearingDeg,
      lengthM: settings.cellLengthM,
      beds,
    });
  }, [settings.layer, settings.cellLengthM, layout, arrays, values, pairsShown, meta.rowBearingDeg]);
  const cellValue = settings.cellValue === "share-out" && hasVerdict ? "share-out" : "mean";

  const layers = useMemo<DeckLayersData>(() => {
    const points = settings.layer === "points";
    const { rest, out } = pairBuffers(arrays, points ? pairsShown : new Uint32Array(0), values, domain);
    const at = (t: MapTarget | null): Pt | null => {
      if (!t || t.kind === "cell") return null;
      const xy = t.kind === "pair" ? arrays.pairXY : arrays.unpairedXY;
      return [xy[2 * t.seq], xy[2 * t.seq + 1]];
    };
    return {
      boundary,
      layout,
      rest,
      out,
      vectors: points && settings.vectors ? vectorBuffers(arrays, pairsShown, settings.exaggeration) : null,
      unpaired: points ? unpairedBuffers(arrays, unpairedShown) : null,
      cells,
      cellColour: (c: Cell) => {
        if (cellValue === "share-out") {
          if (c.shareOut === null) return GREY;
          const [r, g, b] = viridis(c.shareOut);
          return [r, g, b, 255];
        }
        if (!Number.isFinite(c.mean)) return GREY;
        const [r, g, b] = viridis(c.mean / domain[1]);
        return [r, g, b, 255];
      },
      cellKey: `${cellValue}:${domain[1]}:${settings.metric}`,
      selectedAt: at(selected),
      recordMarks,
    };
  }, [
    settings,
    arrays,
    pairsShown,
    unpairedShown,
    values,
    domain,
    boundary,
    layout,
    cells,
    cellValue,
    selected,
    recordMarks,
  ]);

  // A key of what the layers show, so tests and measurements can tell when the canvas shows the current settings.
  const layersKey = useMemo(
    () => JSON.stringify([settings, pairsShown.length, unpairedShown.length]),
    [settings, pairsShown, unpairedShown],
  );
  const layersKeyRef = useRef(layersKey);
  // Updated after the commit that hands the new layers to deck.gl, so a frame drawn before it never claims them.
  useLayoutEffect(() => {
    layersKeyRef.current = layersKey;
  }, [layersKey]);

  // Marks for measuring where the time to first draw goes (read by lib/map/bench-first-draw.ts).
  useEffect(() => {
    performance.mark("plotproof:map-prepared");
  }, []);

  useEffect(() => {
    const el = frameRef.current;
    if (!el) return;
    const ro = new ResizeObserver(([entry]) =>
      setSize({ width: entry.contentRect.width, height: entry.contentRect.height }),
    );
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const fitToField = useCallback(() => {
    if (!size || !bounds) return;
    const f = fitBounds(bounds, size.width, size.height, 32);
    setViewState({ target: f.target, zoom: f.zoom });
  }, [size, bounds]);
  useEffect(() => {
    if (!viewState && size && size.width > 0) fitToField();
  }, [viewState, size, fitToField]);

  const onDrawn = useCallback(() => {
    draws.current++;
    const root = rootRef.current;
    if (!root) return;
    root.dataset.draws = String(draws.current);
    root.dataset.drawnKey = layersKeyRef.current;
    if (draws.current === 1) {
      performance.mark("plotproof:map-first-draw");
      root.dataset.firstDrawMs = String(Math.round(performance.now()));
    }
  }, []);

  // Out-of-tolerance plants, largest error first, for stepping through them with the keyboard.
  const worstFirst = useMemo(() => {
    const out = Array.from(pairsShown).filter((i) => isOut(arrays.pairFlags[i]));
    return out.sort((a, b) => values[b] - values[a]);
  }, [pairsShown, arrays, values]);
  const step = (dir: 1 | -1) => {
    if (!worstFirst.length) return;
    const current = selected?.kind === "pair" ? worstFirst.indexOf(selected.seq) : -1;
    const next = worstFirst[(current + dir + worstFirst.length) % worstFirst.length];
    setSelected({ kind: "pair", seq: next });
    setSettings((s) => (s.layer === "points" ? s : { ...s, layer: "points" }));
    setViewState((v) => ({
      target: [arrays.pairXY[2 * next], arrays.pairXY[2 * next + 1]],
      zoom: Math.max(v?.zoom ?? 0, 4),
    }));
  };

  const stats = useMemo(() => {
    const n = arrays.pairFlags.length;
    const within = Int8Array.from(arrays.pairFlags, (f) =>
      f & PAIR_FLAG.WITHIN_KNOWN ? (f & PAIR_FLAG.WITHIN ? 1 : 0) : -1,
    );
    const radial = metricValues(arrays, "radial");
    const bed = Array.from({ length: n }, (_, i) => codeText(meta.dict.bed, arrays.pairCodes.bed, i));
    const s = bedStats({
      bed,
      radial,
      cross: arrays.pairCross,
      along: arrays.pairAlong,
      within,
      confidence: meta.profile?.confidence ?? 0.95,
    });
    const g = s.map((b) => bedGuidance(b, meta.profile));
    return { beds: s, guidance: g, summary: overallGuidance(g, meta.profile) };
  }, [arrays, meta]);

  const outShown = layers.out.length;
  const unpairedCounts = layers.unpaired
    ? {
        planted: layers.unpaired["planted-not-found"].length,
        survey: layers.unpaired["surveyed-not-planted"].length,
        ambiguous: layers.unpaired.ambiguous.length,
      }
    : null;
  const label = `Map of ${meta.audit.fieldName}: ${pairsShown.length} checkpoints shown. Arrow keys pan, plus and minus zoom.`;
  const zoomBy = (dz: number) => setViewState((v) => (v ? { ...v, zoom: v.zoom + dz } : v));
  const metricWords = METRIC_LABEL[settings.metric].replace(/ \(.*\)$/, "").toLowerCase();

  return (
    <div
      ref={rootRef}
      className="grid gap-4"
      data-testid="field-map"
      data-mode={mode}
      data-layer={settings.layer}
      data-pairs-total={arrays.pairFlags.length}
      data-pairs-shown={settings.layer === "points" ? pairsShown.length : 0}
      data-out-shown={outShown}
      data-unpaired-shown={unpairedShown.length}
      data-layers-key={layersKey}
      data-records-do-not-rely={recordMarks?.doNotRely.length ?? ""}
      data-draws="0"
    >
      <div className="grid gap-4 lg:grid-cols-[15rem_1fr]">
        <FilterDrawer>
          <MapControls mode={mode} meta={meta} settings={settings} onChange={setSettings} hasAlong={hasAlong} />
        </FilterDrawer>
        <div className="order-1 grid gap-2 lg:order-none">
          <div
            ref={frameRef}
            className="relative h-[62vh] min-h-[320px] overflow-hidden sm:min-h-[420px] rounded-plot border border-chalk-line bg-chalk-deep"
            data-testid="map-frame"
            // The view deck.gl draws (world point at the canvas centre, local metres; one metre = 2^zoom px), read-only,
            // so a browser test can find where a plant is on screen and tap it.
            data-view={viewState ? JSON.stringify(viewState) : undefined}
          >
            {viewState ? (
              <DeckView
                layers={layers}
                viewState={viewState}
                onViewStateChange={setViewState}
                label={label}
                onDrawn={onDrawn}
                onHover={(target, x, y) => setHover(target ? { target, x, y } : null)}
                onSelect={(t) => setSelected(t, frameRef.current?.querySelector("canvas"))}
              />
            ) : null}
            <div className="pointer-events-none absolute left-2 top-2">
              <NorthArrow crs={meta.crs} convergenceDeg={meta.gridConvergenceDeg} />
            </div>
            <div
              className="absolute bottom-2 left-2 flex gap-1 sm:bottom-auto sm:left-auto sm:right-2 sm:top-2"
              role="group"
              aria-label="View"
            >
              <button
                type="button"
                onClick={fitToField}
                className="min-h-11 rounded-plot border border-ink-faint bg-white px-3 py-1 text-sm hover:bg-chalk"
                data-testid="map-fit"
              >
                Fit to field
              </button>
              <button
                type="button"
                onClick={() => zoomBy(1)}
                aria-label="Zoom in"
                className="min-h-11 min-w-11 rounded-plot border border-ink-faint bg-white py-1 text-base hover:bg-chalk"
              >
                +
              </button>
              <button
                type="button"
                onClick={() => zoomBy(-1)}
                aria-label="Zoom out"
                className="min-h-11 min-w-11 rounded-plot border border-ink-faint bg-white py-1 text-base hover:bg-chalk"
              >
                −
              </button>
            </div>
            {viewState ? (
              <div className="pointer-events-none absolute bottom-2 right-2">
                <ScaleBar zoom={viewState.zoom} />
              </div>
            ) : null}
            {hover && !selected ? (
              <div
                role="tooltip"
                data-testid="map-tooltip"
                className="pointer-events-none absolute z-20 max-w-xs rounded-plot bg-ink px-2 py-1 text-xs text-white"
                style={{ left: Math.min(hover.x + 12, (size?.width ?? 0) - 220), top: hover.y + 12 }}
              >
                {tooltipText(data, hover.target, (i) => values[i])}
              </div>
            ) : null}
            {selected ? (
              <DetailsPanel auditId={auditId} crs={meta.crs} target={selected} onClose={() => setSelected(null)} />
            ) : null}
          </div>
          <div className="flex flex-wrap items-start gap-6">
            {settings.layer === "cells" && cellValue === "share-out" ? (
              <ColourLegend
                testId="legend-share"
                title={`Share of checkpoints out of tolerance per cell (${settings.cellLengthM} m of bed)`}
                max={1}
                format={(v) => `${Math.round(v * 100)} %`}
              />
            ) : (
              <ColourLegend
                testId="legend-error"
                max={domain[1]}
                format={mmLabel}
                limit={limit}
                title={
                  settings.layer === "cells"
                    ? `Mean ${metricWords} per cell (${settings.cellLengthM} m of bed), mm`
                    : `${METRIC_LABEL[settings.metric]}, mm`
                }
                limitLabel={limit !== null ? `limit of the profile: ${mmLabel(limit)}` : undefined}
              />
            )}
            {settings.layer === "points" ? (
              <SymbolKey
                exaggeration={settings.exaggeration}
                vectors={settings.vectors}
                showUnpaired={settings.showUnpaired}
              />
            ) : null}
            {recordMarks ? (
              <p className="max-w-sm text-xs" data-testid="record-marks-key">
                <span className="font-medium text-alarm">Red rings</span>: {formatCount(recordMarks.doNotRely.length)}{" "}
                records not to rely on
                {recordMarks.notShown.length ? (
                  <>
                    ; <span className="font-medium text-loam">yellow rings</span>:{" "}
                    {formatCount(recordMarks.notShown.length)} not yet shown
                  </>
                ) : null}
                .
              </p>
            ) : null}
            <p className="max-w-sm text-xs text-ink-soft" data-testid="layout-note">
              {layout.note}
              {meta.boundary.source === "records"
                ? " The outline is the hull of the records: the field has no boundary set."
                : ""}
            </p>
          </div>
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p className="text-sm text-ink-soft" aria-live="polite" data-testid="map-status">
              {settings.layer === "points" ? (
                <>
                  Showing {formatCount(pairsShown.length)} of {formatCount(arrays.pairFlags.length)} checkpoints
                  {hasVerdict ? (
                    <>
                      , <span className="text-alarm">{formatCount(outShown)} out of tolerance</span>
                    </>
                  ) : null}
                  {unpairedCounts ? (
                    <>
                      {" "}
                      · {formatCount(unpairedCounts.planted)} records without a checkpoint ·{" "}
                      {formatCount(unpairedCounts.survey + unpairedCounts.ambiguous)} survey points without a record
                    </>
                  ) : null}
                  .
                </>
              ) : (
                <>
                  {formatCount(cells?.length ?? 0)} cells from {formatCount(pairsShown.length)} checkpoints.
                </>
              )}
            </p>
            {hasVerdict ? (
              <div
                className="flex items-center gap-1"
                role="group"
                aria-label="Step through plants out of tolerance, largest error first"
              >
                <button
                  type="button"
                  disabled={!worstFirst.length}
                  onClick={() => step(-1)}
                  className="min-h-11 rounded-plot border border-ink-faint bg-white px-3 py-1 text-sm disabled:text-ink-faint"
                >
                  ◀ Previous
                </button>
                <button
                  type="button"
                  disabled={!worstFirst.length}
                  onClick={() => step(1)}
                  className="min-h-11 rounded-plot border border-ink-faint bg-white px-3 py-1 text-sm disabled:text-ink-faint"
                  data-testid="next-out"
                >
                  Next out of tolerance ▶
                </button>
              </div>
            ) : null}
          </div>
        </div>
      </div>
      {mode === "audit" ? (
        <section className="rounded-plot border border-chalk-line bg-white p-5" aria-label="Per bed">
          <h2 className="mb-2 text-base font-semibold">Per bed at this audit&apos;s tolerance</h2>
          <p className="mb-3 text-sm" data-testid="map-guidance">
            {stats.summary}
          </p>
          <BedTable beds={stats.beds} guidance={stats.guidance} caption="Checkpoints per bed" />
        </section>
      ) : null}
    </div>
  );
}
