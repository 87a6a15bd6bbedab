/**
 * Phasebook's theme, loaded by src/styles/index.css through Tailwind 4's @config.
 * Neutral greys carry the interface; the two accents stand for the two liquid phases of a
 * liquid|liquid cell: `aqueous` (cool teal-blue) for primary actions, links and confirmed
 * bookings, `organic` (warm ochre) for highlights, runs in progress and stock warnings. Semantic
 * scales (danger, warning, ok) always travel with words in the UI, never colour alone.
 *
 * Every colour is a CSS variable (`--pb-<scale>-<step>`) written by the plugin below: the light
 * values by default and the dark ones under `prefers-color-scheme: dark`, so every class
 * (`bg-white`, `text-grey-600`, `bg-aqueous-700`…) follows the system setting without a `dark:`
 * variant anywhere. In the dark set the accent scales run the other way round (50 is the deepest
 * tint, 900 the lightest), so a pair chosen for contrast in light mode keeps it in dark mode;
 * the greys have their own dark steps, checked by the axe walk in both schemes.
 */
import type { Config } from "tailwindcss";
import plugin from "tailwindcss/plugin";

type Scale = Record<string, string>;

const light: Record<string, Scale> = {
  grey: {
    50: "#f6f7f8",
    100: "#eceef0",
    200: "#dcdfe3",
    300: "#c3c8ce",
    400: "#9aa1a9",
    500: "#68707a",
    600: "#5a626b",
    700: "#454c54",
    800: "#2f353b",
    900: "#1f2428",
    950: "#14181b",
  },
  aqueous: {
    50: "#eef7f9",
    100: "#d4ecf1",
    200: "#aad7e2",
    300: "#77bccd",
    400: "#3f9cb2",
    500: "#267f96",
    600: "#1d677c",
    700: "#1b5668",
    800: "#1a4756",
    900: "#173b48",
  },
  organic: {
    50: "#fcf8ee",
    100: "#f7edd0",
    200: "#eed9a0",
    300: "#e2bd69",
    400: "#d3a040",
    500: "#bf8526",
    600: "#9f6a1e",
    700: "#7f521c",
    800: "#68431d",
    900: "#57381b",
  },
  danger: {
    50: "#fdf3f2",
    100: "#fbe3e0",
    200: "#f6c6c0",
    300: "#ee9e95",
    400: "#e06b5e",
    500: "#cc4637",
    600: "#b0362a",
    700: "#912d24",
    800: "#762822",
    900: "#622520",
  },
  warning: {
    50: "#fefbe8",
    100: "#fdf4c4",
    200: "#fbe78c",
    300: "#f6d24a",
    400: "#ebbb1f",
    500: "#d3a012",
    600: "#a97a0c",
    700: "#865d0f",
    800: "#6e4b13",
    900: "#5d3f15",
  },
  ok: {
    50: "#f0f8f2",
    100: "#dbefe0",
    200: "#b8dec3",
    300: "#89c59d",
    400: "#56a673",
    500: "#378957",
    600: "#296e45",
    700: "#23583a",
    800: "#1f4731",
    900: "#1b3b2a",
  },
};

/** The dark greys: a deep page, lifted surfaces, and text steps that keep 4.5:1 on both. */
const darkGrey: Scale = {
  50: "#121518",
  100: "#22282d",
  200: "#30373d",
  300: "#454d55",
  400: "#6b747d",
  500: "#949ca5",
  600: "#adb4bb",
  700: "#c5cad0",
  800: "#dde0e4",
  900: "#eef0f2",
  950: "#f6f7f8",
};

const STEPS = ["50", "100", "200", "300", "400", "500", "600", "700", "800", "900"];
/** An accent scale turned round for dark surfaces: 50 ↔ 900, 100 ↔ 800 … */
const mirrored = (scale: Scale): Scale => Object.fromEntries(STEPS.map((step, i) => [step, scale[STEPS[STEPS.length - 1 - i]]!]));

const dark: Record<string, Scale> = {
  grey: darkGrey,
  ...Object.fromEntries(Object.entries(light).filter(([name]) => name !== "grey").map(([name, scale]) => [name, mirrored(scale)])),
};

/** `white` is the surface colour: cards, inputs, the bars; in dark mode a lifted dark grey. */
const SURFACE = { light: "#ffffff", dark: "#1a1f23" };

const variables = (palettes: Record<string, Scale>, surface: string) => ({
  "--pb-white": surface,
  ...Object.fromEntries(Object.entries(palettes).flatMap(([name, scale]) => Object.entries(scale).map(([step, hex]) => [`--pb-${name}-${step}`, hex]))),
});

const colours = Object.fromEntries(
  Object.entries(light).map(([name, scale]) => [name, Object.fromEntries(Object.keys(scale).map((step) => [step, `var(--pb-${name}-${step})`]))]),
);

const config: Config = {
  // The server writes the frame's outline into signed-in page loads (server/http/page-boot.ts).
  content: ["./index.html", "./src/**/*.{ts,tsx}", "./server/http/page-boot.ts"],
  theme: {
    extend: {
      colors: { ...colours, white: "var(--pb-white)" },
      fontFamily: {
        sans: ["IBM Plex Sans", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ["IBM Plex Mono", "ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
    },
  },
  plugins: [
    plugin(({ addBase }) => {
      addBase({
        ":root": { ...variables(light, SURFACE.light), colorScheme: "light dark" },
        "@media (prefers-color-scheme: dark)": { ":root": variables(dark, SURFACE.dark) },
      });
    }),
  ],
};

export default config;

