/**
 * A statement as a PDF (pdfkit): the facility, the account, the month, one row per line with its
 * amount, and the total, which is the sum of the rows; the currency and the rounding rule; for
 * an external account the invoice's number, status and payment link. Mailed to the account's
 * owner by the mail-statements job and downloadable from the billing run.
 */
import PDFDocument from "pdfkit";
import { DateTime } from "luxon";
import { formatMoney } from "@shared/domain/money";

/** The rounding rule of shared/domain/money.ts and billing.ts, in words, printed on every statement. */
export const ROUNDING_RULE =
  "Amounts are in whole cents. Each line is rounded to the cent, half away from zero; billed minutes are rounded up to the rate's increment; the total is the sum of the rounded lines.";

export interface StatementPdfInput {
  facility: string;
  period: string;
  currency: string;
  account: { code: string; name: string; kind: string; organisation: string | null };
  lines: { at: string; description: string; amountCents: number; person?: string | null }[];
  totalCents: number;
  status?: string;
  invoiceNumber?: string | null;
  /** The payment service's hosted invoice page, for external accounts. */
  paymentUrl?: string | null;
  /** Dates print in the facility's time zone (a session at 23:00 local belongs to that day). */
  tz?: string;
}

export function renderStatementPdf(input: StatementPdfInput): Promise<Buffer> {
  const doc = new PDFDocument({ size: "A4", margin: 48, info: { Title: `Statement ${input.period} ${input.account.code}`, Author: "Phasebook" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on("end", () => resolve(Buffer.concat(chunks))));
  const money = (c: number) => formatMoney(c, input.currency);
  const tz = input.tz ?? "UTC";
  const localDate = (iso: string) => DateTime.fromISO(iso, { zone: tz }).toISODate() ?? iso.slice(0, 10);

  doc.font("Helvetica-Bold").fontSize(16).text(`${input.facility} — statement for ${input.period}`);
  doc.moveDown(0.4).font("Helvetica").fontSize(10);
  doc.text(`Account: ${input.account.code} — ${input.account.name}`);
  if (input.account.organisation) doc.text(`Organisation: ${input.account.organisation}`);
  doc.text(`Currency: ${input.currency}. Dates in ${tz}.`);
  doc.text(input.account.kind === "internal" ? "Settled by internal journal transfer." : `Settled by invoice${input.invoiceNumber ? ` ${input.invoiceNumber}` : " (number to follow)"}.`);
  if (input.status) doc.text(`Status: ${input.status}`);
  if (input.account.kind !== "internal" && input.paymentUrl) {
    doc.text("Pay online: ", { continued: true }).fillColor("#1d4f73").text(input.paymentUrl, { link: input.paymentUrl, underline: true }).fillColor("black");
  }
  doc.moveDown(0.3).fontSize(8).text(ROUNDING_RULE);
  doc.moveDown(0.8);

  const left = doc.page.margins.left;
  const right = doc.page.width - doc.page.margins.right;
  const amountWidth = 90;
  const dateWidth = 70;
  const descWidth = right - left - amountWidth - dateWidth - 12;
  // One line per row (long descriptions are cut with an ellipsis): measuring wrapped text for
  // thousands of rows costs more than the rest of the month's billing together.
  const rowHeight = 12;
  // Helvetica's widest common letters are about 0.6 em (5.1 pt at 8.5 pt), so this many always fit.
  const maxChars = Math.floor(descWidth / 5.1);
  const row = (date: string, desc: string, amount: string, bold = false) => {
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(8.5);
    if (doc.y + rowHeight > doc.page.height - doc.page.margins.bottom) doc.addPage();
    const y = doc.y;
    doc.text(date, left, y, { width: dateWidth, lineBreak: false });
    doc.text(desc.length > maxChars ? `${desc.slice(0, maxChars - 1)}…` : desc, left + dateWidth + 6, y, { lineBreak: false });
    doc.text(amount, right - amountWidth, y, { width: amountWidth, align: "right", lineBreak: false });
    doc.x = left;
    doc.y = y + rowHeight;
  };
  row("Date", "Description", `Amount (${input.currency})`, true);
  for (const l of input.lines) row(localDate(l.at), l.person ? `${l.description} — ${l.person}` : l.description, money(l.amountCents));
  doc.moveDown(0.5);
  row("", "Total (sum of the lines above)", money(input.totalCents), true);
  doc.end();
  return done;
}
