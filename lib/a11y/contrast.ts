/**
 * Colour contrast as WCAG 2.2 defines it (success criteria 1.4.3, 1.4.6 and 1.4.11; definitions "relative
 * luminance" and "contrast ratio"). Colours are 8-bit sRGB written "#rrggbb" or "#rgb".
 */

export type Rgb = readonly [number, number, number];

/** "#2f6b45" or "#fff" → [47, 107, 69]; throws on anything else. */
export function parseHex(hex: string): Rgb {
  const m = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(hex.trim());
  if (!m) throw new Error(`contrast: "${hex}" is not a colour of the form #rrggbb or #rgb`);
  const h = m[1].length === 3 ? [...m[1]].map((c) => c + c).join("") : m[1];
  return [Number.parseInt(h.slice(0, 2), 16), Number.parseInt(h.slice(2, 4), 16), Number.parseInt(h.slice(4, 6), 16)];
}

/** One sRGB channel (0–255) in linear light (0–1), by the piecewise curve of the WCAG 2.2 definition. */
function linear(channel8: number): number {
  const c = channel8 / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/**
 * Relative luminance, 0 for black to 1 for white: L = 0.2126 R + 0.7152 G + 0.0722 B of the linearised channels
 * (WCAG 2.2, definition "relative luminance"). Example: relativeLuminance("#ffffff") === 1.
 */
export function relativeLuminance(colour: string | Rgb): number {
  const [r, g, b] = typeof colour === "string" ? parseHex(colour) : colour;
  return 0.2126 * linear(r) + 0.7152 * linear(g) + 0.0722 * linear(b);
}

/**
 * Contrast ratio (L1 + 0.05) / (L2 + 0.05), L1 the lighter colour's relative luminance; from 1 (same colour) to 21
 * (black on white). Order of the arguments does not matter (WCAG 2.2, definition "contrast ratio").
 */
export function contrastRatio(a: string | Rgb, b: string | Rgb): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}

/** WCAG 2.2 AA minimums: body text (1.4.3), large text (1.4.3) and user-interface parts and graphics (1.4.11). */
export const AA = { text: 4.5, largeText: 3, nonText: 3 } as const;

/** A colour mixed over an opaque background at `alpha` (0–1), as a browser composites it, rounded to 8 bits. */
export function over(foreground: string | Rgb, alpha: number, background: string | Rgb): Rgb {
  if (!(alpha >= 0 && alpha <= 1)) throw new Error(`contrast: alpha ${alpha} is outside 0–1`);
  const f = typeof foreground === "string" ? parseHex(foreground) : foreground;
  const b = typeof background === "string" ? parseHex(background) : background;
  return [0, 1, 2].map((i) => Math.round(f[i] * alpha + b[i] * (1 - alpha))) as unknown as Rgb;
}
