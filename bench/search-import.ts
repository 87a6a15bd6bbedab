/**
 * `npm run bench:search`: the Stockroom search after a large stockroom arrives by CSV. The demo
 * facility is seeded into a temporary database, the real app listens on loopback, and the safety
 * officer imports ten files of 20,000 containers through POST /api/containers/import, as a
 * university's chemistry building would. After the first file (20,000 containers) and after the
 * tenth (200,000), four searches are sent one after another — text (part of a chemical's name),
 * a CAS number, a lot and a label code — each timed over several runs; every answer is checked
 * against a plain scan of the same rows in SQL. One table prints the figures at both sizes, the
 * growth, and the goals: under 50 ms each, and within 2.5 × of the 20,000-container figure.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { performance } from "node:perf_hooks";
import { benchSignIn } from "./support";

const FILES = 10;
const ROWS = 20_000;
const RUNS = 7;
const GOAL_MS = 50;
const GOAL_GROWTH = 2.5;

function csvFile(file: number, chemicals: { casNumber: string; name: string }[], locationId: number): string {
  const suppliers = ["Kestrel Chemicals Supply", "Bayside Reagents", "Northshore Solvents"];
  const lines = ["casNumber,chemicalName,quantity,unit,location,status,supplier,lot,expiresAt"];
  for (let i = 1; i <= ROWS; i++) {
    const c = chemicals[(file * ROWS + i) % chemicals.length];
    const name = `"${c.name.replace(/"/g, '""')}"`;
    lines.push(`${c.casNumber},${name},${100 + (i % 900)},mL,${locationId},${i % 3 ? "sealed" : "in_use"},${suppliers[i % 3]},LT${file}X${i},2028-0${1 + (i % 9)}-15`);
  }
  return lines.join("\n") + "\n";
}

async function main() {
  const { openDatabase } = await import("../server/db/data-source");
  const { seedDemo } = await import("../server/db/seed/demo");
  const { DEMO_PASSWORD } = await import("../server/db/seed/demo-people");
  const { createApp } = await import("../server/app");
  const { loadConfig } = await import("../server/config");
  const { systemClock } = await import("../server/clock");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-search-"));
  const file = path.join(dir, "search.sqlite");
  const ds = await openDatabase(file);
  try {
    await seedDemo(ds, { now: new Date(), bcryptCost: 4 });
    const config = loadConfig({ DATABASE_PATH: file, NODE_ENV: "production", PUBLIC_URL: "http://127.0.0.1", LOG_LEVEL: "silent" });
    const { app } = createApp({ ds, config, clock: systemClock, mailer: { async send() {}, close() {} }, quiet: true, staticDir: null, bcryptCost: 4 });
    const server = app.listen(0, "127.0.0.1");
    await new Promise((resolve) => server.once("listening", resolve));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const officer = await benchSignIn(base, "safety@kestrelbay.example", DEMO_PASSWORD);

    // Liquids the demo keeps (by CAS), received into its flammables cabinet.
    const chemicals = (await ds.query(
      `SELECT ch.casNumber, ch.name FROM chemicals ch WHERE ch.casNumber IS NOT NULL AND ch.densityGPerMl IS NOT NULL ORDER BY ch.id LIMIT 6`,
    )) as { casNumber: string; name: string }[];
    const [{ id: locationId }] = (await ds.query(`SELECT id FROM locations WHERE type = 'flammable_cabinet' ORDER BY id LIMIT 1`)) as { id: number }[];
    const textPart = chemicals[0].name.slice(1, 7);

    const get = async (q: string) => {
      const started = performance.now();
      const r = await fetch(`${base}/api/containers?q=${encodeURIComponent(q)}&status=sealed,in_use,on_hold&sort=chemical&limit=50`, { headers: { cookie: officer.cookie } });
      const body = (await r.json()) as { items: { id: number }[]; total: number; totalIsExact: boolean };
      if (r.status !== 200) throw new Error(`search ${q} answered ${r.status}`);
      return { ms: performance.now() - started, body };
    };
    const scanCount = async (where: string, args: unknown[]) =>
      ((await ds.query(`SELECT COUNT(*) AS n FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId WHERE c.status IN ('sealed','in_use','on_hold') AND (${where})`, args)) as { n: number }[])[0].n;

    const measure = async () => {
      const [{ labelToken }] = (await ds.query(`SELECT labelToken FROM containers WHERE lot = 'LT0X12345'`)) as { labelToken: string }[];
      const cases = [
        { name: `text "${textPart}"`, q: textPart, scan: () => scanCount(`ch.name LIKE ? OR ch.synonyms LIKE ?`, [`%${textPart}%`, `%${textPart}%`]) },
        { name: `CAS ${chemicals[1].casNumber}`, q: chemicals[1].casNumber, scan: () => scanCount(`ch.casNumber LIKE ?`, [`%${chemicals[1].casNumber}%`]) },
        { name: "lot LT0X12345", q: "LT0X12345", scan: () => scanCount(`c.lot LIKE ?`, ["%LT0X12345%"]) },
        { name: "label code", q: labelToken, scan: () => scanCount(`c.labelToken = ?`, [labelToken]) },
      ];
      const out: { name: string; medianMs: number; maxMs: number; total: string; agrees: boolean }[] = [];
      for (const c of cases) {
        await get(c.q);
        const times: number[] = [];
        let last = await get(c.q);
        for (let i = 0; i < RUNS; i++) {
          last = await get(c.q);
          times.push(last.ms);
        }
        times.sort((a, b) => a - b);
        const expected = await c.scan();
        // Totals are exact up to 1,000; past that the answer says "more than 1,000".
        const agrees = last.body.totalIsExact ? last.body.total === expected : expected >= last.body.total;
        out.push({ name: c.name, medianMs: times[Math.floor(times.length / 2)], maxMs: times[times.length - 1], total: `${last.body.total}${last.body.totalIsExact ? "" : "+"} (scan ${expected})`, agrees });
      }
      return out;
    };

    const importFile = async (f: number) => {
      const started = performance.now();
      const r = await fetch(`${base}/api/containers/import`, {
        method: "POST",
        headers: { "content-type": "text/csv", cookie: officer.cookie, "x-csrf-token": officer.csrf },
        body: csvFile(f, chemicals, locationId),
      });
      if (r.status !== 201) throw new Error(`import ${f + 1} answered ${r.status}: ${(await r.text()).slice(0, 300)}`);
      return (performance.now() - started) / 1000;
    };

    console.log(`Phasebook search after CSV imports, ${new Date().toISOString().slice(0, 10)}, ${os.cpus().length} cores, load average ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.`);
    const importSeconds = [await importFile(0)];
    const small = await measure();
    for (let f = 1; f < FILES; f++) importSeconds.push(await importFile(f));
    const [{ n: count }] = (await ds.query(`SELECT COUNT(*) AS n FROM containers`)) as { n: number }[];
    const large = await measure();
    server.close();

    console.log(`Imported ${FILES} files of ${ROWS.toLocaleString("en")} rows (${count.toLocaleString("en")} containers with the demo's); each import took ${Math.min(...importSeconds).toFixed(1)}–${Math.max(...importSeconds).toFixed(1)} s.\n`);
    console.log("| search | 20,000: median · max | 200,000: median · max | growth (median) | total at 200,000 | equals a scan | met (< 50 ms, ≤ 2.5 ×) |");
    console.log("| --- | --- | --- | --- | --- | --- | --- |");
    let failed = false;
    for (let i = 0; i < small.length; i++) {
      const s = small[i];
      const l = large[i];
      const growth = l.medianMs / s.medianMs;
      const met = l.maxMs < GOAL_MS && growth <= GOAL_GROWTH;
      if (!l.agrees || !s.agrees) failed = true;
      console.log(`| ${l.name} | ${s.medianMs.toFixed(1)} · ${s.maxMs.toFixed(1)} ms | ${l.medianMs.toFixed(1)} · ${l.maxMs.toFixed(1)} ms | ${growth.toFixed(2)} × | ${l.total} | ${l.agrees && s.agrees ? "yes" : "NO"} | ${met ? "met" : "not met"} |`);
    }
    console.log(`\nLoad average at the end: ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.`);
    if (failed) process.exitCode = 1;
  } finally {
    await ds.destroy();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

void main();
