/**
 * Reads of statements: the list the caller may see, one statement's PDF, and what the statement
 * policy decides on. The list's SQL filter is the statement policy's `download` rule in SQL (so a
 * page can be counted and cut in the database); the API tests hold the two to the same answer.
 */
import type { EntityManager } from "typeorm";
import type { InvoiceStatusName, StatementListItemDto } from "@shared/schemas/recharge";
import { Account, ChargeLine, Statement } from "../../entities";
import { NotFound } from "../../errors";
import { hasRole, type AuthUser } from "../../middleware/auth";
import { statementPolicy, type StatementFacts } from "./statement.policy";
import { CONSUMABLES_GROUP, OTHER_GROUP, groupOrder, type StatementPdfInput } from "./statement-pdf";
import { statementPdfPool } from "./statement-pdf-pool";
import type { RechargeDeps } from "./recharge-deps";

/** The statement as the policy sees it. */
export function statementFacts(
  st: Pick<Statement, "id" | "invoiceStatus" | "invoiceUrl">,
  account: Pick<Account, "kind" | "ownerId">,
  runStatus: "final" | "voided",
  actorIsMember: boolean,
): StatementFacts {
  return { id: st.id, accountKind: account.kind, accountOwnerId: account.ownerId, actorIsMember, runStatus, invoiceStatus: st.invoiceStatus, invoiceUrl: st.invoiceUrl };
}

/** Ids of the accounts the person is a member of. */
export async function memberAccountIds(em: EntityManager, userId: number): Promise<Set<number>> {
  const rows: { accountId: number }[] = await em.query(`SELECT accountId FROM account_members WHERE userId = ?`, [userId]);
  return new Set(rows.map((r) => Number(r.accountId)));
}

/** GET /api/billing/statements: the manager every statement; an owner their accounts'; a customer's people their account's. */
export async function listStatements(deps: RechargeDeps, actor: AuthUser, q: { limit: number; offset: number }): Promise<{ items: StatementListItemDto[]; total: number }> {
  const ds = deps.ds;
  const manager = hasRole(actor, "manager");
  // The statement policy's `download`, in SQL.
  const where = manager ? "" : `AND (a.ownerId = ? OR (a.kind = 'external' AND EXISTS (SELECT 1 FROM account_members m WHERE m.accountId = a.id AND m.userId = ?)))`;
  const params = manager ? [] : [actor.id, actor.id];
  const base = `FROM statements s JOIN accounts a ON a.id = s.accountId JOIN billing_runs r ON r.id = s.runId WHERE 1 = 1 ${where}`;
  const total = Number((await ds.query(`SELECT COUNT(*) AS n ${base}`, params))[0].n);
  const rows: Record<string, unknown>[] = await ds.query(
    `SELECT s.id, s.runId, s.period, r.status AS runStatus, s.accountId, a.code, a.name, a.kind, a.ownerId, s.totalCents, s.currency, s.invoiceStatus, s.invoiceNumber, s.invoiceUrl, s.paidAt
     ${base} ORDER BY s.period DESC, s.id DESC LIMIT ? OFFSET ?`,
    [...params, q.limit, q.offset],
  );
  const mine = await memberAccountIds(ds.manager, actor.id);
  return {
    total,
    items: rows.map((r) => {
      const runStatus = r.runStatus as "final" | "voided";
      const kind = r.kind as "internal" | "external";
      const invoiceStatus = r.invoiceStatus as InvoiceStatusName;
      const invoiceUrl = (r.invoiceUrl as string | null) ?? null;
      const facts = statementFacts(
        { id: Number(r.id), invoiceStatus, invoiceUrl },
        { kind, ownerId: r.ownerId == null ? null : Number(r.ownerId) },
        runStatus,
        mine.has(Number(r.accountId)),
      );
      return {
        id: Number(r.id),
        runId: Number(r.runId),
        period: String(r.period),
        runStatus,
        accountId: Number(r.accountId),
        accountCode: String(r.code),
        accountName: String(r.name),
        accountKind: kind,
        total: Number(r.totalCents),
        currency: String(r.currency),
        warnings: [],
        invoiceStatus,
        invoiceNumber: (r.invoiceNumber as string | null) ?? null,
        invoiceUrl,
        paidAt: (r.paidAt as string | null) ?? null,
        abilities: statementPolicy.abilities(actor, facts),
      };
    }),
  };
}

/** Names by id from one table (users or instruments), read 500 ids at a time. */
async function namesOf(em: EntityManager, table: "users" | "instruments", ids: number[]): Promise<Map<number, string>> {
  const names = new Map<number, string>();
  for (let i = 0; i < ids.length; i += 500) {
    const rows: { id: number; name: string }[] = await em.query(`SELECT id, name FROM ${table} WHERE id IN (${ids.slice(i, i + 500).map(() => "?").join(",")})`, ids.slice(i, i + 500));
    for (const r of rows) names.set(r.id, r.name);
  }
  return names;
}

