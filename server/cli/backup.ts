/**
 * Writes a backup of the data folder into a new folder, while the server runs or not:
 * npm run backup -- /mnt/backups/phasebook-2026-12-02
 * (a consistent copy of the database, the generated secrets, the uploaded files and a manifest).
 */
import { dataPathsFrom } from "../config";
import { Refusal, readArgs, runCli } from "../ops/cli";
import { takeBackup } from "../ops/backup";

const USAGE = "npm run backup -- <new folder>";

await runCli("The backup", async () => {
  const { positionals } = readArgs({ options: {}, strict: true, allowPositionals: true }, USAGE);
  if (positionals.length !== 1) throw new Refusal(`Give one folder to write the backup into. Usage: ${USAGE}`, 2);
  const { databasePath, dataDir } = dataPathsFrom();
  console.log(`Backing up ${databasePath} into ${positionals[0]} …`);
  const r = await takeBackup({ databasePath, dataDir, target: positionals[0] });
  const rows = Object.values(r.manifest.tables).reduce((s, n) => s + n, 0);
  console.log(
    `Backup written to ${r.dir}: ${r.manifest.files.length} files, ${(r.bytes / 1e6).toFixed(1)} MB, ` +
      `${rows} rows in ${Object.keys(r.manifest.tables).length} tables, schema ${r.manifest.schemaVersion}, as of ${r.manifest.startedAt}.`,
  );
});
