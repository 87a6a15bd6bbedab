/* global console, process */
// Shared by scripts/start.mjs and scripts/run.mjs: whether to run the TypeScript sources through
// tsx (a development install) or the compiled server in dist-server/ (production, or an install
// without dev dependencies), and how to run a child with the terminal and signals passed through.
import fs from "node:fs";
import { spawn } from "node:child_process";

/** Present only with the dev dependencies installed. */
export const hasDevTools = (name) => fs.existsSync(`node_modules/${name}/package.json`);

export const production = process.env.NODE_ENV === "production";

/** The compiled server is used in production, and whenever tsx is not installed. */
export const useBundle = production || !hasDevTools("tsx");

/** Stops with one sentence when the compiled server is needed and missing. */
export function requireBundle(file) {
  if (fs.existsSync(file)) return;
  const why = production ? "NODE_ENV=production runs the compiled server" : "the dev dependencies (tsx) are not installed";
  console.error(`${file} is missing and ${why}: run npm run build first (it needs the dev dependencies), then start again.`);
  process.exit(1);
}

/** Runs node with these arguments, passing the terminal and SIGINT/SIGTERM through; exits with its code. */
export function runNode(args) {
  const child = spawn(process.execPath, args, { stdio: "inherit" });
  for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => child.kill(signal));
  child.on("exit", (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
}
