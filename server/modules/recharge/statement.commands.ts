/**
 * Mailing statements: the PDF of every final statement not yet mailed goes to its account's
 * owner (an external account's billing address) through the outbox, one transaction each, so a
 * crash loses nothing: the next pass picks up what is left. The mail-statements job calls this;
 * the billing run never does (a large month has many pages).
 */
import type { DataSource, EntityManager } from "typeorm";
import { centsToDecimalString } from "@shared/domain/money";
import { Account, BillingRun, Statement, User } from "../../entities";
import { serialTransaction } from "../../db/serial";
import { enqueueMail } from "../../core/outbox";
import { prepared } from "../../db/prepared";
import { pdfInputFor, statementLines } from "./statement.queries";
import { statementPdfPool, type StatementPdfRenderer } from "./statement-pdf-pool";
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

/** One statement's mail, ready to queue: its PDF rendered (null when the account has no one to mail). */
interface ReadyMail {
  st: Statement;
  mail: { to: string; subject: string; text: string; filename: string; pdf: Buffer } | null;
}

/** Reads what the statement's PDF shows and renders it (in a worker thread), outside any transaction. */
async function prepareMail(em: EntityManager, st: Statement, renderer: StatementPdfRenderer, opts: { tz?: string; facility: string }): Promise<ReadyMail> {
  const account = await em.findOneOrFail(Account, { where: { id: st.accountId } });
  const to = await ownerEmail(em, account);
  if (!to) return { st, mail: null };
  const lines = await statementLines(em, st.id);
  const pdf = await renderer.render(await pdfInputFor(em, st, account, lines, opts));
  return {
    st,
    mail: {
      to,
      subject: `${opts.facility} statement ${st.period} — ${account.code}`,
      text:
        `The statement for ${account.name} (${account.code}) for ${st.period} is attached: ` +
        `${lines.length} line(s), total ${centsToDecimalString(st.totalCents)} ${st.currency}.` +
        (account.kind === "external" ? "\nAn invoice follows from our payment service." : "\nInternal accounts are settled by journal transfer; nothing to pay."),
      filename: `statement-${st.period}-${account.code}.pdf`,
      pdf,
    },
  };
}

/** Queues the mail and marks the statement mailed, together; a statement another pass mailed meanwhile is left alone. */
async function queueMail(em: EntityManager, ready: ReadyMail, now: () => Date): Promise<void> {
  const marked = prepared(em.connection, `UPDATE statements SET mailedAt = ? WHERE id = ? AND mailedAt IS NULL`).run(now().toISOString(), ready.st.id);
  if (marked.changes === 0 || !ready.mail) return;
  const m = ready.mail;
  await enqueueMail(em, now(), {
    to: m.to,
    subject: m.subject,
    text: m.text,
    attachments: [{ filename: m.filename, contentType: "application/pdf", base64: m.pdf.toString("base64") }],
  });
}

type Settled<T> = { ok: true; value: T } | { ok: false; error: unknown };
const settle = <T>(p: Promise<T>): Promise<Settled<T>> => p.then((value) => ({ ok: true as const, value }), (error: unknown) => ({ ok: false as const, error }));

/**
 * Renders and queues the PDF of every final statement not yet mailed; answers how many it handled.
 * PDFs render in the pool's threads a few statements ahead, while each finished one is queued in a
 * transaction of its own, in order; a statement whose PDF fails stops the pass before it (the
 * next pass takes it up again), and none after it is marked mailed without its mail.
 */
export async function mailDueStatements(
  ds: DataSource,
  now: () => Date,
  opts: { runId?: number; limit?: number; tz?: string; facility?: string; renderer?: StatementPdfRenderer } = {},
): Promise<number> {
  const due = await dueStatements(ds, opts);
  const facility = opts.facility ?? DEFAULT_FACILITY_NAME;
  const renderer = opts.renderer ?? statementPdfPool();
  // Enough in flight to keep every thread busy, few enough that the PDFs waiting are a handful.
  const ahead = renderer.width * 2;
  const inFlight: Promise<Settled<ReadyMail>>[] = [];
  let started = 0;
  for (let i = 0; i < due.length; i++) {
    while (started < due.length && started < i + ahead) inFlight.push(settle(prepareMail(ds.manager, due[started++], renderer, { tz: opts.tz, facility })));
    const ready = await inFlight[i];
    inFlight[i] = undefined as never;
    if (!ready.ok) {
      // Let the renders already started finish before giving up, so none runs on unobserved.
      await Promise.all(inFlight.slice(i + 1));
      throw ready.error;
    }
    await serialTransaction(ds, (em) => queueMail(em, ready.value, now));
  }
  return due.length;
}
