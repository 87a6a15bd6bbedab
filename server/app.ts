/**
 * createApp(deps): middleware, routers, the JSON 404 under /api, the built client (its hashed
 * assets, and index.html for page loads only), and the one error handler. main.ts is the only
 * file that listens. Answers are compressed when the client asks: the build's assets come
 * pre-compressed (brotli and gzip files written by the Vite build), everything else is
 * compressed on the fly by the `compression` middleware.
 */
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import express, { type Express } from "express";
import session from "express-session";
import helmet from "helmet";
import compression from "compression";
import expressStaticGzip from "express-static-gzip";
import { pinoHttp } from "pino-http";
import type { AppDeps, Ctx } from "./context";
import { createPassport, createSignIn, DbSessionStore, SESSION_COOKIE } from "./modules/people";
import { apiNotFound, errorHandler, sendProblem } from "./middleware/problem";
import { buildMounts, listRoutes } from "./http/router";
import { createCsrf } from "./http/csrf";
import { apiDescriptionTable, docsAssets } from "./http/api-description";
import type { RouteTable } from "./http/route-table";
import { ROUTE_TABLES } from "./modules";
import { facilitySettings } from "./modules/system";
import { WARM_UP_SOURCE, createPageBoot } from "./http/page-boot";

/**
 * The request line and headers a server takes, in bytes: 64 KiB instead of Node's 16 KiB, so a
 * list's search of 10,000 characters in any script (up to 12 bytes each once in the URL) fits.
 * Pass it to http.createServer wherever the app listens.
 */
export const MAX_HEADER_BYTES = 64 * 1024;

