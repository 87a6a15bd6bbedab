/** My charges: every member's own lines on final statements. */
import { MyCharges } from "@/features/recharge/components/my-charges";

export function MyChargesRoute() {
  return <MyCharges />;
}
