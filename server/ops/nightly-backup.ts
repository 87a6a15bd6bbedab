/**
 * The nightly backup (production, BACKUP_DIR set): one folder per night named by the facility's
 * local date (YYYY-MM-DD), taken on the first run at or after 02:00 facility time (or soon after
 * a start that found that night's folder missing). After a successful backup, dated folders
 * older than BACKUP_KEEP days are removed; after a failure nothing is removed and the next run
 * tries again. The last result is kept in a settings row for the administrator's status page.
 */
import fs from "node:fs";
import path from "node:path";
import { DateTime } from "luxon";
import type { DataSource } from "typeorm";
import { MANIFEST, takeBackup } from "./backup";

export const BACKUP_STATUS_KEY = "backup_last";
/** Local hour from which the night's backup is due. */
export const BACKUP_HOUR = 2;

export interface BackupStatus {
  at: string;
  ok: boolean;
  folder: string;
  bytes: number | null;
  error: string | null;
  /** Dated folders removed after this backup, by BACKUP_KEEP. */
  removed: string[];
}

export interface NightlyBackupDeps {
  ds: DataSource;
  now: () => Date;
  config: { BACKUP_DIR?: string; BACKUP_KEEP: number; FACILITY_TZ: string; DATABASE_PATH: string; dataDir: string };
}

const DATED = /^\d{4}-\d{2}-\d{2}$/;

export async function readBackupStatus(ds: DataSource): Promise<BackupStatus | null> {
  const rows: { value: string }[] = await ds.query(`SELECT value FROM settings WHERE "key" = ?`, [BACKUP_STATUS_KEY]);
  return rows.length ? (JSON.parse(rows[0].value) as BackupStatus) : null;
}

async function recordStatus(ds: DataSource, status: BackupStatus): Promise<void> {
  await ds.query(`INSERT INTO settings ("key", value) VALUES (?, ?) ON CONFLICT("key") DO UPDATE SET value = excluded.value`, [
    BACKUP_STATUS_KEY,
    JSON.stringify(status),
  ]);
}

/** Takes tonight's backup if it is due and not yet taken; answers what it did, or null when nothing was due. */
export async function runNightlyBackup(deps: NightlyBackupDeps, opts: { force?: boolean } = {}): Promise<BackupStatus | null> {
  const { BACKUP_DIR, BACKUP_KEEP, FACILITY_TZ } = deps.config;
  if (!BACKUP_DIR) return null;
  const local = DateTime.fromJSDate(deps.now(), { zone: FACILITY_TZ });
  if (local.hour < BACKUP_HOUR && !opts.force) return null;
  const name = local.toISODate()!;
  const folder = path.resolve(BACKUP_DIR, name);
  if (fs.existsSync(path.join(folder, MANIFEST))) return null;
  let status: BackupStatus;
  try {
    if (fs.existsSync(BACKUP_DIR) && !fs.statSync(BACKUP_DIR).isDirectory()) throw new Error(`BACKUP_DIR (${BACKUP_DIR}) is a file, not a folder`);
    fs.mkdirSync(BACKUP_DIR, { recursive: true, mode: 0o700 });
    const result = await takeBackup({ databasePath: deps.config.DATABASE_PATH, dataDir: deps.config.dataDir, target: folder, now: deps.now });
    const oldest = local.minus({ days: BACKUP_KEEP - 1 }).toISODate()!;
    const removed: string[] = [];
    for (const entry of fs.readdirSync(BACKUP_DIR)) {
      if (DATED.test(entry) && entry < oldest) {
        fs.rmSync(path.join(BACKUP_DIR, entry), { recursive: true, force: true });
        removed.push(entry);
      }
    }
    status = { at: deps.now().toISOString(), ok: true, folder, bytes: result.bytes, error: null, removed };
  } catch (e) {
    status = { at: deps.now().toISOString(), ok: false, folder, bytes: null, error: (e as Error).message, removed: [] };
  }
  await recordStatus(deps.ds, status);
  if (!status.ok) console.error(`nightly backup into ${folder} failed: ${status.error}`);
  return status;
}
