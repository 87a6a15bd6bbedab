/**
 * A statement as a PDF (pdfkit) a finance office can check with a calculator: the facility, the
 * account, the month, then one table — each line's date, description (wrapped, never cut off),
 * quantity, unit, unit price and amount — grouped per instrument, consumables, and adjustments
 * and credits, each group with its subtotal, then the total (the sum of the subtotals), the
 * currency and the rounding rule. For an external account, the invoice's number, status and
 * payment link. Mailed to the account's owner by the mail-statements job and downloadable from
 * the billing run.
 */
import PDFDocument from "pdfkit";
import { DateTime } from "luxon";
import { CHARGE_ROUNDING_NOTE } from "@shared/domain/charges";
import { formatQuantity, formatUnitPrice } from "@shared/domain/charge-format";
import { formatMoney, sumCents } from "@shared/domain/money";
import { pdfTable, type PdfColumn } from "../../core/pdf-table";

/** The rounding rule printed on every statement: charges.ts's, and how billed minutes are reached. */
export const ROUNDING_RULE = `${CHARGE_ROUNDING_NOTE} Billed minutes are rounded up to the rate's increment before they are priced.`;

export interface StatementPdfLine {
  at: string;
  description: string;
  /** Exact text (a decimal or "n/d"). */
  quantity: string;
  unit: string;
  /** Price of one unit in cents, exact text. */
  unitPriceCents: string;
  amountCents: number;
  person?: string | null;
  /** The group the line's subtotal belongs to: an instrument's name, consumables, or adjustments and credits. */
  group: string;
}

export interface StatementPdfInput {
  facility: string;
  /**
   * When the statement was made (ISO): the PDF's creation date, so the same statement always
   * renders to the same bytes, wherever and whenever it is rendered.
   */
  createdAt: string;
  period: string;
  currency: string;
  account: { code: string; name: string; kind: string; organisation: string | null };
  /** In group order, each group's lines by date. */
  lines: StatementPdfLine[];
  totalCents: number;
  status?: string;
  invoiceNumber?: string | null;
  /** The payment service's hosted invoice page, for external accounts. */
  paymentUrl?: string | null;
  /** Dates print in the facility's time zone (a session at 23:00 local belongs to that day). */
  tz?: string;
}

/** Group names after the instruments, which sort by name before them. */
export const CONSUMABLES_GROUP = "Consumables";
export const OTHER_GROUP = "Adjustments and credits";

/** The subtotal groups in print order: instruments by name, then consumables, then adjustments and credits. */
export function groupOrder(a: string, b: string): number {
  const rank = (g: string) => (g === CONSUMABLES_GROUP ? 1 : g === OTHER_GROUP ? 2 : 0);
  return rank(a) - rank(b) || a.localeCompare(b);
}

// A4 less 48 pt margins: 499 pt of columns.
const COLUMNS = (currency: string): PdfColumn[] => [
  { header: "Date", width: 56 },
  { header: "Description", width: 199 },
  { header: "Quantity", width: 52, align: "right" },
  { header: "Unit", width: 30 },
  { header: `Unit price (${currency})`, width: 80, align: "right" },
  { header: `Amount (${currency})`, width: 82, align: "right" },
];

export async function renderStatementPdf(input: StatementPdfInput): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margin: 48,
    // pdfkit would stamp the clock's time, and derive the file's identifier from it, otherwise.
    info: { Title: `Statement ${input.period} ${input.account.code}`, Author: "Phasebook", CreationDate: new Date(input.createdAt) },
  });
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
  doc.moveDown(0.8);

  const rows: string[][] = [];
  const bold = new Set<number>();
  const subtotals: number[] = [];
  let i = 0;
  while (i < input.lines.length) {
    const group = input.lines[i].group;
    bold.add(rows.length);
    rows.push(["", group, "", "", "", ""]);
    const amounts: number[] = [];
    for (; i < input.lines.length && input.lines[i].group === group; i++) {
      const l = input.lines[i];
      amounts.push(l.amountCents);
      rows.push([
        localDate(l.at),
        l.person ? `${l.description} — ${l.person}` : l.description,
        formatQuantity(l.quantity),
        l.unit,
        formatUnitPrice(l.unitPriceCents, input.currency),
        money(l.amountCents),
      ]);
    }
    const subtotal = sumCents(amounts);
    subtotals.push(subtotal);
    bold.add(rows.length);
    rows.push(["", `Subtotal, ${group}`, "", "", "", money(subtotal)]);
  }
  if (rows.length === 0) rows.push(["", "No charges this month.", "", "", "", ""]);
  bold.add(rows.length);
  rows.push(["", `Total (${subtotals.length > 1 ? "sum of the subtotals" : "sum of the lines above"})`, "", "", "", money(input.totalCents)]);
  pdfTable(doc, COLUMNS(input.currency), rows, { boldRows: bold });

  doc.font("Helvetica").fontSize(8).fillColor("black").text(`Amounts in ${input.currency}. ${ROUNDING_RULE}`, doc.page.margins.left);
  doc.end();
  return done;
}
