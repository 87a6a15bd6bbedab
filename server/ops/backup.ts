/**
 * Backups and restores of a data folder.
 *
 * A backup is a new folder holding a consistent copy of the database made with SQLite's online
 * backup (better-sqlite3's db.backup(), from a connection of its own, so the server keeps
 * running), the generated secrets, the uploaded safety data sheets (sds/), and manifest.json:
 * when it was taken, the schema version (the last migration applied), the rows of every table
 * and the size and sha256 of every file. A restore checks all of that before it writes anything.
 *
 * Order matters while the server runs: the database is copied first and the files after it, and
 * an uploaded file is written before its row (modules/safety/sds.ts), so every file a copied
 * row names is in the backup.
 */
import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import { pipeline } from "node:stream/promises";
import Database from "better-sqlite3";
import { migrations } from "../db/migrations";
import { Refusal } from "./cli";
import { PID_FILE, runningServer } from "./pid-file";

export const MANIFEST = "manifest.json";
export const DATABASE_FILE = "phasebook.sqlite";
/** Files the server generates in the data folder when the variables are not set (config.ts, main.ts). */
export const SECRET_FILES = ["session-secret", "webhook-secret"] as const;
/** Uploaded files, kept under the data folder. */
export const UPLOAD_FOLDERS = ["sds"] as const;

export interface ManifestFile {
  path: string;
  bytes: number;
  sha256: string;
}

export interface BackupManifest {
  format: "phasebook-backup";
  formatVersion: 1;
  /** When the copy began: every change acknowledged before this instant is in it. */
  startedAt: string;
  finishedAt: string;
  /** The last migration applied to the copied database. */
  schemaVersion: string;
  database: string;
  /** Rows per table in the copy. */
  tables: Record<string, number>;
  files: ManifestFile[];
}

export interface BackupResult {
  dir: string;
  manifest: BackupManifest;
  /** Size of the backup folder in bytes. */
  bytes: number;
}

/** Names of the migrations this code knows, in order; TypeORM records the same names. */
export function knownSchemaVersions(): string[] {
  return migrations.map((M) => (new M() as { name?: string }).name ?? M.name);
}

async function sha256Of(file: string): Promise<string> {
  const hash = crypto.createHash("sha256");
  await pipeline(fs.createReadStream(file), hash);
  return hash.digest("hex");
}

/** Every file under dir, as paths relative to it with forward slashes, sorted. */
function filesUnder(dir: string, prefix = ""): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(path.join(dir, prefix), { withFileTypes: true })) {
    const rel = prefix ? `${prefix}/${e.name}` : e.name;
    if (e.isDirectory()) out.push(...filesUnder(dir, rel));
    else if (e.isFile()) out.push(rel);
  }
  return out.sort();
}

function isEmptyOrMissing(dir: string): boolean {
  return !fs.existsSync(dir) || fs.readdirSync(dir).length === 0;
}

/**
 * Writes a backup of the data folder into `target`, a new (or empty) folder. On failure the
 * half-written folder is removed, so a folder with a manifest is always a whole backup.
 */
