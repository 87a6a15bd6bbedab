import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Text search without reading every row: FTS5 tables with the trigram tokenizer (every run of
 * three characters indexed, so parts of words and CAS numbers are found) over the searchable
 * text of chemicals (name, synonyms one per line, CAS number, formula), containers (lot,
 * supplier) and people (name, e-mail, organisation). Each holds its own copy, rowid = the row's
 * id, filled here from the rows already there and kept in step by three triggers per table
 * (insert, change of a searched column, delete). server/db/text-search.ts reads them.
 *
 * Also the indexes the bounded lists walk: chemicals and people by name, containers by quantity,
 * and containers by (chemicalId, locationId, status) and (locationId, status) for counting one
 * chemical's (one place's) containers in a place and state from the index alone.
 *
 * TypeORM knows neither the FTS tables nor the triggers: a later migration that rebuilds
 * chemicals, containers or users must create the triggers again (tests/api/schema.test.ts lists them).
 */
const TOKENIZER = `tokenize = 'trigram case_sensitive 0'`;
/** A chemical's synonyms (a JSON array) as text, one per line. */
const synonymLines = (column: string) =>
  `(SELECT COALESCE(group_concat("value", char(10)), '') FROM json_each(CASE WHEN json_valid(${column}) THEN ${column} ELSE '[]' END))`;

const INDEXES: { table: string; fts: string; columns: string[]; values: (row: "NEW" | "src") => string[] }[] = [
  {
    table: "chemicals",
    fts: "chemical_text",
    columns: ["name", "synonyms", "casNumber", "formula"],
    values: (r) => [`${r}."name"`, synonymLines(`${r}."synonyms"`), `${r}."casNumber"`, `COALESCE(${r}."formula", '')`],
  },
  { table: "containers", fts: "container_text", columns: ["lot", "supplier"], values: (r) => [`${r}."lot"`, `${r}."supplier"`] },
  {
    table: "users",
    fts: "user_text",
    columns: ["name", "email", "organisation"],
    values: (r) => [`${r}."name"`, `${r}."email"`, `COALESCE(${r}."organisation", '')`],
  },
];

export class TextSearch1796239235279 implements MigrationInterface {
  name = "TextSearch1796239235279";

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE INDEX "IDX_aae3aad23d6b7c9d16bc6f1b00" ON "chemicals" ("name") `);
    await queryRunner.query(`CREATE INDEX "IDX_67da21984f4ba1f226b6d6b160" ON "containers" ("chemicalId", "locationId", "status") `);
    await queryRunner.query(`CREATE INDEX "IDX_51b8b26ac168fbe7d6f5653e6c" ON "users" ("name") `);
    await queryRunner.query(`CREATE INDEX "IDX_7fe99073ebbc699873b3ae9f40" ON "containers" ("quantity") `);
    await queryRunner.query(`CREATE INDEX "IDX_e6b479825e696f30db5fa103f8" ON "containers" ("locationId", "status") `);
    for (const ix of INDEXES) {
      const cols = ix.columns.map((c) => `"${c}"`).join(", ");
      await queryRunner.query(`CREATE VIRTUAL TABLE "${ix.fts}" USING fts5(${cols}, ${TOKENIZER})`);
      await queryRunner.query(`INSERT INTO "${ix.fts}" ("rowid", ${cols}) SELECT src."id", ${ix.values("src").join(", ")} FROM "${ix.table}" src`);
      await queryRunner.query(
        `CREATE TRIGGER "${ix.fts}_insert" AFTER INSERT ON "${ix.table}" BEGIN
           INSERT INTO "${ix.fts}" ("rowid", ${cols}) VALUES (NEW."id", ${ix.values("NEW").join(", ")});
         END`,
      );
      await queryRunner.query(
        `CREATE TRIGGER "${ix.fts}_update" AFTER UPDATE OF ${cols} ON "${ix.table}" BEGIN
           UPDATE "${ix.fts}" SET ${ix.columns.map((c, i) => `"${c}" = ${ix.values("NEW")[i]}`).join(", ")} WHERE "rowid" = NEW."id";
         END`,
      );
      await queryRunner.query(
        `CREATE TRIGGER "${ix.fts}_delete" AFTER DELETE ON "${ix.table}" BEGIN
           DELETE FROM "${ix.fts}" WHERE "rowid" = OLD."id";
         END`,
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const ix of [...INDEXES].reverse()) {
      for (const t of ["delete", "update", "insert"]) await queryRunner.query(`DROP TRIGGER "${ix.fts}_${t}"`);
      await queryRunner.query(`DROP TABLE "${ix.fts}"`);
    }
    await queryRunner.query(`DROP INDEX "IDX_e6b479825e696f30db5fa103f8"`);
    await queryRunner.query(`DROP INDEX "IDX_7fe99073ebbc699873b3ae9f40"`);
    await queryRunner.query(`DROP INDEX "IDX_51b8b26ac168fbe7d6f5653e6c"`);
    await queryRunner.query(`DROP INDEX "IDX_67da21984f4ba1f226b6d6b160"`);
    await queryRunner.query(`DROP INDEX "IDX_aae3aad23d6b7c9d16bc6f1b00"`);
  }
}
