import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { AA, contrastRatio } from "./contrast";
import { HIGH_CONTRAST, PALETTE, tailwindColours, type ColourToken } from "./palette";

// Every pairing the pages use, measured with the WCAG 2.2 contrast ratio (§1.4.3 text, §1.4.11 non-text).
const SURFACES: (ColourToken | "white")[] = [
  "white",
  "chalk",
  "chalk-deep",
  "leaf-pale",
  "loam-pale",
  "stake-pale",
  "alarm-pale",
];
const TEXT: ColourToken[] = ["ink", "ink-soft", "ink-faint", "leaf", "leaf-deep", "loam", "alarm"];
/** Filled controls and badges with white text on them. */
const FILLS: ColourToken[] = ["ink", "leaf", "leaf-deep", "alarm"];

type Scheme = Record<ColourToken, string>;
const SCHEMES: [string, Scheme][] = [
  ["standard", { ...PALETTE }],
  ["high contrast", { ...PALETTE, ...HIGH_CONTRAST } as Scheme],
];
const hex = (scheme: Scheme, t: ColourToken | "white") => (t === "white" ? "#ffffff" : scheme[t]);

describe("palette", () => {
  for (const [name, scheme] of SCHEMES) {
    it(`palette -- ${name}: every text colour on every surface reaches 4.5:1`, () => {
      for (const fg of TEXT)
        for (const bg of SURFACES)
          expect(contrastRatio(scheme[fg], hex(scheme, bg)), `${fg} on ${bg}`).toBeGreaterThanOrEqual(AA.text);
    });

    it(`palette -- ${name}: white text on every filled control reaches 4.5:1`, () => {
      for (const fill of FILLS)
        expect(contrastRatio("#ffffff", scheme[fill]), `white on ${fill}`).toBeGreaterThanOrEqual(AA.text);
    });

    it(`palette -- ${name}: the focus ring and input borders reach 3:1 on every surface`, () => {
      for (const bg of SURFACES) {
        expect(contrastRatio(scheme["stake-deep"], hex(scheme, bg)), `focus ring on ${bg}`).toBeGreaterThanOrEqual(
          AA.nonText,
        );
        expect(contrastRatio(scheme["ink-faint"], hex(scheme, bg)), `input border on ${bg}`).toBeGreaterThanOrEqual(
          AA.nonText,
        );
      }
    });
  }

  it("palette -- the old faint grey failed, the new one passes (the change this module records)", () => {
    // axe-core 4.14.1 reported 3.73:1 for #7b8781 on white and 3.39:1 on chalk
    expect(contrastRatio("#7b8781", "#ffffff")).toBeLessThan(AA.text);
    expect(contrastRatio(PALETTE["ink-faint"], "#ffffff")).toBeGreaterThanOrEqual(AA.text);
    // the old focus ring, stake yellow, failed 3:1 on white
    expect(contrastRatio(PALETTE.stake, "#ffffff")).toBeLessThan(AA.nonText);
  });

  it("palette -- app/globals.css declares exactly these values, standard and high contrast", () => {
    const css = fs.readFileSync(path.resolve(import.meta.dirname, "../../app/globals.css"), "utf8");
    const block = (selector: string) => {
      const start = css.indexOf(`${selector} {`);
      expect(start, selector).toBeGreaterThanOrEqual(0);
      const body = css.slice(start, css.indexOf("}", start));
      return Object.fromEntries([...body.matchAll(/--pp-([a-z-]+):\s*(#[0-9a-f]{6});/g)].map((m) => [m[1], m[2]]));
    };
    expect(block(":root")).toEqual(PALETTE);
    expect(block("html.high-contrast")).toEqual(HIGH_CONTRAST);
  });

  it("tailwindColours -- groups tokens the way Tailwind names them", () => {
    const c = tailwindColours();
    expect(c.ink).toEqual({ DEFAULT: "var(--pp-ink)", soft: "var(--pp-ink-soft)", faint: "var(--pp-ink-faint)" });
    expect(c.stake.deep).toBe("var(--pp-stake-deep)");
  });
});
