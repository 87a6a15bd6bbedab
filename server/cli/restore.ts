/**
 * Restores a backup into the configured data folder (DATABASE_PATH's folder) while the server
 * is stopped: npm run restore -- /mnt/backups/phasebook-2026-12-02 [--force]
 * The manifest is checked first (every checksum, a schema this version knows); a non-empty
 * data folder is refused unless --force, which moves its contents into replaced-<time>/.
 */
import { dataPathsFrom } from "../config";
import { Refusal, readArgs, runCli } from "../ops/cli";
import { restoreBackup } from "../ops/backup";

const USAGE = "npm run restore -- <backup folder> [--force]";

await runCli("The restore", async () => {
  const { positionals, values } = readArgs({ options: { force: { type: "boolean", default: false } }, strict: true, allowPositionals: true }, USAGE);
  if (positionals.length !== 1) throw new Refusal(`Give the one backup folder to restore. Usage: ${USAGE}`, 2);
  // The data folder is read from the environment alone: loading the full configuration would
  // write a new session secret into the very folder that must be empty.
  const { databasePath, dataDir } = dataPathsFrom();
  const r = await restoreBackup({ from: positionals[0], databasePath, dataDir, force: values.force ?? false });
  console.log(
    [
      `Restored the backup of ${r.manifest.startedAt} (schema ${r.manifest.schemaVersion}) into ${dataDir}.`,
      ...(r.setAside ? [`The folder's earlier contents are in ${r.setAside}.`] : []),
      "Start Phasebook as usual; it applies any newer migrations on start.",
    ].join("\n"),
  );
});
