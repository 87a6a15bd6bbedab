/**
 * Write transactions, one at a time. SQLite has a single writer and TypeORM's better-sqlite3
 * driver shares one connection, so two transactions interleaved across awaits would collide.
 * Queuing them makes "check then write" (a slot check and the booking insert, a stock check and
 * the decrement) one serialised unit: of N simultaneous requests for a slot exactly one wins.
 */
import type { DataSource, EntityManager } from "typeorm";

const queues = new WeakMap<DataSource, Promise<unknown>>();

export function serialTransaction<T>(ds: DataSource, work: (em: EntityManager) => Promise<T>): Promise<T> {
  const previous = queues.get(ds) ?? Promise.resolve();
  const run = previous.catch(() => undefined).then(() => ds.transaction(work));
  queues.set(ds, run.catch(() => undefined));
  return run;
}
