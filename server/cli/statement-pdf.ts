/**
 * Writes one statement's PDF to a file, rendered as the mail-statements job renders it (in a
 * worker thread of the statement PDF pool, or in-process if none can start, which it says):
 * npm run statement:pdf -- <statement id> <file>
 */
import fs from "node:fs";
import { loadConfig } from "../config";
import { openDatabase } from "../db/data-source";
import { Refusal, readArgs, runCli } from "../ops/cli";
import { closeStatementPdfPool, statementPdfInputById, statementPdfPool } from "../modules/recharge";

const USAGE = "npm run statement:pdf -- <statement id> <file>";

await runCli("Writing the statement PDF", async () => {
  const { positionals } = readArgs({ options: {}, strict: true, allowPositionals: true }, USAGE);
  const id = Number(positionals[0]);
  if (positionals.length !== 2 || !Number.isInteger(id) || id < 1) throw new Refusal(`Give a statement's number and a file to write. Usage: ${USAGE}`, 2);
  const config = loadConfig();
  const ds = await openDatabase(config.DATABASE_PATH);
  try {
    const found = await statementPdfInputById(ds.manager, id, { tz: config.FACILITY_TZ, facility: config.FACILITY_NAME });
    if (!found) throw new Refusal(`There is no statement ${id} in ${config.DATABASE_PATH}.`);
    const pool = statementPdfPool();
    const pdf = await pool.render(found.input);
    fs.writeFileSync(positionals[1], pdf);
    const how = pool.rendered.inWorker > 0 ? "in a worker thread" : "in-process (no worker thread could start)";
    console.log(`Statement ${id} (${found.filename}) written to ${positionals[1]}: ${pdf.length} bytes, rendered ${how}.`);
  } finally {
    await closeStatementPdfPool();
    await ds.destroy();
  }
});
