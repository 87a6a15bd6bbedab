/**
 * The fake's hosted invoice page: what an external customer opens from the invoice e-mail.
 * Deliberately plain; it exists so a person (or a browser test) can pay or decline an invoice
 * and watch Phasebook receive the webhook, with no card form and no money involved.
 */
import type { Customer, InvoiceItem, StoredInvoice } from "./ledger";

export function formatMoney(minor: number, currency: string): string {
  const code = currency.toUpperCase();
  let digits = 2;
  try {
    digits = new Intl.NumberFormat("en", { style: "currency", currency: code }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    // An unknown code still shows a number rather than breaking the page.
  }
  const major = minor / 10 ** digits;
  try {
    return new Intl.NumberFormat("en-CA", { style: "currency", currency: code, currencyDisplay: "code" }).format(major);
  } catch {
    return `${major.toFixed(digits)} ${code}`;
  }
}

function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function day(unix: number | null): string {
  return unix === null ? "—" : new Date(unix * 1000).toISOString().slice(0, 10);
}

const STYLE = `
  :root { color-scheme: light; }
  body { margin: 0; background: #eef1f4; color: #1b2430; font: 15px/1.5 system-ui, -apple-system, "Segoe UI", sans-serif; }
  main { max-width: 640px; margin: 3rem auto; background: #fff; border: 1px solid #d5dbe3; border-radius: 6px; padding: 2rem; }
  header { display: flex; justify-content: space-between; align-items: baseline; gap: 1rem; }
  h1 { font-size: 1.3rem; margin: 0; }
  .from { color: #56606e; margin: .25rem 0 1.5rem; }
  .state { font-size: .8rem; font-weight: 600; letter-spacing: .05em; text-transform: uppercase; padding: .15rem .5rem; border-radius: 3px; border: 1px solid currentColor; }
  .state-open { color: #8a5a00; } .state-paid { color: #1f7a3a; } .state-void, .state-draft { color: #6b7280; }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: .2rem 1rem; margin: 0 0 1.5rem; }
  dt { color: #56606e; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1.5rem; }
  th, td { padding: .45rem 0; border-bottom: 1px solid #e4e8ee; text-align: left; }
  th { font-size: .75rem; text-transform: uppercase; letter-spacing: .05em; color: #56606e; }
  td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
  tfoot td { font-weight: 600; border-bottom: none; }
  .actions { display: flex; gap: .75rem; align-items: center; }
  button { font: inherit; padding: .55rem 1.2rem; border-radius: 4px; cursor: pointer; border: 1px solid #1c4f82; }
  button.pay { background: #1c4f82; color: #fff; }
  button.decline { background: #fff; color: #1c4f82; }
  .notice { padding: .75rem 1rem; border-radius: 4px; background: #f3f5f8; border: 1px solid #d5dbe3; }
  .paid { background: #e9f6ee; border-color: #a9d8b8; color: #1f5e33; font-weight: 600; }
  footer { margin-top: 2rem; color: #7a8391; font-size: .8rem; }
`;

export function renderInvoicePage(
  inv: StoredInvoice,
  items: InvoiceItem[],
  customer: Customer | undefined,
  notice?: string,
): string {
  const rows = items
    .map(
      (i) =>
        `<tr><td>${esc(i.description ?? "(no description)")}</td><td class="num">${i.quantity}</td>` +
        `<td class="num">${esc(formatMoney(i.amount, i.currency))}</td></tr>`,
    )
    .join("");
  let action: string;
  if (inv.status === "open") {
    action = `<div class="actions">
      <form method="post" action="/invoices/${esc(inv.id)}/pay"><button class="pay" type="submit">Pay now</button></form>
      <form method="post" action="/invoices/${esc(inv.id)}/fail"><button class="decline" type="submit">Decline payment (test)</button></form>
    </div>`;
  } else if (inv.status === "paid") {
    action = `<p class="notice paid">Paid ${esc(day(inv.status_transitions.paid_at))}. Thank you.</p>`;
  } else if (inv.status === "void") {
    action = `<p class="notice">This invoice was voided and is not payable.</p>`;
  } else {
    action = `<p class="notice">This invoice is still a draft and cannot be paid yet.</p>`;
  }
  const title = inv.number ? `Invoice ${inv.number}` : "Draft invoice";
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title><style>${STYLE}</style></head><body><main>
<header><h1>${esc(title)}</h1><span class="state state-${inv.status}">${inv.status}</span></header>
<p class="from">from ${esc(inv.account_name)}</p>
${notice ? `<p class="notice">${esc(notice)}</p>` : ""}
<dl>
  <dt>Billed to</dt><dd>${esc(inv.customer_name ?? customer?.name ?? "—")}${inv.customer_email ? `<br>${esc(inv.customer_email)}` : ""}</dd>
  <dt>Issued</dt><dd>${esc(day(inv.status_transitions.finalized_at))}</dd>
  <dt>Due</dt><dd>${esc(day(inv.due_date))}</dd>
</dl>
<table><thead><tr><th>Description</th><th class="num">Qty</th><th class="num">Amount</th></tr></thead>
<tbody>${rows || '<tr><td colspan="3">No lines.</td></tr>'}</tbody>
<tfoot><tr><td colspan="2">Total</td><td class="num">${esc(formatMoney(inv.total, inv.currency))}</td></tr>
<tr><td colspan="2">Amount due</td><td class="num">${esc(formatMoney(inv.amount_remaining, inv.currency))}</td></tr></tfoot></table>
${action}
<footer>Local test payment page of Phasebook's fake payment service. No card is charged.</footer>
</main></body></html>`;
}

export function renderNotFoundPage(id: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Invoice not found</title><style>${STYLE}</style></head>
<body><main><h1>Invoice not found</h1><p>There is no invoice ${esc(id)} here.</p></main></body></html>`;
}
