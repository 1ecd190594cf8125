/**
 * Plotproof's colour tokens, the one list tailwind.config.ts and app/globals.css are built from (see DEVELOPERS.md
 * "Visual identity"). Utilities read them as CSS variables `--pp-<name>`, so the high-contrast option (a class on
 * <html>) can swap values without another stylesheet. palette.test.ts measures every pairing the pages use.
 */

export const PALETTE = {
  ink: "#1d2a24",
  "ink-soft": "#44524b",
  // Was #7b8781 (3.0–3.7:1): darkened along the same grey-green so metadata, hints and headers reach 4.5:1.
  "ink-faint": "#5c6962",
  chalk: "#f6f4ee",
  "chalk-deep": "#ebe7dc",
  "chalk-line": "#d9d3c4",
  leaf: "#2f6b45",
  "leaf-deep": "#214d31",
  "leaf-pale": "#dcebdf",
  loam: "#7a4b2a",
  "loam-pale": "#f1e4d8",
  stake: "#d99a1e",
  // The stake yellow deepened for what must stand out against light surfaces: the focus ring, thin marks.
  "stake-deep": "#9c6b0c",
  "stake-pale": "#fbf0d6",
  alarm: "#b3362b",
  "alarm-pale": "#f8e0dc",
} as const;

export type ColourToken = keyof typeof PALETTE;

/**
 * Bright sunlight: every grey text turns ink, surfaces turn white, rules and borders turn dark, the focus ring
 * thickens (globals.css). Only the tokens listed change.
 */
export const HIGH_CONTRAST: Partial<Record<ColourToken, string>> = {
  "ink-soft": "#1d2a24",
  "ink-faint": "#1d2a24",
  chalk: "#ffffff",
  "chalk-deep": "#f2f2f2",
  "chalk-line": "#1d2a24",
  leaf: "#1f5234",
  "leaf-deep": "#163b24",
  alarm: "#9c2a20",
  "stake-deep": "#7a5200",
};

/** The class on <html> that turns the high-contrast values on, and the localStorage key that remembers it. */
export const HIGH_CONTRAST_CLASS = "high-contrast";
export const HIGH_CONTRAST_STORAGE_KEY = "plotproof:high-contrast";

/**
 * Runs before the page paints (root layout): puts the high-contrast class on <html> when this browser chose it, so a
 * page never flashes in the standard colours first.
 */
export const HIGH_CONTRAST_BOOT = `try{if(localStorage.getItem(${JSON.stringify(HIGH_CONTRAST_STORAGE_KEY)})==="1")document.documentElement.classList.add(${JSON.stringify(HIGH_CONTRAST_CLASS)})}catch(e){}`;

/** The Tailwind colour map: `text-ink-soft` → `var(--pp-ink-soft)`, grouped as Tailwind expects. */
export function tailwindColours(): Record<string, Record<string, string>> {
  const out: Record<string, Record<string, string>> = {};
  for (const name of Object.keys(PALETTE)) {
    const [group, shade] = name.split("-") as [string, string | undefined];
    out[group] ??= {};
    out[group][shade ?? "DEFAULT"] = `var(--pp-${name})`;
  }
  return out;
}

/** The CSS custom properties of a set of tokens, e.g. "--pp-ink: #1d2a24;". */
export function cssVariables(tokens: Partial<Record<ColourToken, string>>): string {
  return Object.entries(tokens)
    .map(([name, hex]) => `--pp-${name}: ${hex};`)
    .join(" ");
}
