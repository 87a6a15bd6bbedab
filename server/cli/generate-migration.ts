/**
 * Writes a new migration with the SQL that brings a database built by the existing migrations
 * in line with the entities: `npm run db:migration -- add-bookings`. Review the file before
 * committing; migrations are never edited after they land.
 */
import fs from "node:fs";
import path from "node:path";
import { createDataSource } from "../db/data-source";

const name = process.argv[2];
if (!name || !/^[a-z0-9-]+$/.test(name)) {
  console.error("Give the migration a kebab-case name, e.g. npm run db:migration -- add-bookings");
  process.exit(2);
}
const ds = createDataSource(":memory:");
await ds.initialize();
await ds.runMigrations();
const log = await ds.driver.createSchemaBuilder().log();
await ds.destroy();
if (log.upQueries.length === 0) {
  console.log("The entities match the migrations; nothing to write.");
  process.exit(0);
}
const stamp = Date.now();
const className = name.replace(/(^|-)([a-z0-9])/g, (_m, _d, c: string) => c.toUpperCase()) + stamp;
const q = (s: string) => "`" + s.replace(/`/g, "\\`").replace(/\$\{/g, "\\${") + "`";
const up = log.upQueries.map((x) => `    await queryRunner.query(${q(x.query)});`).join("\n");
const down = log.downQueries.reverse().map((x) => `    await queryRunner.query(${q(x.query)});`).join("\n");
const file = path.join("server/db/migrations", `${stamp}-${name}.ts`);
fs.writeFileSync(
  file,
  `import type { MigrationInterface, QueryRunner } from "typeorm";\n\nexport class ${className} implements MigrationInterface {\n  name = "${className}";\n\n  async up(queryRunner: QueryRunner): Promise<void> {\n${up}\n  }\n\n  async down(queryRunner: QueryRunner): Promise<void> {\n${down}\n  }\n}\n`,
);
console.log(`Wrote ${file}. Add it to server/db/migrations/index.ts and review it.`);
