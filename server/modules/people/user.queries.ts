/**
 * Reads of people: the signed-in person of a session (on every request), the administrator's
 * list, one person, and the organisations already known. Every SQL string that reads people for
 * the People area lives here.
 */
import { In, type DataSource } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import type { UserListQuery } from "@shared/schemas/users";
import { User } from "../../entities";
import { prepared } from "../../db/prepared";
import { matchingRowids, pageTotal, type BoundedTotal, type TextIndex } from "../../db/text-search";
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

/** People's searchable text (name, e-mail, organisation), kept by the TextSearch migration's triggers. */
export const USER_TEXT: TextIndex = { table: "user_text", columns: ["name", "email", "organisation"] };

/**
 * The administrator's list: by name, filtered by part of a name, e-mail or organisation (the
 * people's full-text index), with a total that stops counting at the bound of
 * server/db/text-search.ts.
 */
export async function listUsers(ds: DataSource, q: UserListQuery): Promise<{ items: User[] } & BoundedTotal> {
  const where = q.q ? `WHERE u.id IN (SELECT value FROM json_each(?))` : "";
  const args = q.q ? [JSON.stringify(matchingRowids(ds, USER_TEXT, q.q, Number.MAX_SAFE_INTEGER))] : [];
  const ids = (prepared(ds, `SELECT u.id FROM users u ${where} ORDER BY u.name, u.id LIMIT ? OFFSET ?`).all(...args, q.limit, q.offset) as { id: number }[]).map((r) => r.id);
  const total = pageTotal(ids.length, q.offset, q.limit, (upTo) => (prepared(ds, `SELECT COUNT(*) AS n FROM (SELECT 1 FROM users u ${where} LIMIT ?)`).get(...args, upTo) as { n: number }).n);
  // The page's people with their roles, as entities for the presenter, in the page's order.
  const found = new Map((ids.length ? await ds.getRepository(User).findBy({ id: In(ids) }) : []).map((u) => [u.id, u]));
  return { items: ids.map((id) => found.get(id)!), ...total };
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
