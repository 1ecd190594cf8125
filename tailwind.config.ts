import type { Config } from "tailwindcss";

// Plotproof's own palette and type scale; see DEVELOPERS.md "Visual identity".
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: "#1d2a24", soft: "#44524b", faint: "#7b8781" },
        chalk: { DEFAULT: "#f6f4ee", deep: "#ebe7dc", line: "#d9d3c4" },
        leaf: { DEFAULT: "#2f6b45", deep: "#214d31", pale: "#dcebdf" },
        loam: { DEFAULT: "#7a4b2a", pale: "#f1e4d8" },
        stake: { DEFAULT: "#d99a1e", pale: "#fbf0d6" },
        alarm: { DEFAULT: "#b3362b", pale: "#f8e0dc" },
      },
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
