/**
 * GET /api/openapi.json (the contract, generated from the route tables) and /api/docs (the same,
 * shown to people by Swagger UI, shipped with the app: no CDN).
 */
import path from "node:path";
import { createRequire } from "node:module";
import express, { Router } from "express";
import { z } from "zod";
import { openApiDocument } from "./openapi";
import { route, WRITTEN, type RouteTable } from "./route-table";

const require = createRequire(import.meta.url);
const SWAGGER_DIR = path.dirname(require.resolve("swagger-ui-dist/package.json"));

const DOCS_PAGE = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Phasebook API</title>
<link rel="stylesheet" href="/api/docs/assets/swagger-ui.css">
</head>
<body>
<main id="api-docs"></main>
<script src="/api/docs/assets/swagger-ui-bundle.js"></script>
<script src="/api/docs/start.js"></script>
</body>
</html>`;

// The areas open folded: a reader picks one of nine instead of scrolling past some 150 routes (the
// viewer also stopped drawing operations part-way down when it was asked to unfold them all).
const START_SCRIPT = `window.ui = SwaggerUIBundle({ url: "/api/openapi.json", dom_id: "#api-docs", deepLinking: true, docExpansion: "none" });`;

/** The description's own routes, declared like every other route so they describe themselves. */
export function apiDescriptionTable(tables: () => RouteTable[], info: { version: string; publicUrl: string }): RouteTable {
  let cached: Record<string, unknown> | null = null;
  return {
    module: "api",
    description: "This description of the API.",
    routes: [
      route({
        method: "get",
        path: "/openapi.json",
        summary: "The OpenAPI 3.1 description of this API",
        access: "public",
        output: z.record(z.string(), z.unknown()),
        handler: () => {
          cached ??= openApiDocument(tables(), { title: "Phasebook API", version: info.version, serverUrl: info.publicUrl });
          return cached;
        },
      }),
      route({
        method: "get",
        path: "/docs",
        summary: "The API description as a web page",
        access: "public",
        produces: "text/html",
        handler: ({ res }) => {
          res.type("html").send(DOCS_PAGE);
          return WRITTEN;
        },
      }),
      route({
        method: "get",
        path: "/docs/start.js",
        summary: "The script that starts the API description page",
        access: "public",
        produces: "text/javascript",
        handler: ({ res }) => {
          res.type("text/javascript").send(START_SCRIPT);
          return WRITTEN;
        },
      }),
    ],
  };
}

/** Swagger UI's own files, from the installed package. */
export function docsAssets(): Router {
  const r = Router();
  r.use("/", express.static(SWAGGER_DIR, { index: false, maxAge: "1d" }));
  return r;
}
