/**
 * Fake mailbox: a real SMTP server that keeps every message it receives, plus a small HTTP API
 * (and a plain page) to read them back. Phasebook talks to it exactly as it would to a relay, so
 * the mail code under test is the production code; tests and people read the result over HTTP.
 */
import http from "node:http";
import crypto from "node:crypto";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject, type ParsedMail } from "mailparser";
import { readJsonFile, writeJsonAtomic } from "../json-file";

export interface MailboxAttachment {
  filename: string | null;
  contentType: string;
  size: number;
  /** Base64; kept so tests can check an iCalendar invite or a PDF statement byte for byte. */
  content: string;
}

export interface MailboxMessage {
  id: string;
  from: string | null;
  to: string[];
  cc: string[];
  subject: string;
  text: string;
  html: string | null;
  date: string;
  receivedAt: string;
  /** What the client said in MAIL FROM / RCPT TO; Bcc recipients only show up here. */
  envelope: { from: string | null; to: string[] };
  headers: Record<string, string>;
  attachments: MailboxAttachment[];
}

export interface FakeMailboxOptions {
  smtpPort?: number;
  httpPort?: number;
  host?: string;
  storePath?: string;
}

export interface FakeMailbox {
  smtpUrl: string;
  httpUrl: string;
  close(): Promise<void>;
}

/** Headers worth asserting on; the rest of the source is available at /messages/:id/raw. */
const KEPT_HEADERS = new Set([
  "message-id",
  "in-reply-to",
  "references",
  "reply-to",
  "content-type",
  "auto-submitted",
  "list-unsubscribe",
  "list-unsubscribe-post",
  "precedence",
]);

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

interface StoredMessage extends MailboxMessage {
  /** latin1 keeps 8-bit bodies byte-exact through JSON. */
  raw: string;
}

export async function startFakeMailbox(opts: FakeMailboxOptions = {}): Promise<FakeMailbox> {
  const host = opts.host ?? "127.0.0.1";
  const messages: StoredMessage[] = loadMessages(opts.storePath);

  const persist = () => {
    if (!opts.storePath) return;
    writeJsonAtomic(opts.storePath, { version: 1, messages });
  };

  const smtp = new SMTPServer({
    secure: false,
    disabledCommands: ["STARTTLS"],
    authOptional: true,
    // Without TLS, AUTH would otherwise be refused; the fake accepts any credentials on purpose.
    allowInsecureAuth: true,
    banner: "Phasebook fake mailbox",
    size: MAX_MESSAGE_BYTES,
    logger: false,
    disableReverseLookup: true,
    // A lingering pooled client must not hold close() for the default 30 s.
    closeTimeout: 500,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? "anonymous" });
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (chunk: Buffer) => chunks.push(chunk));
      stream.on("error", (err) => callback(err));
      stream.on("end", () => {
        if (stream.sizeExceeded) {
          const err = Object.assign(new Error("Message exceeds the fake mailbox's size limit"), { responseCode: 552 });
          callback(err);
          return;
        }
        const raw = Buffer.concat(chunks);
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address.toLowerCase() : null,
          to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
        };
        simpleParser(raw)
          .then((parsed) => {
            const message = toMessage(parsed, raw, envelope);
            messages.push(message);
            persist();
            callback(null, `Queued as ${message.id}`);
          })
          .catch((err: Error) => callback(err));
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(opts.smtpPort ?? 2525, host, () => {
      smtp.off("error", reject);
      resolve();
    });
  });
  // After start-up an SMTP socket error (a client hanging up mid-DATA) must not take the process down.
  smtp.on("error", () => undefined);
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  const web = http.createServer((req, res) => {
    try {
      handleHttp(req, res, messages, persist);
    } catch (err) {
      sendJson(res, 500, { error: { message: (err as Error).message } });
    }
  });
  try {
    await new Promise<void>((resolve, reject) => {
      web.once("error", reject);
      web.listen(opts.httpPort ?? 2580, host, () => {
        web.off("error", reject);
        resolve();
      });
    });
  } catch (err) {
    // Leave nothing listening when only half of the mailbox could start.
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }
  const httpPort = (web.address() as AddressInfo).port;
  const urlHost = host === "0.0.0.0" || host === "::" ? "127.0.0.1" : host;

  return {
    smtpUrl: `smtp://${urlHost}:${smtpPort}`,
    httpUrl: `http://${urlHost}:${httpPort}`,
    async close() {
      await Promise.all([
        new Promise<void>((resolve) => smtp.close(() => resolve())),
        new Promise<void>((resolve) => {
          web.close(() => resolve());
          web.closeAllConnections();
        }),
      ]);
      persist();
    },
  };
}

