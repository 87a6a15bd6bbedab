/**
 * Reads of people: the signed-in person of a session (on every request), the administrator's
 * list, one person, and the organisations already known. Every SQL string that reads people for
 * the People area lives here.
 */
import type { DataSource } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import type { UserListQuery } from "@shared/schemas/users";
import { User } from "../../entities";
import { prepared } from "../../db/prepared";
import type { AuthUser } from "../../middleware/auth";

interface SignedInRow {
  id: number;
  email: string;
  name: string;
  active: number;
  groupId: number | null;
  organisation: string | null;
  roles: string | null;
  leadOf: string | null;
}

/**
 * The signed-in person of a session, read afresh on every request (so a deactivation or a role
 * change shows on the very next one) with one prepared statement: the TypeORM entity with its
 * eager roles cost several times the whole rest of a signed-in request. Null when unknown or
 * deactivated.
 */
export function signedIn(ds: DataSource, id: number): AuthUser | null {
  const row = prepared(
    ds,
    `SELECT u.id, u.email, u.name, u.active, u.groupId, u.organisation,
            (SELECT group_concat(r.role, ',') FROM user_roles r WHERE r.userId = u.id) AS roles,
            (SELECT group_concat(g.id, ',') FROM research_groups g WHERE g.leadId = u.id) AS leadOf
       FROM users u WHERE u.id = ?`,
  ).get(id) as SignedInRow | undefined;
  if (!row || !row.active) return null;
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: (row.roles ? (row.roles.split(",") as Role[]) : []).sort(),
    groupId: row.groupId,
    leadOf: row.leadOf ? row.leadOf.split(",").map(Number) : [],
    organisation: row.organisation,
  };
}

export function findUser(ds: DataSource, id: number): Promise<User | null> {
  return ds.getRepository(User).findOne({ where: { id } });
}

export function findUserByEmail(ds: DataSource, email: string): Promise<User | null> {
  return ds.getRepository(User).findOne({ where: { email: email.trim().toLowerCase() } });
}

/** The administrator's list: by name, filtered by name, e-mail or organisation. */
export async function listUsers(ds: DataSource, q: UserListQuery): Promise<{ items: User[]; total: number }> {
  const qb = ds.getRepository(User).createQueryBuilder("u").leftJoinAndSelect("u.roleRows", "r").orderBy("u.name", "ASC");
  if (q.q) qb.where("(u.name LIKE :q OR u.email LIKE :q OR u.organisation LIKE :q)", { q: `%${q.q}%` });
  const [items, total] = await qb.skip(q.offset).take(q.limit).getManyAndCount();
  return { items, total };
}

/** External customers' organisations as written on their accounts and on their people, once each. */
export async function knownOrganisations(ds: DataSource): Promise<string[]> {
  const rows: { organisation: string }[] = await ds.query(
    `SELECT organisation FROM accounts WHERE kind = 'external' AND organisation IS NOT NULL AND TRIM(organisation) <> ''
     UNION SELECT organisation FROM users WHERE organisation IS NOT NULL AND TRIM(organisation) <> ''
     ORDER BY 1`,
  );
  return rows.map((r) => r.organisation);
}

/** One row of the people export: the account, its roles and where the person belongs, by name. */
export interface PersonExportRow {
  name: string;
  email: string;
  roles: string | null;
  department: string | null;
  researchGroup: string | null;
  organisation: string | null;
  active: number;
  createdAt: string;
}

/** Everyone with an account, by name, for the administrator's export (an access review). */
export function peopleForExport(ds: DataSource): Promise<PersonExportRow[]> {
  return ds.query(
    `SELECT u.name, u.email,
            (SELECT group_concat(role, '; ') FROM (SELECT r.role FROM user_roles r WHERE r.userId = u.id ORDER BY r.role)) AS roles,
            d.name AS department, g.name AS researchGroup, u.organisation, u.active, u.createdAt
       FROM users u
       LEFT JOIN departments d ON d.id = u.departmentId
       LEFT JOIN research_groups g ON g.id = u.groupId
      ORDER BY u.name COLLATE NOCASE, u.id`,
  );
}
