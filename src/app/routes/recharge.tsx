/** Recharge: the manager's and group lead's billing section. */
import { RechargePage } from "@/features/recharge/components/recharge-page";

export function RechargeRoute() {
  return <RechargePage />;
}
