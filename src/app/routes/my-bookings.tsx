/** My bookings: the person's own bookings with check-in, check-out and cancel, and their calendar feed. */
import { PageHeader } from "@/components/ui/page-header";
import { MyBookings } from "@/features/schedule/components/my-bookings";

export function MyBookingsRoute() {
  return (
    <>
      <PageHeader title="My bookings" description="Check in when you start and out when you finish: billing uses those times. Cancel in good time so others can use the instrument." />
      <MyBookings />
    </>
  );
}
