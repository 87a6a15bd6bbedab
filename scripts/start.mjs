/* global console */
// `npm start`: the one-command demo (migrate, seed, fakes, sign-ins) and, with NODE_ENV=production
// (or `npm run start:prod`), the production server.
//
// - Production, or no dev dependencies: runs the compiled server, dist-server/main.js, on the
//   built client in dist/ (both made by `npm run build`). Vite is never called.
// - Otherwise: builds the client when dist/ is missing or older than the sources (so
//   `npm install && npm start` is all a fresh machine needs), then runs server/main.ts with tsx.
import fs from "node:fs";
import path from "node:path";
import { execSync } from "node:child_process";
import { pathToFileURL } from "node:url";
import { hasDevTools, requireBundle, runNode, useBundle } from "./launch.mjs";

function newest(dir) {
  let t = 0;
  if (!fs.existsSync(dir)) return t;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    t = Math.max(t, e.isDirectory() ? newest(p) : fs.statSync(p).mtimeMs);
  }
  return t;
}

if (useBundle) {
  requireBundle("dist-server/main.js");
  requireBundle("dist/index.html");
  await import(pathToFileURL(path.resolve("dist-server/main.js")).href);
} else {
  const built = fs.existsSync("dist/index.html") ? fs.statSync("dist/index.html").mtimeMs : 0;
  const sources = Math.max(newest("src"), newest("shared"), newest("public"), fs.statSync("index.html").mtimeMs, fs.statSync("tailwind.config.ts").mtimeMs);
  if (built < sources && hasDevTools("vite")) {
    console.log("Building the client (vite build)…");
    execSync("npx vite build --logLevel warn", { stdio: "inherit" });
  }
  runNode(["--import", "tsx", "server/main.ts"]);
}
