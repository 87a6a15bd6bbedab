/** Recharge (placeholder until the billing work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function RechargeRoute() {
  return (
    <PlannedScreen title="Recharge">
      Accounts and who may charge them, hourly rates per customer class, monthly statements, and the journal file for the finance office.
    </PlannedScreen>
  );
}
