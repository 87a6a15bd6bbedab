/** The run plans of a booking as links, for My bookings, and the way to plan one. */
import { Link } from "react-router-dom";
import type { RunPlanSummaryDto } from "@shared/schemas/run-plan-records";
import { paths } from "@/config/paths";
import { useRunPlans } from "../api/run-plans";

/** Every plan the person may see, by the booking it is attached to. */
export function useRunPlansByBooking(): Map<number, RunPlanSummaryDto[]> {
  const plans = useRunPlans({});
  const out = new Map<number, RunPlanSummaryDto[]>();
  for (const p of plans.data?.items ?? []) if (p.bookingId !== null) out.set(p.bookingId, [...(out.get(p.bookingId) ?? []), p]);
  return out;
}

export function BookingRunPlans({ plans, canPlan }: { plans: RunPlanSummaryDto[] | undefined; canPlan: boolean }) {
  return (
    <div className="flex flex-col gap-0.5 text-xs" data-testid="booking-run-plans">
      {(plans ?? []).map((p) => (
        <Link key={p.id} to={paths.runPlan.getHref(p.id)}>
          {p.title}
          {p.heldReservations > 0 ? ` · ${p.heldReservations} held` : ""}
        </Link>
      ))}
      {canPlan && (!plans || plans.length === 0) && <Link to={paths.runPlanNew.getHref()}>Plan the run</Link>}
    </div>
  );
}
