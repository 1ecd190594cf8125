import type { Config } from "tailwindcss";
import { tailwindColours } from "./lib/a11y/palette";

// Plotproof's own palette (lib/a11y/palette.ts, as CSS variables so the high-contrast option can swap them) and
// type scale; see DEVELOPERS.md "Visual identity".
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: tailwindColours(),
      fontSize: {
        xs: ["0.75rem", { lineHeight: "1.1rem" }],
        sm: ["0.875rem", { lineHeight: "1.3rem" }],
        base: ["1rem", { lineHeight: "1.5rem" }],
        lg: ["1.25rem", { lineHeight: "1.75rem" }],
        xl: ["1.625rem", { lineHeight: "2.1rem" }],
        "2xl": ["2.125rem", { lineHeight: "2.5rem" }],
      },
      borderRadius: { plot: "3px" },
    },
  },
};

export default config;
