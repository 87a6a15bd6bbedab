/**
 * The fake payment service's records and rules: customers, invoice items, invoices and events,
 * shaped like the real API's objects (API version 2025-10-29.clover, which the installed SDK
 * pins) so the SDK's types and Phasebook's code see what they will see in production. Errors
 * are thrown as ApiError carrying the service's error JSON; the HTTP layer only serialises them.
 */
import crypto from "node:crypto";
import type { FormObject, FormValue } from "./form-body";
import type { DeliveryAttempt } from "./webhook-sender";

export const API_VERSION = "2025-10-29.clover";

export type Metadata = Record<string, string>;

export interface ApiErrorBody {
  type: "invalid_request_error" | "api_error" | "idempotency_error" | "card_error";
  message: string;
  param?: string;
  code?: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
}

export interface Address {
  city: string | null;
  country: string | null;
  line1: string | null;
  line2: string | null;
  postal_code: string | null;
  state: string | null;
}

export interface Customer {
  id: string;
  object: "customer";
  address: Address | null;
  balance: number;
  created: number;
  currency: string | null;
  default_source: null;
  delinquent: boolean;
  description: string | null;
  discount: null;
  email: string | null;
  invoice_prefix: string;
  invoice_settings: { custom_fields: null; default_payment_method: null; footer: string | null; rendering_options: null };
  livemode: false;
  metadata: Metadata;
  name: string | null;
  next_invoice_sequence: number;
  phone: string | null;
  preferred_locales: string[];
  shipping: null;
  tax_exempt: "none" | "exempt" | "reverse";
  test_clock: null;
}

export interface InvoiceItem {
  id: string;
  object: "invoiceitem";
  amount: number;
  currency: string;
  customer: string;
  date: number;
  description: string | null;
  discountable: boolean;
  discounts: string[];
  invoice: string | null;
  livemode: false;
  metadata: Metadata;
  net_amount: number;
  parent: null;
  period: { start: number; end: number };
  pricing: { type: "price_details"; unit_amount_decimal: string | null };
  proration: boolean;
  quantity: number;
  tax_rates: never[];
  test_clock: null;
}

export type InvoiceStatus = "draft" | "open" | "paid" | "uncollectible" | "void";

/** Stored without `lines`; they are read from the invoice items each time it is shown. */
export interface StoredInvoice {
  id: string;
  object: "invoice";
  account_country: string;
  account_name: string;
  amount_due: number;
  amount_overpaid: number;
  amount_paid: number;
  amount_remaining: number;
  amount_shipping: number;
  attempt_count: number;
  attempted: boolean;
  auto_advance: boolean;
  automatically_finalizes_at: number | null;
  billing_reason: "manual";
  collection_method: "send_invoice" | "charge_automatically";
  created: number;
  currency: string;
  customer: string;
  customer_address: Address | null;
  customer_email: string | null;
  customer_name: string | null;
  customer_phone: string | null;
  customer_tax_exempt: Customer["tax_exempt"];
  days_until_due: number | null;
  default_payment_method: null;
  default_source: null;
  description: string | null;
  discounts: never[];
  due_date: number | null;
  effective_at: number | null;
  ending_balance: number | null;
  footer: string | null;
  hosted_invoice_url: string | null;
  invoice_pdf: null;
  last_finalization_error: null;
  livemode: false;
  metadata: Metadata;
  next_payment_attempt: number | null;
  number: string | null;
  parent: null;
  period_end: number;
  period_start: number;
  post_payment_credit_notes_amount: number;
  pre_payment_credit_notes_amount: number;
  receipt_number: null;
  starting_balance: number;
  statement_descriptor: null;
  status: InvoiceStatus;
  status_transitions: {
    finalized_at: number | null;
    marked_uncollectible_at: number | null;
    paid_at: number | null;
    voided_at: number | null;
  };
  subtotal: number;
  subtotal_excluding_tax: number;
  test_clock: null;
  total: number;
  total_discount_amounts: never[];
  total_excluding_tax: number;
  total_taxes: never[];
  webhooks_delivered_at: number | null;
}

