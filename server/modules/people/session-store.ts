/**
 * express-session store over our sessions table, so a restart keeps people signed in and a
 * deactivated person's sessions can be ended by user id.
 */
import session from "express-session";
import type { DataSource } from "typeorm";
import { SessionRow } from "../../entities";
import { prepared } from "../../db/prepared";

const TOUCH_EVERY_MS = 5 * 60 * 1000;

type Cb<T = void> = (err?: unknown, value?: T) => void;

export class DbSessionStore extends session.Store {
  private sweeper?: NodeJS.Timeout;
  private readonly lastTouch = new Map<string, number>();

  constructor(
    private readonly ds: DataSource,
    private readonly now: () => Date = () => new Date(),
  ) {
    super();
  }

  private get repo() {
    return this.ds.getRepository(SessionRow);
  }

  get(sid: string, cb: Cb<session.SessionData | null>): void {
    // Every signed-in request reads its row: one prepared statement, not a query builder.
    let row: { data: string; expiresAtMs: number } | undefined;
    try {
      row = prepared(this.ds, `SELECT data, expiresAtMs FROM sessions WHERE sid = ?`).get(sid) as typeof row;
    } catch (e) {
      return cb(e);
    }
    if (!row || row.expiresAtMs <= this.now().getTime()) return cb(null, null);
    let data: session.SessionData;
    try {
      data = JSON.parse(row.data) as session.SessionData;
    } catch (e) {
      return cb(e);
    }
    cb(null, data);
  }

  set(sid: string, sess: session.SessionData, cb?: Cb): void {
    const userId = (sess as { passport?: { user?: number } }).passport?.user ?? null;
    this.repo
      .upsert({ sid, userId, expiresAtMs: this.expiry(sess), data: JSON.stringify(sess) }, ["sid"])
      .then(() => cb?.())
      .catch((e) => cb?.(e));
  }

  touch(sid: string, sess: session.SessionData, cb?: Cb): void {
    // Rolling sessions touch on every request; writing the new expiry at most every few minutes
    // keeps reads from turning into writes. The cookie's lifetime (hours) dwarfs the delay.
    const now = Date.now();
    if (now - (this.lastTouch.get(sid) ?? 0) < TOUCH_EVERY_MS) return cb?.();
    this.lastTouch.set(sid, now);
    if (this.lastTouch.size > 10_000) this.lastTouch.clear();
    this.repo
      .update({ sid }, { expiresAtMs: this.expiry(sess) })
      .then(() => cb?.())
      .catch((e) => cb?.(e));
  }

  destroy(sid: string, cb?: Cb): void {
    this.repo
      .delete({ sid })
      .then(() => cb?.())
      .catch((e) => cb?.(e));
  }

  /** Removes expired rows now and then; expired sessions are already refused by get(). */
  startSweeping(everyMs = 60 * 60 * 1000): void {
    this.sweeper = setInterval(() => {
      void this.ds.query(`DELETE FROM sessions WHERE expiresAtMs <= ?`, [this.now().getTime()]);
    }, everyMs);
    this.sweeper.unref();
  }

  stopSweeping(): void {
    if (this.sweeper) clearInterval(this.sweeper);
  }

  private expiry(sess: session.SessionData): number {
    const exp = sess.cookie?.expires ? new Date(sess.cookie.expires).getTime() : NaN;
    return Number.isFinite(exp) ? exp : this.now().getTime() + 24 * 60 * 60 * 1000;
  }
}

/** Ends every session of a person, except optionally the one making the request. */
export async function endSessionsOf(ds: DataSource, userId: number, exceptSid?: string): Promise<void> {
  if (exceptSid) await ds.query(`DELETE FROM sessions WHERE userId = ? AND sid <> ?`, [userId, exceptSid]);
  else await ds.query(`DELETE FROM sessions WHERE userId = ?`, [userId]);
}
