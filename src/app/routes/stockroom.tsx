/** Stockroom (placeholder until the stock work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function StockroomRoute() {
  return (
    <PlannedScreen title="Stockroom">
      Chemicals with their hazard data and every container's quantity, location and expiry; prepared solutions and logging what a run used.
    </PlannedScreen>
  );
}