export async function takeBackup(opts: { databasePath: string; dataDir: string; target: string; now?: () => Date }): Promise<BackupResult> {
  const now = opts.now ?? (() => new Date());
  const target = path.resolve(opts.target);
  const databasePath = path.resolve(opts.databasePath);
  if (!fs.existsSync(databasePath)) throw new Refusal(`There is no database at ${databasePath} to back up; check DATABASE_PATH.`);
  if (fs.existsSync(target) && !fs.statSync(target).isDirectory()) throw new Refusal(`${target} is a file; give the backup a new folder.`);
  if (!isEmptyOrMissing(target)) throw new Refusal(`The folder ${target} is not empty; give the backup a new folder so no earlier backup is overwritten.`);
  const created = !fs.existsSync(target);
  fs.mkdirSync(target, { recursive: true, mode: 0o700 });
  try {
    const startedAt = now().toISOString();
    const copy = path.join(target, DATABASE_FILE);
    const source = new Database(databasePath, { fileMustExist: true });
    try {
      source.pragma("busy_timeout = 10000");
      // After the first (empty) step, copy every page in one step: one read transaction, so the
      // copy is the database as it was at one instant even while the server writes.
      await source.backup(copy, { progress: () => 0x7fffffff });
    } finally {
      source.close();
    }
    const db = new Database(copy, { fileMustExist: true });
    let schemaVersion: string;
    const tables: Record<string, number> = {};
    try {
      // One self-contained file: the server turns WAL back on when it opens a restored copy.
      db.pragma("journal_mode = DELETE");
      const integrity = db.pragma("integrity_check", { simple: true });
      if (integrity !== "ok") throw new Error(`the copied database fails its integrity check (${String(integrity)})`);
      const last = db.prepare(`SELECT name FROM migrations ORDER BY id DESC LIMIT 1`).get() as { name: string } | undefined;
      if (!last) throw new Error("the database has no migrations applied");
      schemaVersion = last.name;
      const names = db.prepare(`SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name`).all() as { name: string }[];
      for (const { name } of names) tables[name] = (db.prepare(`SELECT COUNT(*) AS n FROM "${name.replace(/"/g, '""')}"`).get() as { n: number }).n;
    } finally {
      db.close();
    }
    for (const name of SECRET_FILES) {
      const from = path.join(opts.dataDir, name);
      if (!fs.existsSync(from)) continue;
      fs.mkdirSync(path.join(target, "secrets"), { recursive: true, mode: 0o700 });
      fs.copyFileSync(from, path.join(target, "secrets", name));
      fs.chmodSync(path.join(target, "secrets", name), 0o600);
    }
    for (const folder of UPLOAD_FOLDERS) {
      const from = path.join(opts.dataDir, folder);
      if (fs.existsSync(from)) fs.cpSync(from, path.join(target, folder), { recursive: true });
    }
    const files: ManifestFile[] = [];
    for (const rel of filesUnder(target)) {
      const full = path.join(target, rel);
      files.push({ path: rel, bytes: fs.statSync(full).size, sha256: await sha256Of(full) });
    }
    const manifest: BackupManifest = {
      format: "phasebook-backup",
      formatVersion: 1,
      startedAt,
      finishedAt: now().toISOString(),
      schemaVersion,
      database: DATABASE_FILE,
      tables,
      files,
    };
    fs.writeFileSync(path.join(target, MANIFEST), JSON.stringify(manifest, null, 2) + "\n");
    const bytes = files.reduce((s, f) => s + f.bytes, 0) + fs.statSync(path.join(target, MANIFEST)).size;
    return { dir: target, manifest, bytes };
  } catch (e) {
    if (created) fs.rmSync(target, { recursive: true, force: true });
    else for (const entry of fs.readdirSync(target)) fs.rmSync(path.join(target, entry), { recursive: true, force: true });
    throw e;
  }
}

/** Reads a backup's manifest and checks every file against it and the schema against this code. */
export async function verifyBackup(dir: string): Promise<BackupManifest> {
  const from = path.resolve(dir);
  const manifestPath = path.join(from, MANIFEST);
  if (!fs.existsSync(manifestPath)) throw new Refusal(`${from} holds no ${MANIFEST}; it is not a Phasebook backup folder.`);
  let manifest: BackupManifest;
  try {
    manifest = JSON.parse(fs.readFileSync(manifestPath, "utf8")) as BackupManifest;
  } catch {
    throw new Refusal(`The ${MANIFEST} in ${from} is not valid JSON; the backup is damaged.`);
  }
  if (manifest?.format !== "phasebook-backup" || !Array.isArray(manifest.files) || typeof manifest.schemaVersion !== "string") {
    throw new Refusal(`The ${MANIFEST} in ${from} is not a Phasebook backup manifest.`);
  }
  if (manifest.formatVersion !== 1) throw new Refusal(`This backup has format ${String(manifest.formatVersion)}, which this version of Phasebook cannot read.`);
  if (!knownSchemaVersions().includes(manifest.schemaVersion)) {
    throw new Refusal(
      `This backup's database is at schema ${manifest.schemaVersion}, which this version of Phasebook does not know (the backup is from a newer version); restore it with that version.`,
    );
  }
  if (!manifest.files.some((f) => f.path === manifest.database)) throw new Refusal(`The manifest in ${from} lists no database file; the backup is damaged.`);
  const bad: string[] = [];
  for (const f of manifest.files) {
    const full = path.resolve(from, f.path);
    if (!full.startsWith(from + path.sep)) throw new Refusal(`The manifest in ${from} names a file outside the backup (${f.path}); it is not trusted.`);
    if (!fs.existsSync(full)) bad.push(`${f.path} is missing`);
    else if (fs.statSync(full).size !== f.bytes || (await sha256Of(full)) !== f.sha256) bad.push(`${f.path} does not match its checksum`);
  }
  if (bad.length) throw new Refusal(`The backup in ${from} is damaged: ${bad.join("; ")}. Nothing was restored.`);
  return manifest;
}