const distinctIds = (values: (number | null)[]) => [...new Set(values.filter((x): x is number => x != null))];

const INVOICE_WORDS: Record<InvoiceStatusName, string> = {
  none: "nothing to pay",
  queued: "invoice being prepared",
  open: "invoice open",
  paid: "paid",
  payment_failed: "payment declined; invoice open",
  void: "void",
};

type PdfLineRow = Pick<ChargeLine, "at" | "description" | "quantity" | "unit" | "unitPriceCents" | "amountCents" | "userId" | "instrumentId" | "usageId">;

/**
 * What a statement's PDF shows: its lines with the person on each, grouped for their subtotals
 * (per instrument, consumables, adjustments and credits), its total and how it is settled.
 */
export async function pdfInputFor(em: EntityManager, st: Statement, account: Account, lines: PdfLineRow[], opts: { tz?: string; facility: string }): Promise<StatementPdfInput> {
  const people = await namesOf(em, "users", distinctIds(lines.map((l) => l.userId)));
  const instruments = await namesOf(em, "instruments", distinctIds(lines.map((l) => (l.usageId == null ? l.instrumentId : null))));
  const groupOf = (l: PdfLineRow) =>
    l.usageId != null ? CONSUMABLES_GROUP : l.instrumentId != null ? (instruments.get(l.instrumentId) ?? `Instrument #${l.instrumentId}`) : OTHER_GROUP;
  // Lines come by date; a stable sort by group keeps each group's lines in date order.
  const grouped = lines.map((l) => ({ ...l, group: groupOf(l) })).sort((a, b) => groupOrder(a.group, b.group));
  return {
    facility: opts.facility,
    createdAt: st.createdAt,
    period: st.period,
    currency: st.currency,
    account: { code: account.code, name: account.name, kind: account.kind, organisation: account.organisation },
    lines: grouped.map((l) => ({
      at: l.at,
      description: l.description,
      quantity: l.quantity,
      unit: l.unit,
      unitPriceCents: l.unitPriceCents,
      amountCents: l.amountCents,
      person: l.userId == null ? null : (people.get(l.userId) ?? null),
      group: l.group,
    })),
    totalCents: st.totalCents,
    status: account.kind === "external" ? INVOICE_WORDS[st.invoiceStatus] : "settled by journal",
    invoiceNumber: st.invoiceNumber,
    paymentUrl: account.kind === "external" && st.invoiceStatus !== "paid" && st.invoiceStatus !== "void" ? st.invoiceUrl : null,
    tz: opts.tz,
  };
}

/** A statement's lines in the order they print within their groups: by date. */
export function statementLines(em: EntityManager, statementId: number): Promise<PdfLineRow[]> {
  return em.query(
    `SELECT at, description, quantity, unit, unitPriceCents, amountCents, userId, instrumentId, usageId FROM charge_lines WHERE statementId = ? ORDER BY at, id`,
    [statementId],
  );
}

/** What one statement's PDF shows and its file name, by id (for operators' tools, which hold the database itself). */
export async function statementPdfInputById(em: EntityManager, statementId: number, opts: { tz?: string; facility: string }): Promise<{ input: StatementPdfInput; filename: string } | null> {
  const st = await em.findOneBy(Statement, { id: statementId });
  const account = st ? await em.findOneBy(Account, { id: st.accountId }) : null;
  if (!st || !account) return null;
  const input = await pdfInputFor(em, st, account, await statementLines(em, statementId), opts);
  return { input, filename: `statement-${st.period}-${account.code}.pdf` };
}

/** GET /api/billing/statements/:id/statement.pdf, for those the statement policy lets download it (404 for anyone else). */
export async function statementPdf(deps: RechargeDeps, actor: AuthUser, statementId: number): Promise<{ pdf: Buffer; filename: string }> {
  const em = deps.ds.manager;
  const st = await em.findOneBy(Statement, { id: statementId });
  const account = st ? await em.findOneBy(Account, { id: st.accountId }) : null;
  if (!st || !account) throw new NotFound("That statement");
  const [{ status }]: { status: "final" | "voided" }[] = await em.query(`SELECT status FROM billing_runs WHERE id = ?`, [st.runId]);
  const member = (await memberAccountIds(em, actor.id)).has(account.id);
  statementPolicy.authorize(actor, "download", statementFacts(st, account, status, member));
  const lines = await statementLines(em, statementId);
  const input = await pdfInputFor(em, st, account, lines, { tz: deps.config.FACILITY_TZ, facility: deps.config.FACILITY_NAME });
  // Drawn in a worker thread, so other requests go on meanwhile.
  const pdf = await statementPdfPool().render(input);
  return { pdf, filename: `statement-${st.period}-${account.code}.pdf` };
}
