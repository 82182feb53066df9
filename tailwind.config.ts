// Cuspal's own look: a porcelain paper, deep ink, a harbour-teal accent and clay for cautions.
// Every colour that carries meaning is paired with a text label in the UI.
import type { Config } from "tailwindcss";

const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f7f5f0", deep: "#ece8df" },
        ink: { DEFAULT: "#1f2a37", soft: "#3d4856", muted: "#55606e" },
        harbour: { 50: "#e7f3f2", 100: "#c9e4e2", 500: "#138080", 600: "#0d6e6e", 700: "#0a5757", 800: "#083f40" },
        clay: { 50: "#fbefe8", 100: "#f5d6c6", 600: "#a8492a", 700: "#8a3a20" },
        sage: { 50: "#ecf4ee", 600: "#3f7d4e", 700: "#2f623c" },
        ochre: { 50: "#fbf4df", 600: "#8a6a12", 700: "#6e540d" },
        line: "#d9d3c7",
      },
      fontFamily: {
        sans: ["var(--font-geist)", "system-ui", "sans-serif"],
      },
      fontSize: {
        // A 1.2 ratio scale, readable on a 360 px phone.
        xs: ["0.78rem", { lineHeight: "1.1rem" }],
        sm: ["0.875rem", { lineHeight: "1.3rem" }],
        base: ["1rem", { lineHeight: "1.55rem" }],
        lg: ["1.2rem", { lineHeight: "1.7rem" }],
        xl: ["1.44rem", { lineHeight: "1.9rem" }],
        "2xl": ["1.73rem", { lineHeight: "2.2rem" }],
        "3xl": ["2.07rem", { lineHeight: "2.5rem" }],
      },
      spacing: { gutter: "1rem", section: "2.5rem" },
      borderRadius: { card: "0.875rem" },
      maxWidth: { page: "72rem", read: "40rem" },
    },
  },
};

export default config;