export interface RestoreResult {
  manifest: BackupManifest;
  /** Where the data folder's earlier contents were moved (with --force), if anywhere. */
  setAside: string | null;
}

/**
 * Restores a verified backup into the data folder. Refuses while a server runs on it, and a
 * non-empty folder unless forced; forced, the earlier contents are moved into
 * `replaced-<time>/` inside the data folder rather than deleted.
 */
export async function restoreBackup(opts: { from: string; databasePath: string; dataDir: string; force: boolean; now?: () => Date }): Promise<RestoreResult> {
  const now = opts.now ?? (() => new Date());
  const from = path.resolve(opts.from);
  const dataDir = path.resolve(opts.dataDir);
  const databasePath = path.resolve(opts.databasePath);
  const manifest = await verifyBackup(from);
  const pid = runningServer(dataDir);
  if (pid !== null) {
    throw new Refusal(
      `A Phasebook server (process ${pid}) is running on ${dataDir}; stop it before restoring (if none is, delete ${path.join(dataDir, PID_FILE)}).`,
    );
  }
  if (from === dataDir || from.startsWith(dataDir + path.sep)) {
    throw new Refusal(`The backup ${from} is inside the data folder ${dataDir}; copy it elsewhere first.`);
  }
  let setAside: string | null = null;
  const present = fs.existsSync(dataDir) ? fs.readdirSync(dataDir) : [];
  if (present.length) {
    if (!opts.force) {
      throw new Refusal(
        `The data folder ${dataDir} is not empty (${present.slice(0, 5).join(", ")}${present.length > 5 ? ", …" : ""}); restore into an empty folder, or add --force to move its contents aside first.`,
      );
    }
    setAside = path.join(dataDir, `replaced-${now().toISOString().replace(/[:.]/g, "-")}`);
    fs.mkdirSync(setAside, { mode: 0o700 });
    for (const entry of present) fs.renameSync(path.join(dataDir, entry), path.join(setAside, entry));
  }
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  fs.mkdirSync(path.dirname(databasePath), { recursive: true });
  // Copy beside the target, check it, then rename: a failed copy never leaves half a database.
  const temp = `${databasePath}.restoring`;
  fs.copyFileSync(path.join(from, manifest.database), temp);
  const db = new Database(temp, { fileMustExist: true });
  try {
    const integrity = db.pragma("integrity_check", { simple: true });
    if (integrity !== "ok") throw new Refusal(`The backup's database fails SQLite's integrity check (${String(integrity)}); nothing was restored.`);
  } catch (e) {
    db.close();
    fs.rmSync(temp, { force: true });
    throw e;
  }
  db.close();
  fs.renameSync(temp, databasePath);
  for (const f of manifest.files) {
    if (f.path === manifest.database) continue;
    const [top, ...rest] = f.path.split("/");
    const dest = top === "secrets" ? path.join(dataDir, ...rest) : path.join(dataDir, f.path);
    fs.mkdirSync(path.dirname(dest), { recursive: true });
    fs.copyFileSync(path.join(from, f.path), dest);
    if (top === "secrets") fs.chmodSync(dest, 0o600);
  }
  return { manifest, setAside };
}
