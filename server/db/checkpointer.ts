/**
 * WAL checkpoints off the request path. SQLite's automatic checkpoint runs inside whichever COMMIT
 * takes the write-ahead log past 1,000 pages: every fifty bookings or so, one request waited
 * 5–20 ms while the log was copied into the database and the file synced, and at ten requests at
 * a time that wait was the slowest percent of all of them. Instead, the server's connection never
 * checkpoints (`wal_autocheckpoint = 0`) and a worker thread with a connection of its own runs a
 * PASSIVE checkpoint every `everyMs` (PASSIVE never waits for, nor blocks, the writer). If the
 * worker stops for any reason, the server's connection checkpoints by itself again.
 */
import { createRequire } from "node:module";
import { Worker } from "node:worker_threads";
import type { DataSource } from "typeorm";
import { connectionOf } from "./prepared";

/** SQLite's own default, restored if the worker stops. */
const AUTO_CHECKPOINT_PAGES = 1000;

// Plain CommonJS run by the worker thread; better-sqlite3 is found by the path the server resolved.
const WORKER = `
const { parentPort, workerData } = require("node:worker_threads");
const Database = require(workerData.driver);
const db = new Database(workerData.file);
db.pragma("busy_timeout = 1000");
db.pragma("synchronous = NORMAL");
const checkpoint = () => {
  try { db.pragma("wal_checkpoint(PASSIVE)"); } catch (e) { parentPort.postMessage({ error: String(e && e.message || e) }); }
};
const timer = setInterval(checkpoint, workerData.everyMs);
parentPort.on("message", (m) => {
  if (m !== "stop") return;
  clearInterval(timer);
  checkpoint();
  db.close();
  parentPort.close();
});
parentPort.postMessage({ ready: true });
`;

export interface Checkpointer {
  stop(): Promise<void>;
}

/** Starts the checkpoint thread for the database file behind `ds` (nothing for an in-memory one). */
export async function startCheckpointer(ds: DataSource, everyMs = 1000): Promise<Checkpointer> {
  const file = String(ds.options.database);
  const db = connectionOf(ds);
  if (file === ":memory:" || db.pragma("journal_mode", { simple: true }) !== "wal") return { stop: async () => {} };
  const worker = new Worker(WORKER, { eval: true, workerData: { file, everyMs, driver: createRequire(import.meta.url).resolve("better-sqlite3") } });
  let running = false;
  const fallBack = () => {
    if (running && db.open) db.pragma(`wal_autocheckpoint = ${AUTO_CHECKPOINT_PAGES}`);
    running = false;
  };
  worker.on("error", (e) => {
    console.error(`checkpoint thread failed: ${e.message}`);
    fallBack();
  });
  worker.on("exit", fallBack);
  worker.on("message", (m: { ready?: true; error?: string }) => {
    if (m.error) console.error(`checkpoint failed: ${m.error}`);
  });
  await new Promise<void>((resolve, reject) => {
    worker.once("message", () => resolve());
    worker.once("error", reject);
  });
  running = true;
  db.pragma("wal_autocheckpoint = 0");
  return {
    stop: () =>
      new Promise<void>((resolve) => {
        fallBack();
        worker.once("exit", () => resolve());
        worker.postMessage("stop");
      }),
  };
}
