/** Scan (placeholder until the label work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function ScanRoute() {
  return (
    <PlannedScreen title="Scan">
      Point your phone's camera at the QR label on a bottle or a cell to open its record with the one or two actions that make sense at the bench.
    </PlannedScreen>
  );
}
