/** Safety review (placeholder until the safety work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function SafetyRoute() {
  return (
    <PlannedScreen title="Safety review">
      Flammable-liquid totals per room and cabinet against their limits, expired and on-hold stock, carcinogens, and halogenated waste.
    </PlannedScreen>
  );
}
