import { createRequire } from "node:module";
import path from "node:path";
import { fileURLToPath, URL } from "node:url";
import { defineConfig } from "vitest/config";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { compression } from "vite-plugin-compression2";
import type { Plugin } from "vite";

// In development the API listens on API_PORT beside Vite (npm run dev) and Vite proxies /api.
const apiPort = Number(process.env.API_PORT ?? 3000);
const alias = {
  "@shared": fileURLToPath(new URL("./shared", import.meta.url)),
  "@": fileURLToPath(new URL("./src", import.meta.url)),
};

/**
 * The router's production build for the client build. react-router ships it beside its
 * development build (dist/production, the same code with its development warnings and checks
 * off) but its package exports name only the development files, which would otherwise go to
 * every visitor: checks that run on each navigation and their messages.
 */
function reactRouterProduction(): Plugin {
  const dir = path.join(path.dirname(createRequire(import.meta.url).resolve("react-router/package.json")), "dist", "production");
  const files: Record<string, string> = { "react-router": "index.mjs", "react-router/dom": "dom-export.mjs" };
  return {
    name: "phasebook-react-router-production",
    apply: "build",
    enforce: "pre",
    resolveId: (id) => (files[id] ? path.join(dir, files[id]) : null),
  };
}

/**
 * Preloads fonts by their hashed names in the build. Only IBM Plex Sans 400, the face of almost
 * all text: it then arrives with the first scripts and body text is set in Plex from the start.
 * The other weights swap in when used (font-display: swap); preloading them too would take
 * bandwidth the first screen's scripts need on a slow link.
 */
function preloadFonts(pattern: RegExp): Plugin {
  return {
    name: "phasebook-preload-fonts",
    apply: "build",
    transformIndexHtml: {
      order: "post",
      handler: (_html, ctx) =>
        Object.keys(ctx.bundle ?? {})
          .filter((file) => pattern.test(file))
          .sort()
          .map((file) => ({
            tag: "link",
            attrs: { rel: "preload", href: `/${file}`, as: "font", type: "font/woff2", crossorigin: "" },
            injectTo: "head" as const,
          })),
    },
  };
}

/**
 * Marks the chunks every first screen runs with V8's explicit compile hint
 * (`//# allFunctionsCalledOnLoad`, Chrome 136 and later; other engines read a comment): their
 * functions are compiled while the file streams in, on a background thread, instead of one by
 * one on the main thread the first time each is called, which is where a slow phone spends much
 * of its start-up. Only for chunks whose functions nearly all run on load (React, the router,
 * zod and the schemas being built); hinting everything would compile code that never runs.
 */
function compileHints(chunks: RegExp): Plugin {
  return {
    name: "phasebook-compile-hints",
    apply: "build",
    // After minification (which drops comments); the source map moves down the one added line,
    // in the chunk's map and in the .map file already written for it.
    generateBundle(_options, bundle) {
      for (const chunk of Object.values(bundle)) {
        if (chunk.type !== "chunk" || !chunks.test(chunk.name)) continue;
        chunk.code = `//# allFunctionsCalledOnLoad\n${chunk.code}`;
        if (chunk.map) chunk.map.mappings = `;${chunk.map.mappings}`;
        const mapFile = bundle[`${chunk.fileName}.map`];
        if (mapFile?.type === "asset") {
          const map = JSON.parse(String(mapFile.source)) as { mappings: string };
          map.mappings = `;${map.mappings}`;
          mapFile.source = JSON.stringify(map);
        }
      }
    },
  };
}

const DATA_MODULES = /node_modules[\\/]zod[\\/]|[\\/]shared[\\/]schemas[\\/]|[\\/]src[\\/](features[\\/][\w-]+[\\/]api|app[\\/]loaders[\\/][\w-]+-data\.ts$)|[\\/]src[\\/]lib[\\/]format\.ts$/;
const SHELL_MODULES = /[\\/]src[\\/](components[\\/](ui|brand|errors)[\\/](?!table\.tsx)|lib[\\/](?!format\.ts)|config[\\/]|hooks[\\/]|layouts[\\/](auth-layout|public-demo-banner)\.tsx|app[\\/]loaders[\\/]load\.ts)/;

/**
 * The data chunks, by area: a page evaluates the schemas of its own area (and zod and the shared
 * ones), not every schema of the app; building them costs main-thread time before the page's
 * first queries can start. Earlier groups take a module first (with what it imports).
 */
