/** Plotproof palette (tailwind.config.ts) as deck.gl RGBA colours, and the symbol shapes of the map. */
import { OUT_OF_TOLERANCE_RGB } from "@/lib/map/colour-scale";

type Rgba = [number, number, number, number];

export const COLOURS = {
  ink: [29, 42, 36, 255] as Rgba,
  inkSoft: [68, 82, 75, 255] as Rgba,
  inkFaint: [92, 105, 98, 255] as Rgba,
  ring: [92, 105, 98, 204] as Rgba, // records without a checkpoint: quiet grey at 80 %, still 3.2:1 on a bed
  // A thin dark edge round every checkpoint, so the light (high-error) end of viridis stays visible on a bed.
  pointOutline: [29, 42, 36, 255] as Rgba,
  chalkLine: [217, 211, 196, 255] as Rgba,
  field: [255, 255, 255, 255] as Rgba,
  bed: [241, 228, 216, 255] as Rgba, // loam pale
  row: [122, 75, 42, 110] as Rgba, // loam, translucent
  vector: [29, 42, 36, 200] as Rgba,
  surveyOnly: [122, 75, 42, 255] as Rgba, // loam
  ambiguous: [156, 107, 12, 255] as Rgba, // stake deep: 3.7:1 on a bed, where stake itself gave 2.0:1
  selected: [156, 107, 12, 255] as Rgba,
  out: [...OUT_OF_TOLERANCE_RGB, 255] as Rgba, // alarm
};

/** Hex forms for the HTML legend. */
export const HEX = {
  ink: "#1d2a24",
  inkFaint: "#5c6962",
  loam: "#7a4b2a",
  stake: "#9c6b0c",
  alarm: "#b3362b",
  bed: "#f1e4d8",
};

/** Pixel sizes of the point symbols. */
export const SIZES = {
  pairRadius: 3.5,
  outRadius: 6,
  outStroke: 2.5,
  unpairedRadius: 2.5,
  icon: 15,
  pointOutline: 1,
};

/**
 * Icon atlas for deck.gl's IconLayer, drawn on a canvas (no image files, no network): a diamond for surveyed points
 * with no record, a triangle for survey points left ambiguous. Masks, tinted by the layer's colour.
 */
export function shapeAtlas(): {
  url: string;
  mapping: Record<"diamond" | "triangle", { x: number; y: number; width: number; height: number; mask: boolean }>;
} {
  const s = 64;
  const canvas = document.createElement("canvas");
  canvas.width = 2 * s;
  canvas.height = s;
  const g = canvas.getContext("2d")!;
  g.fillStyle = "#000";
  g.beginPath();
  g.moveTo(s / 2, 4);
  g.lineTo(s - 4, s / 2);
  g.lineTo(s / 2, s - 4);
  g.lineTo(4, s / 2);
  g.closePath();
  g.fill();
  g.beginPath();
  g.moveTo(s + s / 2, 6);
  g.lineTo(2 * s - 5, s - 8);
  g.lineTo(s + 5, s - 8);
  g.closePath();
  g.fill();
  return {
    url: canvas.toDataURL("image/png"),
    mapping: {
      diamond: { x: 0, y: 0, width: s, height: s, mask: true },
      triangle: { x: s, y: 0, width: s, height: s, mask: true },
    },
  };
}
