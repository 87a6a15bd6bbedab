/**
 * JSON state files for the fakes. Written whole on every change (the fakes' state is small) and
 * through a rename, so a fake killed mid-write keeps its previous state instead of half a file.
 */
import fs from "node:fs";
import path from "node:path";

export function readJsonFile<T>(file: string | undefined): T | undefined {
  if (!file || !fs.existsSync(file)) return undefined;
  return JSON.parse(fs.readFileSync(file, "utf8")) as T;
}

export function writeJsonAtomic(file: string, data: unknown): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, JSON.stringify(data, null, 2));
  fs.renameSync(tmp, file);
}
