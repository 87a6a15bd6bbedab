/**
 * Fake payment service: the slice of the payment provider's REST API that Phasebook's invoicing
 * uses, spoken well enough that the real SDK (pointed here with host/port/protocol) works
 * unchanged: form-encoded bodies, bearer keys, idempotency keys, list pagination, `expand`,
 * typed errors, and signed webhooks. Extra `/_control/` routes let tests and people pay or
 * decline invoices and redeliver events; `/invoices/:id` is the hosted page a customer opens.
 */
import http from "node:http";
import type { AddressInfo } from "node:net";
import { readJsonFile, writeJsonAtomic } from "../json-file";
import { parseForm, type FormObject } from "./form-body";
import { renderInvoicePage, renderNotFoundPage } from "./invoice-page";
import {
  API_VERSION,
  ApiError,
  Ledger,
  emptyLedger,
  invalid,
  onlyKnown,
  paginate,
  randomId,
  readBool,
  readListParams,
  readString,
  type LedgerData,
  type PaymentEvent,
  type StoredInvoice,
} from "./ledger";
import { WebhookSender, type DeliveryResult } from "./webhook-sender";

export interface FakePaymentsOptions {
  port?: number;
  host?: string;
  dataPath?: string;
  webhookUrl?: string;
  webhookSecret: string;
  /** Base URL customers reach the fake at, for hosted invoice links; defaults to its own URL. */
  publicUrl?: string;
  /** When set, only this secret key is accepted; otherwise any test key is. */
  apiKey?: string;
  /** Event types sent to the webhook URL; `["*"]` sends all. All events are recorded either way. */
  enabledEvents?: string[];
  /** Pauses before each redelivery of a failed webhook. */
  webhookRetryDelaysMs?: number[];
  webhookTimeoutMs?: number;
  accountName?: string;
  accountCountry?: string;
  defaultCurrency?: string;
  log?: (line: string) => void;
}

export interface FakePayments {
  url: string;
  port: number;
  close(): Promise<void>;
  setWebhookUrl(url: string): void;
}

const DEFAULT_ENABLED_EVENTS = ["invoice.paid", "invoice.payment_failed", "invoice.voided"];
const IDEMPOTENCY_TTL_SECONDS = 24 * 3600;
const MAX_BODY_BYTES = 1024 * 1024;

interface Reply {
  status: number;
  body: unknown;
}

