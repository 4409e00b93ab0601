import type { Config } from "tailwindcss";

// Sluice console theme: cool greys for structure, a water blue for action,
// and signal colours that mean one thing each (ok, caution, fault).
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        // faint, ok and caution are dark enough for text at 4.5:1 on every light panel (WCAG 1.4.3, checked by axe).
        ink: { DEFAULT: "#16202a", soft: "#3a4754", faint: "#5c6874" },
        panel: { DEFAULT: "#ffffff", sunk: "#f3f5f7", line: "#d9dee3", deep: "#1d2833" },
        weir: { 50: "#eef7fb", 100: "#d3ebf5", 300: "#7cc0dc", 500: "#1f8ab8", 600: "#17719a", 700: "#115878", 900: "#0a3347" },
        ok: { DEFAULT: "#267544", soft: "#e5f4ea" },
        caution: { DEFAULT: "#8a5800", soft: "#fdf3dc" },
        fault: { DEFAULT: "#b3261e", soft: "#fbe9e7" },
      },
      fontFamily: {
        sans: ["Roboto", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
      fontSize: {
        micro: ["0.6875rem", { lineHeight: "1rem", letterSpacing: "0.02em" }],
        label: ["0.8125rem", { lineHeight: "1.125rem" }],
        body: ["0.875rem", { lineHeight: "1.375rem" }],
        lead: ["1rem", { lineHeight: "1.5rem" }],
        title: ["1.25rem", { lineHeight: "1.75rem", fontWeight: "500" }],
        display: ["1.75rem", { lineHeight: "2.25rem", fontWeight: "500" }],
      },
      borderRadius: { panel: "6px" },
    },
  },
};

export default config;
