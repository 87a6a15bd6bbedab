/** Query keys of the Recharge feature: every input of a fetch is in its key. */
export const rechargeKeys = {
  all: ["recharge"] as const,
  rates: () => ["recharge", "rates"] as const,
  policy: () => ["recharge", "policy"] as const,
  runs: () => ["recharge", "runs"] as const,
  run: (id: number) => ["recharge", "runs", id] as const,
  previews: () => ["recharge", "preview"] as const,
  preview: (period: string) => ["recharge", "preview", period] as const,
  accounts: () => ["recharge", "accounts"] as const,
  members: (id: number) => ["recharge", "accounts", id, "members"] as const,
  /** The spend, revenue, outstanding and my-charges views. */
  views: () => ["recharge", "views"] as const,
  spend: () => ["recharge", "views", "spend"] as const,
  revenue: () => ["recharge", "views", "revenue"] as const,
  outstanding: () => ["recharge", "views", "outstanding"] as const,
  myCharges: () => ["recharge", "views", "my-charges"] as const,
};
