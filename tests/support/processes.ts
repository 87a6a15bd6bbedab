/**
 * Runs Phasebook's own programs as child processes, as an operator would: the command-line tools
 * (server/cli/*.ts) and the server (server/main.ts), through tsx, with an environment that holds
 * only what the test gives (none of the developer's Phasebook variables leak in).
 */
import net from "node:net";
import { spawn, type ChildProcess } from "node:child_process";

/** Variables Phasebook reads; the child gets none of them from the test runner's environment. */
const PHASEBOOK_VARS = /^(PORT|HOST|DATABASE_PATH|SESSION_SECRET|PUBLIC_URL|FACILITY_|SMTP_URL|MAIL_FROM|STRIPE_|DEMO_SEED|START_FAKES|CURRENCY|RECOVERY_ACCOUNT|NODE_ENV|LOG_LEVEL|BACKUP_|FAKE_|API_PORT)/;

export function childEnv(env: Record<string, string>): NodeJS.ProcessEnv {
  const base = Object.fromEntries(Object.entries(process.env).filter(([k]) => !PHASEBOOK_VARS.test(k)));
  return { ...base, LOG_LEVEL: "warn", ...env };
}

export interface Finished {
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Runs a TypeScript program of the repository to its end. */
export function runProgram(file: string, args: string[], env: Record<string, string>, timeoutMs = 90_000): Promise<Finished> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--import", "tsx", file, ...args], { env: childEnv(env), stdio: ["ignore", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    child.stdout!.on("data", (d) => (stdout += d));
    child.stderr!.on("data", (d) => (stderr += d));
    const timer = setTimeout(() => {
      child.kill("SIGKILL");
      reject(new Error(`${file} ${args.join(" ")} did not finish in ${timeoutMs} ms:\n${stdout}\n${stderr}`));
    }, timeoutMs);
    child.on("exit", (code) => {
      clearTimeout(timer);
      // Let the pipes drain.
      setImmediate(() => resolve({ code, stdout, stderr }));
    });
  });
}

export interface RunningMain {
  url: string;
  port: number;
  pid: number;
  output(): string;
  stop(): Promise<void>;
}

/** Starts server/main.ts and waits until it says it is running; rejects with its output if it exits first. */
export async function startMain(env: Record<string, string>, timeoutMs = 120_000): Promise<RunningMain> {
  const child: ChildProcess = spawn(process.execPath, ["--import", "tsx", "server/main.ts"], { env: childEnv({ PORT: "0", HOST: "127.0.0.1", ...env }), stdio: ["ignore", "pipe", "pipe"] });
  let out = "";
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (out += d));
  const deadline = Date.now() + timeoutMs;
  let port = 0;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server/main.ts exited with ${child.exitCode}:\n${out}`);
    const m = /Phasebook is running at \S+(?: \(port (\d+)\))?/.exec(out);
    if (m) {
      port = Number(m[1] ?? env.PORT);
      break;
    }
    if (Date.now() > deadline) {
      child.kill("SIGKILL");
      throw new Error(`server/main.ts did not start in time:\n${out}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    url: `http://127.0.0.1:${port}`,
    port,
    pid: child.pid!,
    output: () => out,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once("exit", r));
      child.kill("SIGTERM");
      await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
      if (child.exitCode === null) child.kill("SIGKILL");
    },
  };
}

/** Holds a port, as another program would, until released. */
export async function holdPort(host = "127.0.0.1"): Promise<{ port: number; release(): Promise<void> }> {
  const server = net.createServer();
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(0, host, () => resolve());
  });
  return {
    port: (server.address() as net.AddressInfo).port,
    release: () => new Promise((r) => server.close(() => r())),
  };
}
