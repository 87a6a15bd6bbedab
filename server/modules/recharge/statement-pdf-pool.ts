/**
 * Statement PDFs off the event loop: a pool of worker threads (piscina) renders them, as many at
 * once as the machine has cores, so mailing a month's statements takes a fraction of the time and
 * a statement download never holds up other requests while its pages are drawn.
 *
 * The worker is statement-pdf.worker.ts: run through tsx from the sources (development, tests),
 * and from the bundle as `dist-server/statement-pdf-worker.js` (scripts/build-server.mjs emits it
 * as an entry of its own). When no worker can start (the file is missing, a thread fails), the
 * statement is rendered in-process by the same function and the failure is logged once: a
 * statement is never lost for want of a thread, and both ways give the same bytes.
 */
import fs from "node:fs";
import os from "node:os";
import { fileURLToPath } from "node:url";
import { Piscina } from "piscina";
import { renderStatementPdf, type StatementPdfInput } from "./statement-pdf";

/** Where the worker is: beside this file in the sources; at the bundle's top level once built. */
export function statementWorkerFile(): { file: string; execArgv: string[] } | null {
  const here = import.meta.url;
  if (here.endsWith(".ts")) {
    const file = fileURLToPath(new URL("./statement-pdf.worker.ts", here));
    // tsx loads the TypeScript sources (and the tsconfig's @shared paths) in the worker too.
    return fs.existsSync(file) ? { file, execArgv: ["--import", "tsx"] } : null;
  }
  // This code sits in the bundle's main file or a shared chunk beside it, or in a tool under cli/.
  for (const candidate of ["./statement-pdf-worker.js", "../statement-pdf-worker.js"]) {
    const file = fileURLToPath(new URL(candidate, here));
    if (fs.existsSync(file)) return { file, execArgv: [] };
  }
  return null;
}

/** Each thread holds its own copy of pdfkit and its fonts; a month's mailing gains little past four. */
const MAX_THREADS = 4;

export interface StatementPdfRenderer {
  /** The statement's PDF, from a worker thread or, failing that, in-process. */
  render(input: StatementPdfInput): Promise<Buffer>;
  /** How many renders the pool's threads could take at once (1 when rendering in-process). */
  readonly width: number;
  /** How many PDFs were rendered each way so far. */
  readonly rendered: { inWorker: number; inProcess: number };
  close(): Promise<void>;
}

export interface PoolOptions {
  /** Threads at most; by default the machine's cores, up to MAX_THREADS. */
  threads?: number;
  /** The worker to run; by default statementWorkerFile(). null renders in-process. */
  worker?: { file: string; execArgv: string[] } | null;
  /** Where a failure to start or run a thread is reported (once). */
  log?: (message: string) => void;
}

export function createStatementPdfPool(opts: PoolOptions = {}): StatementPdfRenderer {
  const log = opts.log ?? ((m: string) => console.error(m));
  const worker = opts.worker === undefined ? statementWorkerFile() : opts.worker;
  const threads = Math.max(1, opts.threads ?? Math.min(MAX_THREADS, os.availableParallelism()));
  let pool: Piscina | null = null;
  let broken = worker === null || !fs.existsSync(worker.file);
  // Settles (rejected) when a thread fails outside any task, e.g. while loading the worker file:
  // piscina then starts no other thread, and the tasks waiting for one would wait for ever.
  let threadFailed: (e: Error) => void = () => undefined;
  const failure = new Promise<never>((_, reject) => (threadFailed = reject));
  failure.catch(() => undefined);
  if (broken) log(`statement PDFs: the worker file ${worker?.file ?? "statement-pdf-worker.js"} is missing; rendering them in-process`);
  else {
    pool = new Piscina({
      filename: worker!.file,
      execArgv: worker!.execArgv,
      minThreads: 0,
      maxThreads: threads,
      // Threads stay a while between the mail job's passes instead of starting afresh each time.
      idleTimeout: 60_000,
    });
    pool.on("error", (e: Error) => threadFailed(e));
  }

  const rendered = { inWorker: 0, inProcess: 0 };
  const inProcess = async (input: StatementPdfInput) => {
    const pdf = await renderStatementPdf(input);
    rendered.inProcess++;
    return pdf;
  };
  return {
    rendered,
    get width() {
      return broken ? 1 : threads;
    },
    async render(input) {
      if (broken || !pool) return inProcess(input);
      let bytes: Uint8Array;
      try {
        bytes = (await Promise.race([pool.run(input), failure])) as Uint8Array;
      } catch (e) {
        // The same input in-process: if it renders, the thread was at fault and the pool is set
        // aside; if it throws too, the statement itself cannot be rendered and the error stands.
        const pdf = await inProcess(input);
        if (!broken) {
          broken = true;
          log(`statement PDFs: a worker thread failed (${(e as Error).message}); rendering them in-process from now on`);
          const failed = pool;
          pool = null;
          void failed.destroy().catch(() => undefined);
        }
        return pdf;
      }
      rendered.inWorker++;
      return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    },
    async close() {
      const p = pool;
      pool = null;
      broken = true;
      await p?.destroy();
    },
  };
}

let shared: StatementPdfRenderer | null = null;

/** The process's pool, started on first use; its idle threads never keep the process alive. */
export function statementPdfPool(): StatementPdfRenderer {
  shared ??= createStatementPdfPool();
  return shared;
}

/** Stops the process's pool (server shutdown, the end of a test file); the next use starts a new one. */
export async function closeStatementPdfPool(): Promise<void> {
  const p = shared;
  shared = null;
  await p?.close();
}