/** Paths that a foreign service calls without a browser session, so they carry no CSRF token. */
const CSRF_EXEMPT = [/^\/api\/webhooks\//];

/**
 * Only a page load gets the client's index.html: a GET that asks for HTML, or one with no
 * preference (any type, as curl sends) for a path without a file extension. A script, style, image
 * or JSON request for a path that is not there gets a 404.
 */
function isNavigation(req: express.Request): boolean {
  if (req.method !== "GET" && req.method !== "HEAD") return false;
  const accept = req.get("accept") ?? "*/*";
  if (accept.includes("text/html")) return true;
  const last = req.path.split("/").pop() ?? "";
  return /^\s*\*\/\*\s*(;.*)?$/.test(accept) && !last.includes(".");
}

export interface CreatedApp {
  app: Express;
  ctx: Ctx;
  sessionStore: DbSessionStore;
  /** "METHOD /api/path" of every API route, for the role-matrix test. */
  routes: string[];
  /** Every route table the app serves, the API description's own included. */
  tables: RouteTable[];
}

export function createApp(deps: AppDeps): CreatedApp {
  const secureCookies = deps.config.PUBLIC_URL.startsWith("https://");
  const passport = createPassport(deps);
  const csrf = createCsrf({
    sessionSecret: deps.config.SESSION_SECRET,
    secureCookies,
    skip: (req) => CSRF_EXEMPT.some((re) => re.test(req.originalUrl)),
  });
  const ctx: Ctx = {
    ...deps,
    now: () => deps.clock.now(),
    signIn: createSignIn(deps, passport, csrf),
  };
  const app = express();

  app.disable("x-powered-by");
  app.set("trust proxy", "loopback");
  // The built client's hashed assets come first, before the security headers meant for pages and
  // the API, the logger and the session: a script or style sheet needs only nosniff and its
  // cross-origin rule, and the first screen loads a dozen of them, so header bytes add up on a
  // slow link (and a rolling session would be re-saved for each). Vite's hashed bundles never
  // change under their name; a missing one is a 404, never the page (a browser would otherwise
  // run the HTML as a script after a deploy).
  const staticDir = deps.staticDir === undefined ? path.resolve("dist") : deps.staticDir;
  const clientBuilt = Boolean(staticDir && fs.existsSync(path.join(staticDir, "index.html")));
  if (staticDir && clientBuilt) {
    app.use("/assets", (_req, res, next) => {
      res.setHeader("X-Content-Type-Options", "nosniff");
      res.setHeader("Cross-Origin-Resource-Policy", "same-origin");
      next();
    });
    // The build writes name.br and name.gz beside each asset; the best one the client accepts is
    // sent with its Content-Encoding and `Vary: Accept-Encoding`.
    app.use(
      "/assets",
      expressStaticGzip(path.join(staticDir, "assets"), {
        enableBrotli: true,
        orderPreference: ["br", "gzip"],
        index: false,
        serveStatic: { index: false, immutable: true, maxAge: "1y", fallthrough: true },
      }),
    );
    app.use("/assets", (req, res) => sendProblem(res, 404, "no_such_file", `There is no file ${req.originalUrl.split("?")[0]}.`));
  }

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          "default-src": ["'self'"],
          "img-src": ["'self'", "data:", "blob:"],
          "media-src": ["'self'", "blob:"],
          // FullCalendar and React set inline styles at run time.
          "style-src": ["'self'", "'unsafe-inline'"],
          // The one inline line a signed-in page carries (page-boot.ts), by its hash.
          "script-src": ["'self'", WARM_UP_SOURCE],
          "connect-src": ["'self'"],
          // FullCalendar ships its arrow icons as an embedded (data:) font.
          "font-src": ["'self'", "data:"],
          "frame-ancestors": ["'none'"],
          "upgrade-insecure-requests": secureCookies ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
      hsts: secureCookies,
    }),
  );
  // Brotli or gzip on the fly for the API's JSON and index.html; a pre-compressed asset already
  // carries its Content-Encoding and is passed through. Brotli at quality 4 costs about what gzip
  // does and saves more; small answers (< 1 kB) are not worth the CPU.
  app.use(compression({ threshold: 1024, brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4 } } }));
  // A silent request logger would still build a child logger and listeners per request.
  const logLevel = deps.quiet ? "silent" : deps.config.LOG_LEVEL;
  if (logLevel !== "silent") {
    app.use(
      pinoHttp({
        level: logLevel,
        redact: ["req.headers.cookie", "req.headers['x-csrf-token']", "res.headers['set-cookie']"],
        autoLogging: { ignore: (req) => req.url === "/api/health" },
      }),
    );
  }

  // Raw body for signed webhooks (the signature covers the exact bytes); JSON everywhere else.
  app.use("/api/webhooks", express.raw({ type: "*/*", limit: "1mb" }));
  app.use("/api", express.json({ limit: "200kb" }));

  // Session expiry follows the wall clock, not the app clock that tests fix. A session is written
  // only when someone signs in (saveUninitialized: false; the CSRF token lives in its own cookie).
  const sessionStore = new DbSessionStore(deps.ds);
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: deps.config.SESSION_SECRET,
      store: sessionStore,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: "lax", secure: secureCookies, maxAge: 12 * 60 * 60 * 1000 },
    }),
  );
  app.use(passport.initialize());
  app.use(passport.session());
  app.use("/api", csrf.protect);

  const tables: RouteTable[] = [
    ...ROUTE_TABLES,
    apiDescriptionTable(() => tables, { version: deps.version ?? "dev", publicUrl: deps.config.PUBLIC_URL }),
  ];
  const mounts = buildMounts(ctx, tables);
  app.use("/api/docs/assets", docsAssets());
  for (const { path: p, router } of mounts) app.use(`/api${p}`, router);
  app.use("/api", apiNotFound);

  if (staticDir && clientBuilt) {
    // The build's other files, and index.html for page loads only, with this load's session,
    // facility and first screen's code written into it (page-boot.ts). It names the person, so
    // it is private to this browser and asked for again on every load.
    const pageBoot = createPageBoot(staticDir);
    const facility = facilitySettings(deps.config);
    app.use(express.static(staticDir, { index: false, maxAge: "1h" }));
    app.get("/{*splat}", (req, res, next) => {
      if (!isNavigation(req)) return next();
      res.setHeader("Cache-Control", "private, no-cache");
      res.setHeader("Vary", "Cookie, Accept-Encoding");
      res.type("html").send(pageBoot.html(req.path, { user: req.user ?? null, facility }));
    });
  }
  app.use((req, res) => sendProblem(res, 404, "not_found", `There is no page or file at ${req.originalUrl.split("?")[0]}.`));

  app.use(errorHandler);
  return { app, ctx, sessionStore, routes: listRoutes(mounts), tables };
}
