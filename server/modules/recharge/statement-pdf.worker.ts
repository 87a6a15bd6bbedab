/**
 * The statement PDF, rendered in a worker thread of the statement PDF pool
 * (statement-pdf-pool.ts): a month's statements render side by side on every core, and a
 * download never holds up other requests while its pages are drawn. The same function renders
 * in-process when no worker can start, so both give the same bytes.
 */
import { renderStatementPdf, type StatementPdfInput } from "./statement-pdf";

export default async function renderInWorker(input: StatementPdfInput): Promise<Uint8Array> {
  return new Uint8Array(await renderStatementPdf(input));
}