export interface PaymentEvent {
  id: string;
  object: "event";
  api_version: string;
  created: number;
  data: { object: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface IdempotentReply {
  fingerprint: string;
  status: number;
  body: string;
  at: number;
}

export interface LedgerData {
  version: 1;
  customers: Record<string, Customer>;
  invoiceItems: Record<string, InvoiceItem>;
  invoices: Record<string, StoredInvoice>;
  events: Record<string, PaymentEvent>;
  deliveries: Record<string, DeliveryAttempt[]>;
  idempotency: Record<string, IdempotentReply>;
}

export function emptyLedger(): LedgerData {
  return { version: 1, customers: {}, invoiceItems: {}, invoices: {}, events: {}, deliveries: {}, idempotency: {} };
}

const BASE62 = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";

export function randomId(prefix: string, length = 24): string {
  let out = "";
  for (let i = 0; i < length; i++) out += BASE62[crypto.randomInt(62)];
  return `${prefix}_${out}`;
}

function invoicePrefix(): string {
  const chars = "ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789";
  let out = "";
  for (let i = 0; i < 8; i++) out += chars[crypto.randomInt(chars.length)];
  return out;
}

export const now = (): number => Math.floor(Date.now() / 1000);

// ---------------------------------------------------------------- parameter readers

export function invalid(message: string, param?: string, code?: string, status = 400): ApiError {
  return new ApiError(status, { type: "invalid_request_error", message, ...(param ? { param } : {}), ...(code ? { code } : {}) });
}

export function noSuch(kind: string, id: string, param = "id", status = 404): ApiError {
  return invalid(`No such ${kind}: '${id}'`, param, "resource_missing", status);
}

/** The real API refuses parameters it does not know; so does the fake, to catch typos early. */
export function onlyKnown(params: FormObject, allowed: string[]): void {
  for (const key of Object.keys(params)) {
    if (key !== "expand" && !allowed.includes(key)) {
      throw invalid(`Received unknown parameter: ${key}`, key, "parameter_unknown");
    }
  }
}

export function readString(params: FormObject, name: string, required = false): string | undefined {
  const v = params[name];
  if (v === undefined) {
    if (required) throw invalid(`Missing required param: ${name}.`, name, "parameter_missing");
    return undefined;
  }
  if (typeof v !== "string") throw invalid(`Invalid string: ${name} must be a string.`, name, "parameter_invalid_string");
  return v;
}

/** An empty string unsets a nullable field, as in the real API. */
function readNullableString(params: FormObject, name: string): string | null | undefined {
  const v = readString(params, name);
  return v === undefined ? undefined : v === "" ? null : v;
}

export function readInt(params: FormObject, name: string, required = false): number | undefined {
  const v = readString(params, name, required);
  if (v === undefined) return undefined;
  if (!/^-?\d+$/.test(v) || !Number.isSafeInteger(Number(v))) {
    throw invalid(`Invalid integer: ${v}`, name, "parameter_invalid_integer");
  }
  return Number(v);
}

export function readBool(params: FormObject, name: string): boolean | undefined {
  const v = readString(params, name);
  if (v === undefined) return undefined;
  if (v !== "true" && v !== "false") throw invalid(`Invalid boolean: ${v}`, name);
  return v === "true";
}

export function readEnum<T extends string>(params: FormObject, name: string, values: readonly T[]): T | undefined {
  const v = readString(params, name);
  if (v === undefined) return undefined;
  if (!(values as readonly string[]).includes(v)) {
    throw invalid(`Invalid ${name}: must be one of ${values.join(", ")}`, name);
  }
  return v as T;
}

function readCurrency(params: FormObject): string | undefined {
  const v = readString(params, "currency");
  if (v === undefined) return undefined;
  if (!/^[a-zA-Z]{3}$/.test(v)) throw invalid(`Invalid currency: ${v}.`, "currency");
  return v.toLowerCase();
}

/**
 * Metadata follows the real API's update rules: keys merge into what is there, a key sent
 * empty is removed, and `metadata=` (empty) clears everything.
 */
function applyMetadata(current: Metadata, value: FormValue | undefined): Metadata {
  if (value === undefined) return current;
  if (value === "") return {};
  if (typeof value !== "object" || Array.isArray(value)) throw invalid("Invalid metadata: must be a hash.", "metadata");
  const next = { ...current };
  for (const [k, v] of Object.entries(value)) {
    if (typeof v !== "string") throw invalid(`Invalid metadata[${k}]: must be a string.`, `metadata[${k}]`);
    if (k.length > 40) throw invalid(`Invalid metadata[${k}]: keys are at most 40 characters.`, `metadata[${k}]`);
    if (v.length > 500) throw invalid(`Invalid metadata[${k}]: values are at most 500 characters.`, `metadata[${k}]`);
    if (v === "") delete next[k];
    else next[k] = v;
  }
  if (Object.keys(next).length > 50) throw invalid("Metadata may hold at most 50 keys.", "metadata");
  return next;
}

function readAddress(params: FormObject): Address | null | undefined {
  const v = params.address;
  if (v === undefined) return undefined;
  if (v === "") return null;
  if (typeof v !== "object" || Array.isArray(v)) throw invalid("Invalid address: must be a hash.", "address");
  const allowed = ["city", "country", "line1", "line2", "postal_code", "state"] as const;
  for (const k of Object.keys(v)) {
    if (!(allowed as readonly string[]).includes(k)) throw invalid(`Received unknown parameter: address[${k}]`, `address[${k}]`, "parameter_unknown");
  }
  const field = (k: (typeof allowed)[number]) => (typeof v[k] === "string" && v[k] !== "" ? (v[k] as string) : null);
  return { city: field("city"), country: field("country"), line1: field("line1"), line2: field("line2"), postal_code: field("postal_code"), state: field("state") };
}

// ---------------------------------------------------------------- the ledger

export interface LedgerOptions {
  accountName: string;
  accountCountry: string;
  defaultCurrency: string;
  /** Base of hosted invoice pages, e.g. http://127.0.0.1:12111. */
  publicUrl: () => string;
}

export interface ListParams {
  limit: number;
  startingAfter?: string;
  endingBefore?: string;
}

export interface ApiList<T> {
  object: "list";
  data: T[];
  has_more: boolean;
  url: string;
}

export class Ledger {
  constructor(
    readonly data: LedgerData,
    private readonly opts: LedgerOptions,
  ) {}

  // -- customers

  createCustomer(params: FormObject): Customer {
    onlyKnown(params, ["name", "email", "description", "phone", "metadata", "address", "preferred_locales", "tax_exempt"]);
    const customer: Customer = {
      id: randomId("cus", 14),
      object: "customer",
      address: readAddress(params) ?? null,
      balance: 0,
      created: now(),
      currency: null,
      default_source: null,
      delinquent: false,
      description: readNullableString(params, "description") ?? null,
      discount: null,
      email: readNullableString(params, "email") ?? null,
      invoice_prefix: invoicePrefix(),
      invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
      livemode: false,
      metadata: applyMetadata({}, params.metadata),
      name: readNullableString(params, "name") ?? null,
      next_invoice_sequence: 1,
      phone: readNullableString(params, "phone") ?? null,
      preferred_locales: readLocales(params) ?? [],
      shipping: null,
      tax_exempt: readEnum(params, "tax_exempt", ["none", "exempt", "reverse"] as const) ?? "none",
      test_clock: null,
    };
    this.data.customers[customer.id] = customer;
    return customer;
  }

  customer(id: string, param = "id", status = 404): Customer {
    const c = this.data.customers[id];
    if (!c) throw noSuch("customer", id, param, status);
    return c;
  }

  updateCustomer(id: string, params: FormObject): Customer {
    const c = this.customer(id);
    onlyKnown(params, ["name", "email", "description", "phone", "metadata", "address", "preferred_locales", "tax_exempt"]);
    const name = readNullableString(params, "name");
    const email = readNullableString(params, "email");
    const description = readNullableString(params, "description");
    const phone = readNullableString(params, "phone");
    const address = readAddress(params);
    const locales = readLocales(params);
    const taxExempt = readEnum(params, "tax_exempt", ["none", "exempt", "reverse"] as const);
    if (name !== undefined) c.name = name;
    if (email !== undefined) c.email = email;
    if (description !== undefined) c.description = description;
    if (phone !== undefined) c.phone = phone;
    if (address !== undefined) c.address = address;
    if (locales !== undefined) c.preferred_locales = locales;
    if (taxExempt !== undefined) c.tax_exempt = taxExempt;
    c.metadata = applyMetadata(c.metadata, params.metadata);
    return c;
  }

  deleteCustomer(id: string): { id: string; object: "customer"; deleted: true } {
    this.customer(id);
    delete this.data.customers[id];
    return { id, object: "customer", deleted: true };
  }

  listCustomers(params: FormObject): Customer[] {
    onlyKnown(params, ["email", "limit", "starting_after", "ending_before"]);
    const email = readString(params, "email");
    return newestFirst(this.data.customers).filter((c) => email === undefined || c.email === email);
  }

  // -- invoice items

  createInvoiceItem(params: FormObject): InvoiceItem {
    onlyKnown(params, ["customer", "amount", "currency", "description", "invoice", "metadata", "quantity", "unit_amount_decimal", "period", "discountable"]);
    const customerId = readString(params, "customer", true)!;
    const customer = this.customer(customerId, "customer", 400);
    const amount = readInt(params, "amount");
    const unitDecimal = readString(params, "unit_amount_decimal");
    const quantity = readInt(params, "quantity");
    if (quantity !== undefined && quantity < 0) throw invalid("Invalid quantity: must be at least 0.", "quantity");
    if (amount !== undefined && unitDecimal !== undefined) {
      throw invalid("You may only specify one of these parameters: amount, unit_amount_decimal.", "amount");
    }
    if (amount === undefined && unitDecimal === undefined) {
      throw invalid("You must specify either amount or unit_amount_decimal (price and pricing are not offered by the fake).", "amount", "parameter_missing");
    }
    if (amount !== undefined && quantity !== undefined && quantity !== 1) {
      throw invalid("amount is the whole line's amount; pass unit_amount_decimal with quantity instead.", "quantity");
    }
    let lineAmount: number;
    let unit: string;
    const qty = quantity ?? 1;
    if (unitDecimal !== undefined) {
      if (!/^\d+(\.\d{1,12})?$/.test(unitDecimal)) throw invalid(`Invalid decimal: ${unitDecimal}`, "unit_amount_decimal", "parameter_invalid_decimal");
      // Amounts are whole minor units; the fractional unit price is rounded once on the line total.
      lineAmount = Math.round(Number(unitDecimal) * qty);
      unit = unitDecimal;
    } else {
      lineAmount = amount!;
      unit = String(amount);
    }
    const currency = readCurrency(params) ?? customer.currency ?? this.opts.defaultCurrency;
    let invoiceId: string | null = null;
    const invoiceParam = readString(params, "invoice");
    if (invoiceParam !== undefined) {
      const inv = this.invoice(invoiceParam, "invoice", 400);
      if (inv.status !== "draft") throw invalid(`Invoice ${inv.id} is no longer a draft; items can only be added to drafts.`, "invoice", "invoice_not_editable");
      if (inv.customer !== customer.id) throw invalid(`Invoice ${inv.id} belongs to another customer.`, "invoice");
      if (inv.currency !== currency) throw invalid(`The invoice's currency is ${inv.currency}, not ${currency}.`, "currency");
      invoiceId = inv.id;
    }
    const period = readPeriod(params);
    const created = now();
    if (!customer.currency) customer.currency = currency;
    const item: InvoiceItem = {
      id: randomId("ii"),
      object: "invoiceitem",
      amount: lineAmount,
      currency,
      customer: customer.id,
      date: created,
      description: readNullableString(params, "description") ?? null,
      discountable: readBool(params, "discountable") ?? lineAmount >= 0,
      discounts: [],
      invoice: invoiceId,
      livemode: false,
      metadata: applyMetadata({}, params.metadata),
      net_amount: lineAmount,
      parent: null,
      period: period ?? { start: created, end: created },
      pricing: { type: "price_details", unit_amount_decimal: unit },
      proration: false,
      quantity: qty,
      tax_rates: [],
      test_clock: null,
    };
    this.data.invoiceItems[item.id] = item;
    if (invoiceId) this.recalculate(this.data.invoices[invoiceId]!);
    return item;
  }

  invoiceItem(id: string): InvoiceItem {
    const item = this.data.invoiceItems[id];
    if (!item) throw noSuch("invoiceitem", id);
    return item;
  }

  deleteInvoiceItem(id: string): { id: string; object: "invoiceitem"; deleted: true } {
    const item = this.invoiceItem(id);
    const inv = item.invoice ? this.data.invoices[item.invoice] : undefined;
    if (inv && inv.status !== "draft") throw invalid("This invoice item is on a finalized invoice and can no longer be deleted.", undefined, "invoice_not_editable");
    delete this.data.invoiceItems[id];
    if (inv) this.recalculate(inv);
    return { id, object: "invoiceitem", deleted: true };
  }

  listInvoiceItems(params: FormObject): InvoiceItem[] {
    onlyKnown(params, ["customer", "invoice", "pending", "limit", "starting_after", "ending_before"]);
    const customer = readString(params, "customer");
    const invoice = readString(params, "invoice");
    const pending = readBool(params, "pending");
    return newestFirst(this.data.invoiceItems).filter(
      (i) =>
        (customer === undefined || i.customer === customer) &&
        (invoice === undefined || i.invoice === invoice) &&
        (pending === undefined || (i.invoice === null) === pending),
    );
  }

  // -- invoices

  createInvoice(params: FormObject): StoredInvoice {
    onlyKnown(params, ["customer", "collection_method", "days_until_due", "due_date", "auto_advance", "metadata", "pending_invoice_items_behavior", "description", "footer", "currency"]);
    const customer = this.customer(readString(params, "customer", true)!, "customer", 400);
    const collection = readEnum(params, "collection_method", ["send_invoice", "charge_automatically"] as const) ?? "charge_automatically";
    const daysUntilDue = readInt(params, "days_until_due");
    const dueDate = readInt(params, "due_date");
    if (collection === "send_invoice" && daysUntilDue === undefined && dueDate === undefined) {
      throw invalid("Invoices with collection_method=send_invoice need days_until_due or due_date.", "days_until_due", "parameter_missing");
    }
    if (collection === "charge_automatically" && (daysUntilDue !== undefined || dueDate !== undefined)) {
      throw invalid("days_until_due and due_date only apply to collection_method=send_invoice.", daysUntilDue !== undefined ? "days_until_due" : "due_date");
    }
    if (daysUntilDue !== undefined && (daysUntilDue < 0 || daysUntilDue > 730)) throw invalid("days_until_due must be between 0 and 730.", "days_until_due");
    const behaviour = readEnum(params, "pending_invoice_items_behavior", ["include", "exclude"] as const) ?? "exclude";
    const pending = newestFirst(this.data.invoiceItems)
      .reverse()
      .filter((i) => i.customer === customer.id && i.invoice === null);
    const currency = readCurrency(params) ?? customer.currency ?? pending[0]?.currency ?? this.opts.defaultCurrency;
    const created = now();
    const autoAdvance = readBool(params, "auto_advance") ?? false;
    const inv: StoredInvoice = {
      id: randomId("in"),
      object: "invoice",
      account_country: this.opts.accountCountry,
      account_name: this.opts.accountName,
      amount_due: 0,
      amount_overpaid: 0,
      amount_paid: 0,
      amount_remaining: 0,
      amount_shipping: 0,
      attempt_count: 0,
      attempted: false,
      auto_advance: autoAdvance,
      // Recorded as the real service would; the fake does not finalise on its own.
      automatically_finalizes_at: autoAdvance ? created + 3600 : null,
      billing_reason: "manual",
      collection_method: collection,
      created,
      currency,
      customer: customer.id,
      customer_address: customer.address,
      customer_email: customer.email,
      customer_name: customer.name,
      customer_phone: customer.phone,
      customer_tax_exempt: customer.tax_exempt,
      days_until_due: daysUntilDue ?? null,
      default_payment_method: null,
      default_source: null,
      description: readNullableString(params, "description") ?? null,
      discounts: [],
      due_date: dueDate ?? (daysUntilDue !== undefined ? created + daysUntilDue * 86400 : null),
      effective_at: null,
      ending_balance: null,
      footer: readNullableString(params, "footer") ?? null,
      hosted_invoice_url: null,
      invoice_pdf: null,
      last_finalization_error: null,
      livemode: false,
      metadata: applyMetadata({}, params.metadata),
      next_payment_attempt: null,
      number: null,
      parent: null,
      period_end: created,
      period_start: created,
      post_payment_credit_notes_amount: 0,
      pre_payment_credit_notes_amount: 0,
      receipt_number: null,
      starting_balance: 0,
      statement_descriptor: null,
      status: "draft",
      status_transitions: { finalized_at: null, marked_uncollectible_at: null, paid_at: null, voided_at: null },
      subtotal: 0,
      subtotal_excluding_tax: 0,
      test_clock: null,
      total: 0,
      total_discount_amounts: [],
      total_excluding_tax: 0,
      total_taxes: [],
      webhooks_delivered_at: null,
    };
    this.data.invoices[inv.id] = inv;
    if (behaviour === "include") {
      for (const item of pending) if (item.currency === currency) item.invoice = inv.id;
    }
    this.recalculate(inv);
    return inv;
  }

  invoice(id: string, param = "id", status = 404): StoredInvoice {
    const inv = this.data.invoices[id];
    if (!inv) throw noSuch("invoice", id, param, status);
    return inv;
  }

  updateInvoice(id: string, params: FormObject): StoredInvoice {
    const inv = this.invoice(id);
    onlyKnown(params, ["metadata", "description", "footer", "days_until_due", "due_date", "auto_advance"]);
    const editsContent = ["description", "footer", "days_until_due", "due_date"].some((k) => params[k] !== undefined);
    if (editsContent && inv.status !== "draft") throw invalid("Only metadata and auto_advance can change once an invoice is finalized.", undefined, "invoice_not_editable");
    const description = readNullableString(params, "description");
    const footer = readNullableString(params, "footer");
    const days = readInt(params, "days_until_due");
    const due = readInt(params, "due_date");
    const autoAdvance = readBool(params, "auto_advance");
    if (description !== undefined) inv.description = description;
    if (footer !== undefined) inv.footer = footer;
    if (days !== undefined) {
      inv.days_until_due = days;
      inv.due_date = inv.created + days * 86400;
    }
    if (due !== undefined) inv.due_date = due;
    if (autoAdvance !== undefined) inv.auto_advance = autoAdvance;
    inv.metadata = applyMetadata(inv.metadata, params.metadata);
    return inv;
  }

  deleteInvoice(id: string): { id: string; object: "invoice"; deleted: true } {
    const inv = this.invoice(id);
    if (inv.status !== "draft") throw invalid("You can only delete draft invoices; void a finalized one instead.", undefined, "invoice_not_editable");
    // Deleting a draft puts its items back in the customer's pending pool, as the real service does.
    for (const item of this.itemsOn(inv.id)) item.invoice = null;
    delete this.data.invoices[id];
    return { id, object: "invoice", deleted: true };
  }

  listInvoices(params: FormObject): StoredInvoice[] {
    onlyKnown(params, ["customer", "status", "collection_method", "limit", "starting_after", "ending_before"]);
    const customer = readString(params, "customer");
    const status = readEnum(params, "status", ["draft", "open", "paid", "uncollectible", "void"] as const);
    const collection = readEnum(params, "collection_method", ["send_invoice", "charge_automatically"] as const);
    return newestFirst(this.data.invoices).filter(
      (i) =>
        (customer === undefined || i.customer === customer) &&
        (status === undefined || i.status === status) &&
        (collection === undefined || i.collection_method === collection),
    );
  }

  finalizeInvoice(id: string, params: FormObject): StoredInvoice {
    onlyKnown(params, ["auto_advance"]);
    const inv = this.invoice(id);
    if (inv.status !== "draft") throw invalid(`Invoice ${inv.id} is already finalized (status ${inv.status}).`, undefined, "invoice_not_editable");
    const autoAdvance = readBool(params, "auto_advance");
    if (autoAdvance !== undefined) inv.auto_advance = autoAdvance;
    const customer = this.data.customers[inv.customer];
    const at = now();
    this.recalculate(inv);
    inv.status = "open";
    inv.status_transitions.finalized_at = at;
    inv.effective_at = at;
    inv.automatically_finalizes_at = null;
    inv.ending_balance = 0;
    const seq = customer ? customer.next_invoice_sequence++ : 1;
    inv.number = `${customer?.invoice_prefix ?? "FAKE0000"}-${String(seq).padStart(4, "0")}`;
    inv.hosted_invoice_url = `${this.opts.publicUrl()}/invoices/${inv.id}`;
    if (inv.days_until_due !== null) inv.due_date = at + inv.days_until_due * 86400;
    if (customer) {
      inv.customer_email = customer.email;
      inv.customer_name = customer.name;
      inv.customer_address = customer.address;
      inv.customer_phone = customer.phone;
    }
    // A zero total has nothing to collect; the real service marks such invoices paid at once.
    if (inv.amount_due === 0) this.markPaid(inv);
    return inv;
  }

  sendInvoice(id: string): StoredInvoice {
    const inv = this.invoice(id);
    if (inv.collection_method !== "send_invoice") throw invalid("Only invoices with collection_method=send_invoice can be sent.", undefined, "invoice_not_editable");
    if (inv.status !== "open") throw invalid(`Only open invoices can be sent; ${inv.id} is ${inv.status}.`, undefined, "invoice_not_editable");
    return inv;
  }

  voidInvoice(id: string): StoredInvoice {
    const inv = this.invoice(id);
    if (inv.status !== "open" && inv.status !== "uncollectible") {
      throw invalid(`Only open or uncollectible invoices can be voided; ${inv.id} is ${inv.status}.`, undefined, "invoice_not_editable");
    }
    inv.status = "void";
    inv.status_transitions.voided_at = now();
    inv.amount_remaining = 0;
    return inv;
  }

  /** Settles an open invoice in full (a card payment on the hosted page, or paid out of band). */
  payInvoice(id: string, param = "id"): StoredInvoice {
    const inv = this.invoice(id, param);
    if (inv.status !== "open") throw invalid(`Only open invoices can be paid; ${inv.id} is ${inv.status}.`, undefined, "invoice_not_editable");
    inv.attempt_count += 1;
    inv.attempted = true;
    this.markPaid(inv);
    return inv;
  }

  /** A declined card: the invoice stays open with one more failed attempt. */
  failInvoice(id: string): StoredInvoice {
    const inv = this.invoice(id);
    if (inv.status !== "open") throw invalid(`Only open invoices can have a failed payment; ${inv.id} is ${inv.status}.`, undefined, "invoice_not_editable");
    inv.attempt_count += 1;
    inv.attempted = true;
    return inv;
  }

  private markPaid(inv: StoredInvoice): void {
    inv.status = "paid";
    inv.amount_paid = inv.amount_due;
    inv.amount_remaining = 0;
    inv.status_transitions.paid_at = now();
    inv.next_payment_attempt = null;
  }

  itemsOn(invoiceId: string): InvoiceItem[] {
    return Object.values(this.data.invoiceItems).filter((i) => i.invoice === invoiceId);
  }

  private recalculate(inv: StoredInvoice): void {
    if (inv.status !== "draft") return;
    const items = this.itemsOn(inv.id);
    const subtotal = items.reduce((sum, i) => sum + i.amount, 0);
    inv.subtotal = subtotal;
    inv.subtotal_excluding_tax = subtotal;
    inv.total = subtotal;
    inv.total_excluding_tax = subtotal;
    // A credit larger than the charges leaves nothing due rather than a negative amount.
    inv.amount_due = Math.max(0, subtotal);
    inv.amount_remaining = inv.amount_due;
    const dates = items.map((i) => i.date);
    if (dates.length > 0) {
      inv.period_start = Math.min(...dates);
      inv.period_end = Math.max(...dates);
    }
  }

  /** The invoice as the API shows it: with its lines listed. */
  presentInvoice(inv: StoredInvoice): Record<string, unknown> {
    const lines = this.itemsOn(inv.id).map((item) => ({
      id: `il_${item.id.slice(3)}`,
      object: "line_item",
      amount: item.amount,
      currency: item.currency,
      description: item.description,
      discount_amounts: [],
      discountable: item.discountable,
      discounts: [],
      invoice: inv.id,
      livemode: false,
      metadata: item.metadata,
      parent: {
        type: "invoice_item_details",
        invoice_item_details: { invoice_item: item.id, proration: false, proration_details: { credited_items: null }, subscription: null },
        subscription_item_details: null,
      },
      period: item.period,
      pretax_credit_amounts: [],
      pricing: item.pricing,
      quantity: item.quantity,
      subscription: null,
      taxes: [],
    }));
    return {
      ...inv,
      lines: { object: "list", data: lines, has_more: false, total_count: lines.length, url: `/v1/invoices/${inv.id}/lines` },
    };
  }

  // -- events

  recordEvent(type: string, object: Record<string, unknown>, request: PaymentEvent["request"]): PaymentEvent {
    const event: PaymentEvent = {
      id: randomId("evt"),
      object: "event",
      api_version: API_VERSION,
      created: now(),
      data: { object: structuredClone(object) },
      livemode: false,
      pending_webhooks: 0,
      request,
      type,
    };
    this.data.events[event.id] = event;
    return event;
  }

  event(id: string): PaymentEvent {
    const e = this.data.events[id];
    if (!e) throw noSuch("event", id);
    return e;
  }

  listEvents(params: FormObject): PaymentEvent[] {
    onlyKnown(params, ["type", "limit", "starting_after", "ending_before"]);
    const type = readString(params, "type");
    const matches = (t: string) =>
      type === undefined || (type.endsWith(".*") ? t.startsWith(type.slice(0, -1)) : t === type);
    return newestFirst(this.data.events).filter((e) => matches(e.type));
  }
}

function readLocales(params: FormObject): string[] | undefined {
  const v = params.preferred_locales;
  if (v === undefined) return undefined;
  if (v === "") return [];
  if (!Array.isArray(v) || v.some((x) => typeof x !== "string")) throw invalid("Invalid array: preferred_locales.", "preferred_locales");
  return v as string[];
}

function readPeriod(params: FormObject): { start: number; end: number } | undefined {
  const v = params.period;
  if (v === undefined) return undefined;
  if (typeof v !== "object" || Array.isArray(v)) throw invalid("Invalid period: must be a hash with start and end.", "period");
  const start = readInt(v, "start", true)!;
  const end = readInt(v, "end", true)!;
  if (end < start) throw invalid("period[end] must not be before period[start].", "period[end]");
  return { start, end };
}

/** Records are kept in insertion order; the real API lists newest first. */
function newestFirst<T>(records: Record<string, T>): T[] {
  return Object.values(records).reverse();
}

export function readListParams(params: FormObject): ListParams {
  const limit = readInt(params, "limit") ?? 10;
  if (limit < 1 || limit > 100) throw invalid("Invalid limit: must be between 1 and 100.", "limit");
  return { limit, startingAfter: readString(params, "starting_after"), endingBefore: readString(params, "ending_before") };
}

/** Cursor pagination over a newest-first list, as the SDK's auto-pagination expects. */
export function paginate<T extends { id: string }>(all: T[], list: ListParams, url: string): ApiList<T> {
  if (list.startingAfter !== undefined) {
    const at = all.findIndex((x) => x.id === list.startingAfter);
    if (at === -1) throw noSuch("object", list.startingAfter, "starting_after", 400);
    const rest = all.slice(at + 1);
    return { object: "list", data: rest.slice(0, list.limit), has_more: rest.length > list.limit, url };
  }
  if (list.endingBefore !== undefined) {
    const at = all.findIndex((x) => x.id === list.endingBefore);
    if (at === -1) throw noSuch("object", list.endingBefore, "ending_before", 400);
    const before = all.slice(0, at);
    const page = before.slice(Math.max(0, before.length - list.limit));
    return { object: "list", data: page, has_more: before.length > list.limit, url };
  }
  return { object: "list", data: all.slice(0, list.limit), has_more: all.length > list.limit, url };
}
