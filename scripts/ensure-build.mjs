/* global console */
// Builds the client before `npm start` when dist/ is missing or older than the sources,
// so `npm install && npm start` is all a fresh machine needs.
import fs from "node:fs";
import path from "node:path";
import { execSync } from "node:child_process";

function newest(dir) {
  let t = 0;
  if (!fs.existsSync(dir)) return t;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    t = Math.max(t, e.isDirectory() ? newest(p) : fs.statSync(p).mtimeMs);
  }
  return t;
}

const built = fs.existsSync("dist/index.html") ? fs.statSync("dist/index.html").mtimeMs : 0;
const sources = Math.max(newest("src"), newest("shared"), newest("public"), fs.statSync("index.html").mtimeMs, fs.statSync("tailwind.config.ts").mtimeMs);
if (built < sources) {
  console.log("Building the client (vite build)…");
  execSync("npx vite build --logLevel warn", { stdio: "inherit" });
}
