/**
 * The payment service client: the real stripe SDK, pointed at the local fake payment API
 * unless a real key and endpoint are configured.
 */
import Stripe from "stripe";

export interface PaymentsConfig {
  secretKey: string;
  apiBase?: string;
  webhookSecret: string;
}

export function createPaymentsClient(cfg: PaymentsConfig): Stripe {
  const opts: Record<string, unknown> = { maxNetworkRetries: 1, timeout: 15_000 };
  if (cfg.apiBase) {
    const u = new URL(cfg.apiBase);
    opts.host = u.hostname;
    opts.port = Number(u.port || (u.protocol === "https:" ? 443 : 80));
    opts.protocol = u.protocol.replace(":", "");
  }
  return new Stripe(cfg.secretKey, opts as ConstructorParameters<typeof Stripe>[1]);
}
