/**
 * createApp(deps): middleware, routers, the JSON 404 under /api, the single-page client for
 * every other GET, and the one error handler. main.ts is the only file that listens.
 */
import fs from "node:fs";
import path from "node:path";
import express, { type Express } from "express";
import session from "express-session";
import helmet from "helmet";
import { pinoHttp } from "pino-http";
import { csrfSync } from "csrf-sync";
import type { AppDeps, Ctx } from "./context";
import { createPassport, createSignIn, DbSessionStore } from "./modules/people";
import { apiNotFound, errorHandler } from "./middleware/problem";
import { buildMounts, listRoutes } from "./http/router";
import { apiDescriptionTable, docsAssets } from "./http/api-description";
import type { RouteTable } from "./http/route-table";
import { ROUTE_TABLES } from "./modules";

/** Paths that a foreign service calls without a browser session, so they carry no CSRF token. */
const CSRF_EXEMPT = [/^\/api\/webhooks\//];

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
  const passport = createPassport(deps.ds);
  const csrf = csrfSync({
    getTokenFromRequest: (req) => req.get("x-csrf-token"),
    skipCsrfProtection: (req) => CSRF_EXEMPT.some((re) => re.test(req.originalUrl)),
    errorConfig: { statusCode: 403, code: "csrf_invalid", message: "CSRF token missing or stale" },
  });
  const ctx: Ctx = {
    ...deps,
    now: () => deps.clock.now(),
    signIn: createSignIn(deps, passport, (req) => csrf.generateToken(req)),
  };
  const app = express();
  const secureCookies = deps.config.PUBLIC_URL.startsWith("https://");

  app.disable("x-powered-by");
  app.set("trust proxy", "loopback");
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          "default-src": ["'self'"],
          "img-src": ["'self'", "data:", "blob:"],
          "media-src": ["'self'", "blob:"],
          // FullCalendar and React set inline styles at run time.
          "style-src": ["'self'", "'unsafe-inline'"],
          "script-src": ["'self'"],
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

  // Session expiry follows the wall clock, not the app clock that tests fix.
  const sessionStore = new DbSessionStore(deps.ds);
  app.use(
    session({
      name: "phasebook.sid",
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
  app.use("/api", csrf.csrfSynchronisedProtection);

  const tables: RouteTable[] = [
    ...ROUTE_TABLES,
    apiDescriptionTable(() => tables, { version: deps.version ?? "dev", publicUrl: deps.config.PUBLIC_URL }),
  ];
  const mounts = buildMounts(ctx, tables);
  app.use("/api/docs/assets", docsAssets());
  for (const { path: p, router } of mounts) app.use(`/api${p}`, router);
  app.use("/api", apiNotFound);

  const staticDir = deps.staticDir === undefined ? path.resolve("dist") : deps.staticDir;
  if (staticDir && fs.existsSync(path.join(staticDir, "index.html"))) {
    app.use(express.static(staticDir, { index: false, maxAge: "1h" }));
    app.get("/{*splat}", (_req, res) => {
      res.sendFile(path.join(staticDir, "index.html"));
    });
  }

  app.use(errorHandler);
  return { app, ctx, sessionStore, routes: listRoutes(mounts), tables };
}
