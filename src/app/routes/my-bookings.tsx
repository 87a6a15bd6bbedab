/** My bookings (placeholder until the booking work lands). */
import { PlannedScreen } from "@/components/planned-screen";

export function MyBookingsRoute() {
  return (
    <PlannedScreen title="My bookings">
      Your requested, confirmed and past bookings with check-in and check-out, what each run cost, and a feed for your own calendar.
    </PlannedScreen>
  );
}
