/** Recharge: billing runs, rates, the rate review, accounts and spend; tabs by role (manager, group lead). */
import { useState } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { hasRole, useUser } from "@/lib/auth";
import { cn } from "@/lib/cn";
import { AccountsPanel } from "./accounts-panel";
import { BillingRuns } from "./billing-runs";
import { RatesPanel } from "./rates-panel";
import { RateReview } from "./rate-review";
import { SpendView } from "./spend-view";

type Tab = "runs" | "rates" | "review" | "accounts" | "spend";
const LABELS: Record<Tab, string> = { runs: "Billing runs", rates: "Rates", review: "Rate review", accounts: "Accounts", spend: "Spend" };

export function RechargePage() {
  const { data: user } = useUser();
  const isManager = hasRole(user, "manager");
  const tabs: Tab[] = isManager ? ["runs", "rates", "review", "accounts", "spend"] : ["accounts", "spend", "rates"];
  const [tab, setTab] = useState<Tab>(tabs[0]);
  return (
    <div>
      <PageHeader {...SCREEN_HEADS.recharge} />
      <div role="tablist" aria-label="Recharge sections" className="mb-4 flex flex-wrap gap-1 border-b border-grey-200">
        {tabs.map((t) => (
          <button
            key={t}
            type="button"
            role="tab"
            aria-selected={tab === t}
            data-testid={`recharge-tab-${t}`}
            onClick={() => setTab(t)}
            className={cn(
              "-mb-px border-b-2 px-3 py-1.5 text-sm",
              tab === t ? "border-aqueous-600 font-medium text-grey-900" : "border-transparent text-grey-600 hover:text-grey-900",
            )}
          >
            {LABELS[t]}
          </button>
        ))}
      </div>
      {tab === "runs" && <BillingRuns />}
      {tab === "rates" && <RatesPanel canEdit={isManager} />}
      {tab === "review" && <RateReview />}
      {tab === "accounts" && <AccountsPanel />}
      {tab === "spend" && <SpendView isManager={isManager} />}
    </div>
  );
}
