/** Schedule (placeholder until the booking work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function ScheduleRoute() {
  return (
    <PlannedScreen title="Schedule">
      Each instrument's bookings by day and week, where you pick a free slot and book a potentiostat and an interface cell together.
    </PlannedScreen>
  );
}