export async function startFakePayments(opts: FakePaymentsOptions): Promise<FakePayments> {
  if (!opts.webhookSecret) throw new Error("startFakePayments needs a webhookSecret to sign events");
  const host = opts.host ?? "127.0.0.1";
  const log = opts.log ?? (() => undefined);
  const enabled = new Set(opts.enabledEvents ?? DEFAULT_ENABLED_EVENTS);
  let webhookUrl = opts.webhookUrl;
  let baseUrl = "";
  let closed = false;

  const data = loadLedger(opts.dataPath);
  const ledger = new Ledger(data, {
    accountName: opts.accountName ?? "Phasebook test account",
    accountCountry: opts.accountCountry ?? "CA",
    defaultCurrency: (opts.defaultCurrency ?? "usd").toLowerCase(),
    publicUrl: () => (opts.publicUrl ?? baseUrl).replace(/\/$/, ""),
  });

  const save = () => {
    if (opts.dataPath) writeJsonAtomic(opts.dataPath, data);
  };

  const sender = new WebhookSender({
    secret: opts.webhookSecret,
    retryDelaysMs: opts.webhookRetryDelaysMs ?? [1000, 5000, 15000],
    timeoutMs: opts.webhookTimeoutMs ?? 10_000,
    log,
    onAttempt(eventId, attempt) {
      if (closed) return;
      (data.deliveries[eventId] ??= []).push(attempt);
      save();
    },
  });

  const wants = (type: string) => enabled.has("*") || enabled.has(type);

  /** Records an event and, when the endpoint takes that type, starts delivering it. */
  const emit = (type: string, inv: StoredInvoice, request: PaymentEvent["request"]) => {
    const event = ledger.recordEvent(type, ledger.presentInvoice(inv), request);
    // Fixed at creation so a redelivery sends byte-for-byte the same event body.
    event.pending_webhooks = webhookUrl && wants(type) ? 1 : 0;
    const delivery = event.pending_webhooks ? deliver(event) : undefined;
    return { event, delivery };
  };

  const deliver = (event: PaymentEvent): Promise<DeliveryResult> | undefined => {
    if (!webhookUrl) return undefined;
    return sender.deliver(webhookUrl, event.id, JSON.stringify(event, null, 2));
  };

  const api = (method: string, path: string, params: FormObject, request: PaymentEvent["request"]): Reply => {
    const seg = path.split("/").filter(Boolean).map(decodeURIComponent); // ["v1", resource, id?, action?]
    const [, resource, id, action] = seg;
    const ok = (body: unknown): Reply => ({ status: 200, body });
    const list = (items: { id: string }[], url: string) => ok(paginate(items, readListParams(params), url));
    const present = (inv: StoredInvoice) => ledger.presentInvoice(inv);
    // Retrieval takes no parameters besides expand.
    const retrieve = (get: () => unknown) => {
      onlyKnown(params, []);
      return ok(get());
    };

    if (resource === "customers" && seg.length === 2) {
      if (method === "GET") return list(ledger.listCustomers(params), "/v1/customers");
      if (method === "POST") return ok(ledger.createCustomer(params));
    }
    if (resource === "customers" && id && seg.length === 3) {
      if (method === "GET") return retrieve(() => ledger.customer(id));
      if (method === "POST") return ok(ledger.updateCustomer(id, params));
      if (method === "DELETE") return ok(ledger.deleteCustomer(id));
    }
    if (resource === "invoiceitems" && seg.length === 2) {
      if (method === "GET") return list(ledger.listInvoiceItems(params), "/v1/invoiceitems");
      if (method === "POST") return ok(ledger.createInvoiceItem(params));
    }
    if (resource === "invoiceitems" && id && seg.length === 3) {
      if (method === "GET") return retrieve(() => ledger.invoiceItem(id));
      if (method === "DELETE") return ok(ledger.deleteInvoiceItem(id));
    }
    if (resource === "invoices" && seg.length === 2) {
      if (method === "GET") return list(ledger.listInvoices(params).map(present) as { id: string }[], "/v1/invoices");
      if (method === "POST") {
        const inv = ledger.createInvoice(params);
        emit("invoice.created", inv, request);
        return ok(present(inv));
      }
    }
    if (resource === "invoices" && id && seg.length === 3) {
      if (method === "GET") return retrieve(() => present(ledger.invoice(id)));
      if (method === "POST") {
        const inv = ledger.updateInvoice(id, params);
        emit("invoice.updated", inv, request);
        return ok(present(inv));
      }
      if (method === "DELETE") {
        const inv = ledger.invoice(id);
        const shown = present(inv) as { lines: unknown };
        const result = ledger.deleteInvoice(id);
        ledger.recordEvent("invoice.deleted", shown as Record<string, unknown>, request);
        return ok(result);
      }
    }
    if (resource === "invoices" && id && seg.length === 4 && method === "GET" && action === "lines") {
      const inv = present(ledger.invoice(id)) as { lines: { data: { id: string }[] } };
      return list(inv.lines.data, `/v1/invoices/${id}/lines`);
    }
    if (resource === "invoices" && id && seg.length === 4 && method === "POST") {
      if (action === "finalize") {
        const inv = ledger.finalizeInvoice(id, params);
        emit("invoice.finalized", inv, request);
        if (inv.status === "paid") {
          emit("invoice.paid", inv, request);
          emit("invoice.payment_succeeded", inv, request);
        }
        return ok(present(inv));
      }
      if (action === "send") {
        onlyKnown(params, []);
        const inv = ledger.sendInvoice(id);
        emit("invoice.sent", inv, request);
        return ok(present(inv));
      }
      if (action === "void") {
        onlyKnown(params, []);
        const inv = ledger.voidInvoice(id);
        emit("invoice.voided", inv, request);
        return ok(present(inv));
      }
      if (action === "pay") {
        onlyKnown(params, ["paid_out_of_band"]);
        if (readBool(params, "paid_out_of_band") !== true) {
          throw invalid(
            "The fake charges no cards: pass paid_out_of_band=true, pay on the hosted page, or POST /_control/invoices/:id/pay.",
            "paid_out_of_band",
          );
        }
        const inv = ledger.payInvoice(id);
        emit("invoice.paid", inv, request);
        emit("invoice.payment_succeeded", inv, request);
        return ok(present(inv));
      }
    }
    if (resource === "events" && seg.length === 2 && method === "GET") return list(ledger.listEvents(params), "/v1/events");
    if (resource === "events" && id && seg.length === 3 && method === "GET") return retrieve(() => ledger.event(id));
    throw invalid(`Unrecognized request URL (${method}: ${path}). The fake payment service offers customers, invoiceitems, invoices and events.`, undefined, undefined, 404);
  };

  /** Replaces ids with their objects along each `expand` path, as the real API does. */
  const expand = (body: unknown, paths: string[]) => {
    const lookup = (id: string): unknown => {
      if (id.startsWith("cus_")) return data.customers[id] ?? { id, object: "customer", deleted: true };
      if (id.startsWith("in_") && data.invoices[id]) return ledger.presentInvoice(data.invoices[id]);
      if (id.startsWith("ii_")) return data.invoiceItems[id] ?? id;
      return id;
    };
    const walk = (node: unknown, segs: string[], full: string): void => {
      if (node === null || typeof node !== "object") return;
      if (Array.isArray(node)) return node.forEach((n) => walk(n, segs, full));
      const obj = node as Record<string, unknown>;
      const [head, ...rest] = segs;
      if (!head || !(head in obj)) throw invalid(`This property cannot be expanded (${full}).`, "expand");
      if (rest.length > 0) return walk(obj[head], rest, full);
      if (typeof obj[head] === "string") obj[head] = structuredClone(lookup(obj[head]));
    };
    for (const p of paths) walk(body, p.split("."), p);
  };

  const handleApi = (req: http.IncomingMessage, res: http.ServerResponse, url: URL, raw: string) => {
    const method = req.method ?? "GET";
    const requestId = randomId("req", 14);
    const headers: Record<string, string> = {
      "Content-Type": "application/json",
      "Request-Id": requestId,
      "Stripe-Version": String(req.headers["stripe-version"] ?? API_VERSION),
    };
    const idemHeader = typeof req.headers["idempotency-key"] === "string" ? req.headers["idempotency-key"] : undefined;
    if (idemHeader) headers["Idempotency-Key"] = idemHeader;
    const send = (status: number, body: string, extra: Record<string, string> = {}) =>
      res.writeHead(status, { ...headers, ...extra }).end(body);
    const fail = (e: ApiError) => send(e.status, JSON.stringify({ error: e.body }, null, 2));

    const key = apiKeyOf(req);
    if (!key) {
      return fail(invalid("You did not provide an API key. Send it in the Authorization header as 'Bearer sk_test_...'.", undefined, undefined, 401));
    }
    if (/^(sk|rk)_live_/.test(key)) {
      return fail(invalid("The fake payment service only accepts test keys (sk_test_...); never send it a live key.", undefined, undefined, 401));
    }
    if ((opts.apiKey && key !== opts.apiKey) || !/^(sk|rk)_test_/.test(key)) {
      return fail(invalid(`Invalid API Key provided: ${key.slice(0, 8)}****${key.slice(-4)}`, undefined, "api_key_invalid", 401));
    }

    let params: FormObject;
    const contentType = String(req.headers["content-type"] ?? "");
    if (method === "POST") {
      if (raw && !contentType.startsWith("application/x-www-form-urlencoded")) {
        return fail(invalid("Request bodies must be form-encoded (application/x-www-form-urlencoded)."));
      }
      params = parseForm(raw);
    } else {
      params = parseForm(url.search.slice(1));
    }

    const idemKey = method === "POST" && idemHeader ? `${key}\n${idemHeader}` : undefined;
    const fingerprint = `${method} ${url.pathname}\n${raw}`;
    if (idemKey) {
      const prior = data.idempotency[idemKey];
      if (prior && prior.fingerprint !== fingerprint) {
        return send(400, JSON.stringify({
          error: {
            type: "idempotency_error",
            message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idemHeader}' if you meant to execute a different request.`,
          },
        }, null, 2));
      }
      if (prior) return send(prior.status, prior.body, { "Idempotent-Replayed": "true" });
    }

    let status: number;
    let body: string;
    try {
      const expandParam = params.expand;
      const paths = expandParam === undefined ? [] : Array.isArray(expandParam) ? expandParam : [expandParam];
      if (paths.some((p) => typeof p !== "string")) throw invalid("Invalid array: expand must be a list of strings.", "expand");
      const reply = api(method, url.pathname, params, { id: requestId, idempotency_key: idemHeader ?? null });
      const shown = structuredClone(reply.body);
      expand(shown, paths as string[]);
      status = reply.status;
      body = JSON.stringify(shown, null, 2);
    } catch (err) {
      const e = err instanceof ApiError ? err : new ApiError(500, { type: "api_error", message: `Fake payment service error: ${(err as Error).message}` });
      if (!(err instanceof ApiError)) log(`payments: ${(err as Error).stack ?? err}`);
      status = e.status;
      body = JSON.stringify({ error: e.body }, null, 2);
    }
    // Like the real service, a finished request's answer (success or refusal) is what a retry gets back.
    if (idemKey && status < 500) {
      pruneIdempotency(data);
      data.idempotency[idemKey] = { fingerprint, status, body, at: Math.floor(Date.now() / 1000) };
    }
    if (method !== "GET") save();
    send(status, body);
  };

  const handleControl = async (req: http.IncomingMessage, res: http.ServerResponse, url: URL, raw: string) => {
    const method = req.method ?? "GET";
    const seg = url.pathname.split("/").filter(Boolean).map(decodeURIComponent); // ["_control", ...]
    const json = (status: number, body: unknown) =>
      res.writeHead(status, { "Content-Type": "application/json" }).end(JSON.stringify(body, null, 2));
    try {
      if (method === "POST" && seg[1] === "invoices" && seg[2] && (seg[3] === "pay" || seg[3] === "fail") && seg.length === 4) {
        const { invoice, event, delivery } = settle(seg[2], seg[3]);
        save();
        return json(200, { invoice: ledger.presentInvoice(invoice), event: { id: event.id, type: event.type }, delivery: (await delivery) ?? null });
      }
      if (method === "POST" && seg[1] === "events" && seg[2] && seg[3] === "resend" && seg.length === 4) {
        const event = ledger.event(seg[2]);
        if (!webhookUrl) throw invalid("No webhook URL is configured; POST /_control/webhook-url first.", "webhook_url", undefined, 409);
        return json(200, { event: { id: event.id, type: event.type }, delivery: await deliver(event) });
      }
      if (method === "GET" && seg[1] === "events" && seg.length === 2) {
        const items = Object.values(data.events).reverse().map((e) => ({ id: e.id, type: e.type, created: e.created, deliveries: data.deliveries[e.id] ?? [] }));
        return json(200, { items, total: items.length });
      }
      if (method === "GET" && seg[1] === "events" && seg[2] && seg.length === 3) {
        const event = ledger.event(seg[2]);
        return json(200, { event, deliveries: data.deliveries[event.id] ?? [] });
      }
      if (seg[1] === "webhook-url" && seg.length === 2) {
        if (method === "POST") {
          const body = raw.trim().startsWith("{") ? (JSON.parse(raw) as FormObject) : parseForm(raw);
          const next = readString(body, "url", true)!;
          webhookUrl = next === "" ? undefined : next;
        }
        if (method === "POST" || method === "GET") return json(200, { url: webhookUrl ?? null, enabledEvents: [...enabled] });
      }
      if (method === "POST" && seg[1] === "reset" && seg.length === 2) {
        Object.assign(data, emptyLedger());
        save();
        return json(200, { reset: true });
      }
      throw invalid(`No control route ${method} ${url.pathname}`, undefined, undefined, 404);
    } catch (err) {
      if (err instanceof ApiError) return json(err.status, { error: err.body });
      if (err instanceof SyntaxError) return json(400, { error: { type: "invalid_request_error", message: err.message } });
      throw err;
    }
  };

  /** Pays or declines an open invoice and announces it, as a card payment would. */
  const settle = (id: string, outcome: "pay" | "fail") => {
    const noRequest = { id: null, idempotency_key: null };
    if (outcome === "pay") {
      const invoice = ledger.payInvoice(id);
      const { event, delivery } = emit("invoice.paid", invoice, noRequest);
      emit("invoice.payment_succeeded", invoice, noRequest);
      return { invoice, event, delivery };
    }
    const invoice = ledger.failInvoice(id);
    const { event, delivery } = emit("invoice.payment_failed", invoice, noRequest);
    return { invoice, event, delivery };
  };

  const handlePage = async (req: http.IncomingMessage, res: http.ServerResponse, url: URL) => {
    const seg = url.pathname.split("/").filter(Boolean).map(decodeURIComponent); // ["invoices", id, action?]
    const id = seg[1]!;
    const html = (status: number, body: string) => res.writeHead(status, { "Content-Type": "text/html; charset=utf-8" }).end(body);
    const inv = data.invoices[id];
    if (!inv) return html(404, renderNotFoundPage(id));
    if (req.method === "GET" && seg.length === 2) {
      const notice = url.searchParams.get("declined") ? "The payment was declined. The invoice is still open." : undefined;
      return html(200, renderInvoicePage(inv, ledger.itemsOn(id), data.customers[inv.customer], notice));
    }
    if (req.method === "POST" && seg.length === 3 && (seg[2] === "pay" || seg[2] === "fail")) {
      let suffix = "";
      if (inv.status === "open") {
        const { delivery } = settle(id, seg[2]);
        save();
        // Waiting for the first delivery means Phasebook already knows by the time the page says "Paid".
        await delivery;
        if (seg[2] === "fail") suffix = "?declined=1";
      }
      res.writeHead(303, { Location: `/invoices/${encodeURIComponent(id)}${suffix}` }).end();
      return;
    }
    html(405, renderNotFoundPage(id));
  };

  const server = http.createServer((req, res) => {
    readBody(req)
      .then(async (raw) => {
        const url = new URL(req.url ?? "/", "http://payments.local");
        if (url.pathname.startsWith("/v1/")) return handleApi(req, res, url, raw);
        if (url.pathname.startsWith("/_control/")) return handleControl(req, res, url, raw);
        if (/^\/invoices\/[^/]+(\/(pay|fail))?$/.test(url.pathname)) return handlePage(req, res, url);
        if (url.pathname === "/" && req.method === "GET") {
          res.writeHead(200, { "Content-Type": "application/json" }).end(JSON.stringify({
            service: "Phasebook fake payment service",
            apiVersion: API_VERSION,
            webhookUrl: webhookUrl ?? null,
            counts: { customers: Object.keys(data.customers).length, invoices: Object.keys(data.invoices).length, events: Object.keys(data.events).length },
          }, null, 2));
          return;
        }
        res.writeHead(404, { "Content-Type": "application/json" }).end(JSON.stringify({ error: { type: "invalid_request_error", message: `Unrecognized request URL (${req.method}: ${url.pathname}).` } }));
      })
      .catch((err: Error & { status?: number }) => {
        log(`payments: ${err.stack ?? err.message}`);
        if (!res.headersSent) {
          res.writeHead(err.status ?? 500, { "Content-Type": "application/json" }).end(JSON.stringify({ error: { type: "api_error", message: err.message } }));
        }
      });
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port ?? 12111, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  const urlHost = host === "0.0.0.0" || host === "::" ? "127.0.0.1" : host;
  baseUrl = `http://${urlHost}:${port}`;
  log(`fake payments listening on ${baseUrl}`);

  return {
    url: baseUrl,
    port,
    setWebhookUrl(url: string) {
      webhookUrl = url;
    },
    async close() {
      closed = true;
      sender.close();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      save();
    },
  };
}

function loadLedger(dataPath: string | undefined): LedgerData {
  const stored = readJsonFile<LedgerData>(dataPath);
  const data = { ...emptyLedger(), ...stored };
  pruneIdempotency(data);
  return data;
}

/** The SDK puts a key on every POST, so old answers are dropped after a day, as the real service does. */
function pruneIdempotency(data: LedgerData): void {
  const cutoff = Math.floor(Date.now() / 1000) - IDEMPOTENCY_TTL_SECONDS;
  for (const [k, v] of Object.entries(data.idempotency)) if (v.at < cutoff) delete data.idempotency[k];
}

/** Bearer is what the SDK sends; Basic (key as user name) is what curl -u sends. */
function apiKeyOf(req: http.IncomingMessage): string | undefined {
  const header = req.headers.authorization;
  if (!header) return undefined;
  const [scheme, value] = header.split(/\s+/, 2);
  if (!value) return undefined;
  if (scheme?.toLowerCase() === "bearer") return value;
  if (scheme?.toLowerCase() === "basic") {
    const decoded = Buffer.from(value, "base64").toString("utf8");
    return decoded.split(":")[0] || undefined;
  }
  return undefined;
}

function readBody(req: http.IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY_BYTES) {
        reject(Object.assign(new Error("Request body too large"), { status: 413 }));
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on("end", () => resolve(Buffer.concat(chunks).toString("utf8")));
    req.on("error", reject);
  });
}