const DATA_AREAS: [string, RegExp][] = [
  // With the screens' heads (shared/screens.ts): every signed-in screen loads this chunk.
  ["data", /node_modules[\\/]zod[\\/]|[\\/]shared[\\/]schemas[\\/](common|auth|facility)\.ts$|[\\/]src[\\/]lib[\\/]format\.ts$|[\\/]shared[\\/]screens\.ts$/],
  // Each area's schemas apart from its queries: they need only zod, so the page runs them as soon
  // as they arrive, while the libraries are still on the way (server/http/page-boot.ts).
  ["schemas-schedule", /[\\/]shared[\\/]schemas[\\/](bookings|instruments|setups|training|reports)\.ts$/],
  ["data-schedule", /[\\/]features[\\/](schedule|instruments|training)[\\/]api[\\/]|[\\/]loaders[\\/]schedule-data\.ts$/],
  ["schemas-stock", /[\\/]shared[\\/]schemas[\\/](stock|storage|safety|ions|labels)\.ts$/],
  ["data-stock", /[\\/]features[\\/](stockroom|safety)[\\/]api[\\/]|[\\/]features[\\/]labels[\\/]api[\\/](get-label-stocks|keys)\.ts$|[\\/]loaders[\\/](stockroom|safety)-data\.ts$/],
  // The scan's and the run plans' schemas (the ion table among them): large, and no first screen
  // needs them. Printing labels is a Stockroom action: its schemas and query are in data-stock.
  ["data-plans", /[\\/]shared[\\/]schemas[\\/](scan|ion-table|run-plans|run-plan-records)\.ts$|[\\/]features[\\/](labels|run-plans)[\\/]api[\\/]|[\\/]loaders[\\/]labels-data\.ts$/],
  ["data-office", DATA_MODULES],
];

export default defineConfig({
  plugins: [
    reactRouterProduction(),
    react(),
    tailwindcss(),
    compileHints(/^(framework|data|schemas-schedule|data-schedule|schemas-stock|data-stock|shell)$/),
    preloadFonts(/ibm-plex-sans-latin-400-normal-[\w-]+\.woff2$/),
    // Brotli and gzip copies of every script, style sheet and SVG beside it, served by
    // express-static-gzip with the matching Content-Encoding (server/app.ts).
    compression({ algorithms: ["brotliCompress", "gzip"], include: /\.(js|mjs|css|svg|json)$/, exclude: [/\.map$/, /\.vite[\\/]/], threshold: 1024 }),
  ],
  resolve: { alias },
  server: {
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { "/api": { target: `http://127.0.0.1:${apiPort}` } },
  },
  build: {
    outDir: "dist",
    sourcemap: true,
    // dist/.vite/manifest.json: which chunks each screen needs. The server preloads the first
    // screen's chunks into each page load (server/http/page-boot.ts); it is never served.
    manifest: true,
    chunkSizeWarningLimit: 1500,
    rolldownOptions: {
      output: {
        // What every page loads first goes in a few chunks instead of a dozen small ones (each
        // request costs a round trip and its headers); everything else stays with its screen.
        codeSplitting: {
          groups: [
            { name: "framework", test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom|@tanstack[\\/](react-query|query-core))[\\/]/, priority: 30 },
            // The date library, only for the screens that do arithmetic on the facility's clock
            // (the Schedule, booking and training forms); showing times needs only Intl.
            { name: "luxon", test: /node_modules[\\/]luxon[\\/]/, priority: 25 },
            // What the signed-in screens' data needs: zod, the shared schemas, each feature's
            // queries and the route loaders, and the facility's clock (luxon). One chunk instead of
            // a dozen small ones: on a slow link each request costs a round trip of its own.
            ...DATA_AREAS.map(([name, test], i) => ({ name, test, priority: 14 - i })),
            // The app's own small pieces that the sign-in page needs too (never zod or a feature).
            { name: "shell", test: SHELL_MODULES, priority: 20 },
          ],
        },
      },
    },
  },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        resolve: { alias },
        test: {
          name: "api",
          include: ["tests/api/**/*.test.ts"],
          environment: "node",
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        plugins: [react()],
        resolve: { alias },
        test: {
          name: "component",
          include: ["tests/component/**/*.test.tsx"],
          environment: "happy-dom",
          globalSetup: ["tests/component/global-setup.ts"],
          setupFiles: ["tests/component/setup.ts"],
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          testTimeout: 90_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
