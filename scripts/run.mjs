/* global console, process */
// Runs one of Phasebook's command-line tools (server/cli/<name>.ts) the way `npm start` runs the
// server: from the compiled bundle (dist-server/cli/<name>.js) in production or without dev
// dependencies, else from the sources through tsx. `npm run backup -- DIR` is `run.mjs backup DIR`.
import fs from "node:fs";
import { requireBundle, runNode, useBundle } from "./launch.mjs";

const [name, ...args] = process.argv.slice(2);
if (!name || !fs.existsSync(`server/cli/${name}.ts`) && !fs.existsSync(`dist-server/cli/${name}.js`)) {
  console.error(`There is no command "${name ?? ""}".`);
  process.exit(2);
}
if (useBundle) {
  requireBundle(`dist-server/cli/${name}.js`);
  runNode([`dist-server/cli/${name}.js`, ...args]);
} else {
  runNode(["--import", "tsx", `server/cli/${name}.ts`, ...args]);
}
