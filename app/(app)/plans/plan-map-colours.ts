import { COLOURS } from "@/app/_components/map/palette";

type Rgba = [number, number, number, number];

/**
 * The plan map's own symbols, drawn on white (contrast by WCAG 2.2, lib/a11y/contrast.ts; tests/plan-map-colours.test.ts):
 * checkpoints filled leaf discs with an ink edge, spares hollow loam diamonds, control marks ink triangles with their
 * name; every as-planted record a faint ink-faint dot behind them (context only, deliberately below 3:1).
 */
export const PLAN_COLOURS = {
  checkpoint: [47, 107, 69, 255] as Rgba, // leaf #2f6b45
  spare: COLOURS.surveyOnly, // loam #7a4b2a
  mark: COLOURS.ink,
  record: [92, 105, 98, 90] as Rgba, // ink-faint at 35 %
  ground: COLOURS.field,
};

/** The same colours for the HTML key. */
export const PLAN_HEX = { checkpoint: "#2f6b45", spare: "#7a4b2a", mark: "#1d2a24", record: "#5c6962" };
