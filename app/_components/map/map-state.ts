/** The map's settings (what the controls change) and the values every part of the map derives from them. */
import type { ErrorMetric, MapFilter } from "@/lib/map/select";
import type { DictName } from "@/lib/map/types";

export type MapMode = "audit" | "grower";

export interface MapSettings {
  /** Plants one by one, or the growers' cells. */
  layer: "points" | "cells";
  metric: ErrorMetric;
  /** What a cell's colour shows. */
  cellValue: "mean" | "share-out";
  /** Cell length along the row, metres. */
  cellLengthM: number;
  vectors: boolean;
  exaggeration: number;
  /** Planted records without a checkpoint and survey points without a record. */
  showUnpaired: boolean;
  filter: MapFilter;
}

export const EXAGGERATIONS = [10, 20, 50, 100, 200] as const;
export const CELL_LENGTHS = [2, 5, 10, 20] as const;

export const METRIC_LABEL: Record<ErrorMetric, string> = {
  radial: "Radial error",
  cross: "Cross-row error (distance from the row line)",
  along: "Along-row error (distance along the row)",
};

export const FILTER_LABEL: Record<DictName, string> = {
  crop: "Crop",
  arm: "Tool arm",
  bed: "Bed",
  row: "Row",
  fix: "GNSS fix",
  day: "Planting day",
};

/** Filters offered in the controls (row is implied by bed and arm). */
export const FILTERS: DictName[] = ["crop", "bed", "arm", "fix", "day"];

/** Above this many checkpoints the error vectors start switched off: they would double the work of every frame. */
export const VECTORS_BY_DEFAULT_UP_TO = 20_000;

export function initialSettings(mode: MapMode, pairs: number): MapSettings {
  return {
    layer: mode === "grower" ? "cells" : "points",
    metric: "radial",
    cellValue: mode === "grower" ? "share-out" : "mean",
    cellLengthM: 5,
    vectors: mode === "audit" && pairs <= VECTORS_BY_DEFAULT_UP_TO,
    exaggeration: 50,
    showUnpaired: true,
    filter: { codes: {}, onlyOut: false },
  };
}
