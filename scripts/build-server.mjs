/* global console, process */
// Bundles the server and its command-line tools with esbuild into dist-server/, so production
// runs on plain `node` with only the dependencies installed (`npm ci --omit=dev`). Every
// package stays external (better-sqlite3 is native; the rest load from node_modules), so
// whatever the server imports at run time must be listed in "dependencies".
import fs from "node:fs";
import * as esbuild from "esbuild";

const OUT = "dist-server";
fs.rmSync(OUT, { recursive: true, force: true });
const result = await esbuild.build({
  entryPoints: {
    main: "server/main.ts",
    "cli/user-create": "server/cli/user-create.ts",
    "cli/backup": "server/cli/backup.ts",
    "cli/restore": "server/cli/restore.ts",
    "cli/migrate": "server/cli/migrate.ts",
    "cli/statement-pdf": "server/cli/statement-pdf.ts",
    // The statement PDF pool's worker thread, found at run time beside main.js (statement-pdf-pool.ts).
    "statement-pdf-worker": "server/modules/recharge/statement-pdf.worker.ts",
  },
  outdir: OUT,
  bundle: true,
  splitting: true,
  platform: "node",
  format: "esm",
  target: "node20",
  packages: "external",
  tsconfig: "tsconfig.json",
  sourcemap: true,
  metafile: true,
  logLevel: "warning",
});
// Every package the bundle imports must be a dependency, or `npm ci --omit=dev` breaks production.
const pkg = JSON.parse(fs.readFileSync("package.json", "utf8"));
const packageOf = (spec) => (spec.startsWith("@") ? spec.split("/").slice(0, 2).join("/") : spec.split("/")[0]);
const imported = new Set();
for (const out of Object.values(result.metafile.outputs)) {
  for (const i of out.imports) if (i.external && !i.path.startsWith("node:")) imported.add(packageOf(i.path));
}
const missing = [...imported].filter((p) => !(p in (pkg.dependencies ?? {}))).sort();
if (missing.length) {
  console.error(`The server imports ${missing.join(", ")} at run time; move ${missing.length === 1 ? "it" : "them"} to "dependencies" in package.json.`);
  process.exit(1);
}
// The bundle is ES modules; say so beside it, whatever the package.json above says.
fs.writeFileSync(`${OUT}/package.json`, JSON.stringify({ type: "module" }, null, 2) + "\n");
const bytes = Object.values(result.metafile.outputs).reduce((s, o) => s + o.bytes, 0);
console.log(`Server bundled into ${OUT}/ (${(bytes / 1e6).toFixed(1)} MB with source maps).`);
