/** My bookings: the person's own bookings with check-in, check-out and cancel, and their calendar feed. */
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { LoadingLine } from "@/components/ui/spinner";
import { MyBookings } from "@/features/schedule/components/my-bookings";
import { useScheduleContext } from "@/app/use-schedule-context";
import { BookingRunPlans, useRunPlansByBooking } from "@/features/run-plans/components/booking-run-plans";

export function MyBookingsRoute() {
  const ctx = useScheduleContext();
  const plans = useRunPlansByBooking();
  return (
    <>
      <PageHeader {...SCREEN_HEADS.myBookings} />
      {ctx.error ? (
        <Alert tone="danger">{describeError(ctx.error)}</Alert>
      ) : ctx.loading || !ctx.zone ? (
        <LoadingLine label="Loading your bookings" />
      ) : (
        <MyBookings
          names={ctx.names}
          zone={ctx.zone}
          extra={{ title: "Run plan", cell: (b) => <BookingRunPlans plans={plans.get(b.id)} canPlan={b.abilities.cancel && b.mine} /> }}
        />
      )}
    </>
  );
}
