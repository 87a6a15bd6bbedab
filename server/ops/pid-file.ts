/**
 * The server writes its process id into the data folder while it runs (main.ts) and removes it
 * when it stops, so a restore can refuse to replace a database a running server has open.
 */
import fs from "node:fs";
import path from "node:path";

export const PID_FILE = "server.pid";

export function writePidFile(dataDir: string): string {
  const file = path.join(dataDir, PID_FILE);
  fs.writeFileSync(file, `${process.pid}\n`);
  return file;
}

/** The process id of a server that is running on this data folder, or null (no file, or a stale one). */
export function runningServer(dataDir: string): number | null {
  const file = path.join(dataDir, PID_FILE);
  if (!fs.existsSync(file)) return null;
  const pid = Number(fs.readFileSync(file, "utf8").trim());
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch (e) {
    // EPERM: the process exists but belongs to someone else.
    return (e as NodeJS.ErrnoException).code === "EPERM" ? pid : null;
  }
}
