/**
 * Mailing statements: the PDF of every final statement not yet mailed goes to its account's
 * owner (an external account's billing address) through the outbox, one transaction each, so a
 * crash loses nothing: the next pass picks up what is left. The mail-statements job calls this;
 * the billing run never does (a large month has many pages).
 */
import type { DataSource, EntityManager } from "typeorm";
import { centsToDecimalString } from "@shared/domain/money";
import { Account, BillingRun, ChargeLine, Statement, User } from "../../entities";
import { serialTransaction } from "../../db/serial";
import { enqueueMail } from "../../core/outbox";
import { pdfFor } from "./statement.queries";
import { DEFAULT_FACILITY_NAME } from "./recharge-deps";

async function ownerEmail(em: EntityManager, account: Account): Promise<string | null> {
  if (account.kind === "external") return account.billingEmail;
  if (account.ownerId) return (await em.findOne(User, { where: { id: account.ownerId } }))?.email ?? account.billingEmail;
  return account.billingEmail;
}

/** Final statements not yet mailed, oldest first (of one run, when given). */
function dueStatements(ds: DataSource, opts: { runId?: number; limit?: number }): Promise<Statement[]> {
  const qb = ds
    .getRepository(Statement)
    .createQueryBuilder("s")
    .innerJoin(BillingRun, "r", "r.id = s.runId")
    .where("r.status = 'final' AND s.mailedAt IS NULL");
  if (opts.runId) qb.andWhere("s.runId = :runId", { runId: opts.runId });
  return qb.orderBy("s.id").limit(opts.limit ?? 500).getMany();
}

/** Renders and queues one statement's PDF to its account's owner, and marks it mailed. */
async function mailStatement(em: EntityManager, st: Statement, now: () => Date, opts: { tz?: string; facility: string }): Promise<void> {
  const account = await em.findOneOrFail(Account, { where: { id: st.accountId } });
  const to = await ownerEmail(em, account);
  if (to) {
    const lines = await em.find(ChargeLine, { where: { statementId: st.id }, order: { at: "ASC", id: "ASC" } });
    const pdf = await pdfFor(em, st, account, lines, opts);
    await enqueueMail(em, now(), {
      to,
      subject: `${opts.facility} statement ${st.period} — ${account.code}`,
      text:
        `The statement for ${account.name} (${account.code}) for ${st.period} is attached: ` +
        `${lines.length} line(s), total ${centsToDecimalString(st.totalCents)} ${st.currency}.` +
        (account.kind === "external" ? "\nAn invoice follows from our payment service." : "\nInternal accounts are settled by journal transfer; nothing to pay."),
      attachments: [{ filename: `statement-${st.period}-${account.code}.pdf`, contentType: "application/pdf", base64: pdf.toString("base64") }],
    });
  }
  await em.update(Statement, st.id, { mailedAt: now().toISOString() });
}

/** Renders and queues the PDF of every final statement not yet mailed; answers how many it handled. */
export async function mailDueStatements(ds: DataSource, now: () => Date, opts: { runId?: number; limit?: number; tz?: string; facility?: string } = {}): Promise<number> {
  const due = await dueStatements(ds, opts);
  const facility = opts.facility ?? DEFAULT_FACILITY_NAME;
  for (const st of due) await serialTransaction(ds, (em) => mailStatement(em, st, now, { tz: opts.tz, facility }));
  return due.length;
}