function handleHttp(
  req: http.IncomingMessage,
  res: http.ServerResponse,
  messages: StoredMessage[],
  persist: () => void,
): void {
  const url = new URL(req.url ?? "/", "http://mailbox.local");
  const parts = url.pathname.split("/").filter(Boolean).map(decodeURIComponent);
  const method = req.method ?? "GET";

  if (method === "GET" && parts.length === 0) {
    sendHtml(res, 200, renderIndex(newestFirst(messages)));
    return;
  }
  if (parts[0] !== "messages") {
    sendJson(res, 404, { error: { message: `No route for ${method} ${url.pathname}` } });
    return;
  }

  if (parts.length === 1) {
    if (method === "GET") {
      const to = url.searchParams.get("to")?.trim().toLowerCase();
      const items = newestFirst(messages)
        .filter((m) => !to || addressesOf(m).includes(to))
        .map(publicMessage);
      sendJson(res, 200, { items, total: items.length });
      return;
    }
    if (method === "DELETE") {
      messages.length = 0;
      persist();
      res.writeHead(204).end();
      return;
    }
  }

  const message = parts[1] ? messages.find((m) => m.id === parts[1]) : undefined;
  if (parts.length >= 2 && !message) {
    sendJson(res, 404, { error: { message: `No message ${parts[1]}` } });
    return;
  }
  if (message && parts.length === 2) {
    if (method === "GET") {
      sendJson(res, 200, publicMessage(message));
      return;
    }
    if (method === "DELETE") {
      messages.splice(messages.indexOf(message), 1);
      persist();
      res.writeHead(204).end();
      return;
    }
  }
  if (message && method === "GET" && parts.length === 3 && parts[2] === "raw") {
    res.writeHead(200, { "Content-Type": "message/rfc822" }).end(Buffer.from(message.raw, "latin1"));
    return;
  }
  if (message && method === "GET" && parts.length === 3 && parts[2] === "view") {
    sendHtml(res, 200, renderMessage(message));
    return;
  }
  if (message && method === "GET" && parts.length === 4 && parts[2] === "attachments") {
    const attachment = message.attachments[Number(parts[3])];
    if (!attachment) {
      sendJson(res, 404, { error: { message: `No attachment ${parts[3]} on ${message.id}` } });
      return;
    }
    res
      .writeHead(200, {
        "Content-Type": attachment.contentType,
        "Content-Disposition": `attachment; filename="${(attachment.filename ?? "attachment").replace(/"/g, "")}"`,
      })
      .end(Buffer.from(attachment.content, "base64"));
    return;
  }
  sendJson(res, 405, { error: { message: `${method} is not supported on ${url.pathname}` } });
}

function toMessage(parsed: ParsedMail, raw: Buffer, envelope: StoredMessage["envelope"]): StoredMessage {
  const headerTo = addressList(parsed.to);
  const receivedAt = new Date().toISOString();
  const headers: Record<string, string> = {};
  for (const { key, line } of parsed.headerLines) {
    if (!KEPT_HEADERS.has(key) && !key.startsWith("x-")) continue;
    // headerLines keep the folded original "Key: value"; unfold it for plain comparisons.
    headers[key] = line.slice(line.indexOf(":") + 1).replace(/\r?\n[ \t]+/g, " ").trim();
  }
  return {
    id: crypto.randomBytes(8).toString("hex"),
    from: addressList(parsed.from)[0] ?? null,
    to: headerTo.length > 0 ? headerTo : envelope.to,
    cc: addressList(parsed.cc),
    subject: parsed.subject ?? "",
    text: parsed.text ?? "",
    html: parsed.html || null,
    date: (parsed.date ?? new Date()).toISOString(),
    receivedAt,
    envelope,
    headers,
    attachments: parsed.attachments.map((a) => ({
      filename: a.filename ?? null,
      contentType: a.contentType,
      size: a.size,
      content: a.content.toString("base64"),
    })),
    raw: raw.toString("latin1"),
  };
}

