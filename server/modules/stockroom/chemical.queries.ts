/** Reads of chemicals: the Stockroom's chemicals list (contract GET /api/chemicals) and one record. */
import type { DataSource } from "typeorm";
import type { ChemicalListQuery } from "@shared/schemas/stock";
import { Chemical } from "../../entities";
import { NotFound } from "../../errors";

export async function listChemicals(ds: DataSource, q: ChemicalListQuery): Promise<{ items: Chemical[]; total: number }> {
  const qb = ds.getRepository(Chemical).createQueryBuilder("ch");
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
    qb.where("(ch.name LIKE :like ESCAPE '\\' OR ch.casNumber LIKE :like ESCAPE '\\' OR ch.synonyms LIKE :like ESCAPE '\\' OR ch.formula LIKE :like ESCAPE '\\')", { like });
  }
  if (q.onHold === "true") qb.andWhere("ch.onHoldReason IS NOT NULL");
  if (q.onHold === "false") qb.andWhere("ch.onHoldReason IS NULL");
  const dir = q.dir === "desc" ? "DESC" : "ASC";
  qb.orderBy(`ch.${q.sort}`, dir).addOrderBy("ch.id", "ASC").skip(q.offset).take(q.limit);
  const [items, total] = await qb.getManyAndCount();
  return { items, total };
}

export async function getChemical(ds: DataSource, id: number): Promise<Chemical> {
  const c = await ds.getRepository(Chemical).findOneBy({ id });
  if (!c) throw new NotFound("That chemical");
  return c;
}
