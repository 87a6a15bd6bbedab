/**
 * Starts the real app on an ephemeral port with a temporary database built by the migrations,
 * a fixed clock, and a mailer that records what it was asked to send (mail delivery itself is
 * tested against the fake mailbox in fakes.test.ts).
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { createServer, type Server } from "node:http";
import type { DataSource } from "typeorm";
import { openDatabase } from "../../server/db/data-source";
import { createApp, MAX_HEADER_BYTES } from "../../server/app";
import { loadConfig } from "../../server/config";
import { fixedClock } from "../../server/clock";
import type { Mailer, OutgoingMail } from "../../server/integrations/mailer";
import type { Ctx } from "../../server/context";
import type { DbSessionStore } from "../../server/modules/people";
import type { AppDeps } from "../../server/context";
import type { RouteTable } from "../../server/http/route-table";

export interface TestApp {
  url: string;
  ds: DataSource;
  ctx: Ctx;
  clock: ReturnType<typeof fixedClock>;
  sent: OutgoingMail[];
  dir: string;
  sessionStore: DbSessionStore;
  routes: string[];
  /** The route tables the app was built from (the declarations the role matrix checks). */
  tables: RouteTable[];
  close(): Promise<void>;
}

export const TEST_NOW = "2026-12-02T15:00:00.000Z";

export async function startTestApp(
  opts: { now?: string; deps?: Partial<AppDeps>; env?: Record<string, string>; /** An existing database to open (kept on close) instead of a new one. */ databasePath?: string } = {},
): Promise<TestApp> {
  const dir = opts.databasePath ? path.dirname(path.resolve(opts.databasePath)) : fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-test-"));
  const config = loadConfig({
    DATABASE_PATH: opts.databasePath ?? path.join(dir, "test.sqlite"),
    NODE_ENV: "test",
    PUBLIC_URL: "http://phasebook.test",
    ...opts.env,
  });
  const ds = await openDatabase(config.DATABASE_PATH);
  const clock = fixedClock(opts.now ?? TEST_NOW);
  const sent: OutgoingMail[] = [];
  const mailer: Mailer = {
    async send(m) {
      sent.push(m);
    },
    close() {},
  };
  const { app, ctx, sessionStore, routes, tables } = createApp({
    ds,
    config,
    clock,
    mailer,
    quiet: true,
    staticDir: null,
    bcryptCost: 10,
    checkResponses: true,
    ...opts.deps,
  });
  const server: Server = await new Promise((resolve) => {
    const s = createServer({ maxHeaderSize: MAX_HEADER_BYTES }, app).listen(0, "127.0.0.1", () => resolve(s));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    ds,
    ctx,
    clock,
    sent,
    dir,
    sessionStore,
    routes,
    tables,
    async close() {
      await new Promise((r) => server.close(r));
      await ds.destroy();
      if (!opts.databasePath) fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
