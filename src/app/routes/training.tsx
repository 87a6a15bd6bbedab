/** Training (placeholder until the training-record work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function TrainingRoute() {
  return (
    <PlannedScreen title="Training">
      Training records per person and instrument (current, expiring, expired), and certifying someone after a training session.
    </PlannedScreen>
  );
}
