"use client";
import type { DictName, MapMeta } from "@/lib/map/types";
import type { ErrorMetric } from "@/lib/map/select";
import {
  CELL_LENGTHS,
  EXAGGERATIONS,
  FILTERS,
  FILTER_LABEL,
  METRIC_LABEL,
  type MapMode,
  type MapSettings,
} from "./map-state";

const selectCls = "w-full min-h-11 rounded-plot border border-ink-faint bg-white px-2 py-1.5 text-sm lg:min-h-9";
const labelCls = "mb-1 block text-xs font-medium text-ink-soft";

function Toggle({
  pressed,
  onClick,
  children,
  testId,
}: {
  pressed: boolean;
  onClick: () => void;
  children: React.ReactNode;
  testId?: string;
}) {
  return (
    <button
      type="button"
      aria-pressed={pressed}
      onClick={onClick}
      data-testid={testId}
      className={`min-h-11 flex-1 rounded-plot border px-2 py-1.5 text-sm font-medium lg:min-h-9 ${pressed ? "border-leaf bg-leaf text-white" : "border-chalk-line bg-white text-ink hover:bg-chalk"}`}
    >
      {children}
    </button>
  );
}

function Check({
  id,
  checked,
  onChange,
  children,
  disabled,
}: {
  id: string;
  checked: boolean;
  onChange: (v: boolean) => void;
  children: React.ReactNode;
  disabled?: boolean;
}) {
  return (
    <label
      htmlFor={id}
      className={`flex min-h-11 items-center gap-2 text-sm lg:min-h-8 ${disabled ? "text-ink-faint" : ""}`}
    >
      <input
        id={id}
        type="checkbox"
        checked={checked}
        disabled={disabled}
        onChange={(e) => onChange(e.target.checked)}
        className="h-5 w-5 accent-leaf"
      />
      {children}
    </label>
  );
}

/** The map's controls: layer, colouring, vectors, filters. Every control is a native button, select or checkbox. */
export function MapControls({
  mode,
  meta,
  settings,
  onChange,
  hasAlong,
}: {
  mode: MapMode;
  meta: MapMeta;
  settings: MapSettings;
  onChange: (next: MapSettings) => void;
  hasAlong: boolean;
}) {
  const set = <K extends keyof MapSettings>(k: K, v: MapSettings[K]) => onChange({ ...settings, [k]: v });
  const setCode = (name: DictName, value: string) =>
    onChange({
      ...settings,
      filter: { ...settings.filter, codes: { ...settings.filter.codes, [name]: value === "" ? null : Number(value) } },
    });
  const anyFilter =
    settings.filter.onlyOut || Object.values(settings.filter.codes).some((v) => v !== null && v !== undefined);
  const metrics: ErrorMetric[] = hasAlong ? ["radial", "cross", "along"] : ["radial"];
  return (
    <form
      className="grid content-start gap-4"
      aria-label="Map controls"
      onSubmit={(e) => e.preventDefault()}
      data-testid="map-controls"
    >
      <fieldset>
        <legend className={labelCls}>Show</legend>
        <div className="flex gap-1">
          <Toggle pressed={settings.layer === "points"} onClick={() => set("layer", "points")} testId="layer-points">
            Plants
          </Toggle>
          <Toggle pressed={settings.layer === "cells"} onClick={() => set("layer", "cells")} testId="layer-cells">
            {mode === "grower" ? "Heatmap" : "Cells"}
          </Toggle>
        </div>
      </fieldset>

      {settings.layer === "cells" ? (
        <>
          <div>
            <label htmlFor="map-cell-value" className={labelCls}>
              Cell colour
            </label>
            <select
              id="map-cell-value"
              className={selectCls}
              value={settings.cellValue}
              onChange={(e) => set("cellValue", e.target.value as MapSettings["cellValue"])}
            >
              <option value="share-out" disabled={!meta.profile}>
                Share out of tolerance
              </option>
              <option value="mean">Mean error</option>
            </select>
          </div>
          <div>
            <label htmlFor="map-cell-length" className={labelCls}>
              Cell length along the row
            </label>
            <select
              id="map-cell-length"
              className={selectCls}
              value={settings.cellLengthM}
              onChange={(e) => set("cellLengthM", Number(e.target.value))}
            >
              {CELL_LENGTHS.map((m) => (
                <option key={m} value={m}>
                  {m} m
                </option>
              ))}
            </select>
          </div>
        </>
      ) : null}

      {settings.layer === "points" || settings.cellValue === "mean" ? (
        <div>
          <label htmlFor="map-metric" className={labelCls}>
            Colour by
          </label>
          <select
            id="map-metric"
            className={selectCls}
            value={settings.metric}
            onChange={(e) => set("metric", e.target.value as ErrorMetric)}
          >
            {metrics.map((m) => (
              <option key={m} value={m}>
                {METRIC_LABEL[m]}
              </option>
            ))}
          </select>
        </div>
      ) : null}

      {settings.layer === "points" && mode === "audit" ? (
        <div className="grid gap-2">
          <Check id="map-vectors" checked={settings.vectors} onChange={(v) => set("vectors", v)}>
            Error vectors
          </Check>
          <div>
            <label htmlFor="map-exaggeration" className={labelCls}>
              Vector length
            </label>
            <select
              id="map-exaggeration"
              className={selectCls}
              disabled={!settings.vectors}
              value={settings.exaggeration}
              onChange={(e) => set("exaggeration", Number(e.target.value))}
            >
              {EXAGGERATIONS.map((x) => (
                <option key={x} value={x}>
                  ×{x}
                </option>
              ))}
            </select>
          </div>
          <Check id="map-unpaired" checked={settings.showUnpaired} onChange={(v) => set("showUnpaired", v)}>
            Unpaired points
          </Check>
        </div>
      ) : null}

      <fieldset className="grid gap-2 border-t border-chalk-line pt-3">
        <legend className="sr-only">Filters</legend>
        <Check
          id="map-only-out"
          checked={settings.filter.onlyOut}
          disabled={!meta.profile}
          onChange={(v) => onChange({ ...settings, filter: { ...settings.filter, onlyOut: v } })}
        >
          Only out of tolerance
        </Check>
        {(mode === "grower" ? (["bed"] as DictName[]) : FILTERS)
          .filter((name) => meta.dict[name].length > 0)
          .map((name) => (
            <div key={name}>
              <label htmlFor={`map-filter-${name}`} className={labelCls}>
                {FILTER_LABEL[name]}
              </label>
              <select
                id={`map-filter-${name}`}
                className={selectCls}
                value={settings.filter.codes[name] ?? ""}
                onChange={(e) => setCode(name, e.target.value)}
              >
                <option value="">All</option>
                {meta.dict[name].map((v, i) => (
                  <option key={v} value={i}>
                    {v}
                  </option>
                ))}
              </select>
            </div>
          ))}
        <button
          type="button"
          disabled={!anyFilter}
          onClick={() => onChange({ ...settings, filter: { codes: {}, onlyOut: false } })}
          className="min-h-11 rounded-plot border border-ink-faint bg-white px-2 py-1.5 text-sm disabled:text-ink-faint lg:min-h-9"
        >
          Clear filters
        </button>
        {(["arm", "fix", "day"] as const).some(
          (n) => settings.filter.codes[n] !== null && settings.filter.codes[n] !== undefined,
        ) || settings.filter.onlyOut ? (
          <p className="text-xs text-ink-faint">
            Unpaired points carry no arm, fix, day or verdict, so they are hidden while these filters are on.
          </p>
        ) : null}
      </fieldset>
    </form>
  );
}
