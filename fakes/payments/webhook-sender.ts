/**
 * Signs and delivers the fake payment service's webhook events. The signature is the scheme the
 * real service documents for its webhooks: header `t=<unix seconds>,v1=<hex HMAC-SHA256 of
 * "<t>.<raw body>" keyed with the endpoint secret>`, computed afresh for every attempt. A failed
 * delivery is retried with growing pauses and every attempt is recorded; nothing here may throw
 * into the server, because the fake must outlive a broken receiver.
 */
import crypto from "node:crypto";

export interface DeliveryAttempt {
  attempt: number;
  at: number;
  url: string;
  ok: boolean;
  status: number | null;
  error: string | null;
  durationMs: number;
}

export interface DeliveryResult {
  eventId: string;
  delivered: boolean;
  attempts: DeliveryAttempt[];
  /** True while later retries are still scheduled. */
  retrying: boolean;
}

export function signWebhookPayload(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const signature = crypto.createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${signature}`;
}

export interface WebhookSenderOptions {
  secret: string;
  /** Pauses before the 2nd, 3rd, ... attempt. */
  retryDelaysMs: number[];
  timeoutMs: number;
  onAttempt(eventId: string, attempt: DeliveryAttempt): void;
  log(line: string): void;
}

export class WebhookSender {
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly aborter = new AbortController();
  private closed = false;

  constructor(private readonly opts: WebhookSenderOptions) {}

  /** Resolves after the first attempt; retries (if any) continue in the background. */
  async deliver(url: string, eventId: string, payload: string): Promise<DeliveryResult> {
    const attempts: DeliveryAttempt[] = [];
    const first = await this.attempt(url, eventId, payload, 1);
    attempts.push(first);
    const retrying = !first.ok && this.scheduleRetry(url, eventId, payload, 2);
    return { eventId, delivered: first.ok, attempts, retrying };
  }

  close(): void {
    this.closed = true;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
    this.aborter.abort();
  }

  private scheduleRetry(url: string, eventId: string, payload: string, attemptNo: number): boolean {
    const delay = this.opts.retryDelaysMs[attemptNo - 2];
    if (delay === undefined || this.closed) return false;
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      void this.attempt(url, eventId, payload, attemptNo).then((result) => {
        if (!result.ok) this.scheduleRetry(url, eventId, payload, attemptNo + 1);
      });
    }, delay);
    timer.unref();
    this.timers.add(timer);
    return true;
  }

  private async attempt(url: string, eventId: string, payload: string, attemptNo: number): Promise<DeliveryAttempt> {
    const started = Date.now();
    let result: DeliveryAttempt;
    try {
      const res = await fetch(url, {
        method: "POST",
        headers: {
          "Content-Type": "application/json; charset=utf-8",
          "User-Agent": "Phasebook-FakePayments/1.0",
          "Stripe-Signature": signWebhookPayload(payload, this.opts.secret),
        },
        body: payload,
        signal: AbortSignal.any([this.aborter.signal, AbortSignal.timeout(this.opts.timeoutMs)]),
      });
      // Drain the body so keep-alive sockets are released.
      await res.arrayBuffer().catch(() => undefined);
      result = { attempt: attemptNo, at: started, url, ok: res.ok, status: res.status, error: res.ok ? null : `HTTP ${res.status}`, durationMs: Date.now() - started };
    } catch (err) {
      const e = err as Error & { cause?: { code?: string } };
      const detail = e.cause?.code ?? e.name ?? "error";
      result = { attempt: attemptNo, at: started, url, ok: false, status: null, error: `${detail}: ${e.message}`, durationMs: Date.now() - started };
    }
    try {
      this.opts.onAttempt(eventId, result);
      this.opts.log(`webhook ${eventId} attempt ${attemptNo} → ${result.ok ? result.status : result.error}`);
    } catch {
      // Recording must never break delivery (e.g. a state file on a full disk).
    }
    return result;
  }
}