function addressList(value: AddressObject | AddressObject[] | undefined): string[] {
  if (!value) return [];
  const objects = Array.isArray(value) ? value : [value];
  const out: string[] = [];
  for (const obj of objects) {
    for (const entry of obj.value) {
      // Group syntax ("Team: a@x, b@y;") nests the real addresses one level down.
      for (const addr of entry.group ?? [entry]) {
        if (addr.address) out.push(addr.address.toLowerCase());
      }
    }
  }
  return out;
}

function addressesOf(m: MailboxMessage): string[] {
  return [...m.to, ...m.cc, ...m.envelope.to];
}

function newestFirst(messages: StoredMessage[]): StoredMessage[] {
  return [...messages].reverse();
}

function publicMessage(m: StoredMessage): MailboxMessage {
  const { raw: _raw, ...rest } = m;
  return rest;
}

function loadMessages(storePath: string | undefined): StoredMessage[] {
  const data = readJsonFile<{ messages?: StoredMessage[] }>(storePath);
  return Array.isArray(data?.messages) ? data.messages : [];
}

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { "Content-Type": "application/json; charset=utf-8" }).end(JSON.stringify(body, null, 2));
}

function sendHtml(res: http.ServerResponse, status: number, html: string): void {
  res.writeHead(status, { "Content-Type": "text/html; charset=utf-8" }).end(html);
}

function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

const PAGE_STYLE = `
  body { font: 15px/1.5 system-ui, sans-serif; margin: 0; background: #f6f7f9; color: #1d2330; }
  main { max-width: 900px; margin: 2rem auto; padding: 0 1rem; }
  h1 { font-size: 1.25rem; margin: 0 0 1rem; }
  table { width: 100%; border-collapse: collapse; background: #fff; border: 1px solid #d8dde6; }
  th, td { text-align: left; padding: .5rem .75rem; border-bottom: 1px solid #e6e9ef; vertical-align: top; }
  th { font-size: .8rem; text-transform: uppercase; letter-spacing: .04em; color: #5a6375; }
  a { color: #1f5fa8; }
  .meta { background: #fff; border: 1px solid #d8dde6; padding: .75rem 1rem; margin-bottom: 1rem; }
  pre { white-space: pre-wrap; background: #fff; border: 1px solid #d8dde6; padding: 1rem; }
  iframe { width: 100%; height: 60vh; border: 1px solid #d8dde6; background: #fff; }
`;

function renderIndex(messages: StoredMessage[]): string {
  const rows = messages
    .map(
      (m) => `<tr><td>${esc(new Date(m.receivedAt).toLocaleString("en-CA"))}</td><td>${esc(m.to.join(", "))}</td>` +
        `<td><a href="/messages/${m.id}/view">${esc(m.subject || "(no subject)")}</a></td></tr>`,
    )
    .join("");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Fake mailbox</title>
<style>${PAGE_STYLE}</style></head><body><main><h1>Fake mailbox: ${messages.length} message(s)</h1>
<table><thead><tr><th>Received</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows ||
    '<tr><td colspan="3">Nothing received yet.</td></tr>'}</tbody></table></main></body></html>`;
}

function renderMessage(m: StoredMessage): string {
  const body = m.html
    ? `<iframe sandbox="" srcdoc="${esc(m.html)}"></iframe>`
    : `<pre>${esc(m.text)}</pre>`;
  const files = m.attachments
    .map((a, i) => `<li><a href="/messages/${m.id}/attachments/${i}">${esc(a.filename ?? `attachment ${i}`)}</a> (${esc(a.contentType)}, ${a.size} bytes)</li>`)
    .join("");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(m.subject)}</title>
<style>${PAGE_STYLE}</style></head><body><main><p><a href="/">All messages</a></p>
<h1>${esc(m.subject || "(no subject)")}</h1>
<div class="meta">From: ${esc(m.from ?? "")}<br>To: ${esc(m.to.join(", "))}${m.cc.length ? `<br>Cc: ${esc(m.cc.join(", "))}` : ""}<br>Date: ${esc(m.date)}
${files ? `<ul>${files}</ul>` : ""}<a href="/messages/${m.id}/raw">Source</a></div>${body}</main></body></html>`;
}
