import { describe, expect, it } from "vitest";
import { AA, contrastRatio, over, parseHex, relativeLuminance } from "./contrast";

describe("contrast", () => {
  it("relativeLuminance -- black 0 and white 1", () => {
    // WCAG 2.2 relative luminance definition: "normalized to 0 for darkest black and 1 for lightest white"
    expect(relativeLuminance("#000000")).toBe(0);
    expect(relativeLuminance("#ffffff")).toBeCloseTo(1, 12);
  });

  it("relativeLuminance -- the coefficients of each primary", () => {
    // WCAG 2.2 relative luminance definition: L = 0.2126 R + 0.7152 G + 0.0722 B
    expect(relativeLuminance("#ff0000")).toBeCloseTo(0.2126, 12);
    expect(relativeLuminance("#00ff00")).toBeCloseTo(0.7152, 12);
    expect(relativeLuminance("#0000ff")).toBeCloseTo(0.0722, 12);
  });

  it("relativeLuminance -- the linear part of the curve below 0.04045", () => {
    // WCAG 2.2 relative luminance definition: if RsRGB <= 0.04045 then R = RsRGB/12.92; 10/255 = 0.0392 is below it
    expect(relativeLuminance("#0a0a0a")).toBeCloseTo(10 / 255 / 12.92, 12);
    // 11/255 = 0.0431 is above it: ((RsRGB+0.055)/1.055)^2.4
    expect(relativeLuminance("#0b0b0b")).toBeCloseTo(((11 / 255 + 0.055) / 1.055) ** 2.4, 12);
  });

  it("contrastRatio -- black on white is 21:1, a colour on itself 1:1, order does not matter", () => {
    // WCAG 2.2 §1.4.3 / contrast ratio definition: (L1 + 0.05) / (L2 + 0.05), ranging from 1 to 21
    expect(contrastRatio("#000", "#fff")).toBeCloseTo(21, 10);
    expect(contrastRatio("#2f6b45", "#2f6b45")).toBe(1);
    expect(contrastRatio("#fff", "#767676")).toBeCloseTo(contrastRatio("#767676", "#fff"), 12);
  });

  it("contrastRatio -- mid grey #767676 on white just passes 4.5:1 and #777777 just fails", () => {
    // common practice, no source: #767676 is the lightest grey that passes AA on white (4.54:1); #777777 gives 4.48:1
    expect(contrastRatio("#767676", "#ffffff")).toBeCloseTo(4.54, 2);
    expect(contrastRatio("#767676", "#ffffff")).toBeGreaterThanOrEqual(AA.text);
    expect(contrastRatio("#777777", "#ffffff")).toBeCloseTo(4.48, 2);
    expect(contrastRatio("#777777", "#ffffff")).toBeLessThan(AA.text);
  });

  it("contrastRatio -- agrees with axe-core 4.14.1 on the colours it flagged in our pages", () => {
    // axe-core 4.14.1 color-contrast rule as independent oracle (tests/e2e/accessibility.spec.ts, before the fix)
    expect(contrastRatio("#7b8781", "#ffffff")).toBeCloseTo(3.73, 2);
    expect(contrastRatio("#7b8781", "#f6f4ee")).toBeCloseTo(3.39, 2);
    // axe-core 4.14.1 link-in-text-block rule: leaf link inside ink-soft text
    expect(contrastRatio("#2f6b45", "#44524b")).toBeCloseTo(1.29, 1);
  });

  it("over -- alpha compositing, then the ratio of the result", () => {
    expect(over("#000000", 0.5, "#ffffff")).toEqual([128, 128, 128]);
    expect(over("#b3362b", 1, "#ffffff")).toEqual(parseHex("#b3362b"));
    expect(over("#b3362b", 0, "#ffffff")).toEqual([255, 255, 255]);
    expect(() => over("#000", 1.5, "#fff")).toThrow(/alpha 1.5 is outside 0–1/);
  });

  it("parseHex -- short and long forms; a clear message for anything else", () => {
    expect(parseHex("#fff")).toEqual([255, 255, 255]);
    expect(parseHex("#2F6B45")).toEqual([47, 107, 69]);
    expect(() => parseHex("green")).toThrow('contrast: "green" is not a colour of the form #rrggbb or #rgb');
  });
});
