/**
 * The start page's sections, one per role: a member's next bookings, a manager's queue and
 * instrument figures, a safety officer's stock figures. Which appear is the server's decision.
 */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { useFacilityZone } from "@/lib/facility";
import { formatSpan, humanize } from "@/lib/format";
import type { DashboardBookingDto as DashboardBooking, DashboardDto as Dashboard } from "@shared/schemas/dashboard";
import { Card } from "@/components/ui/card";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { StatTile } from "./stat-tile";

const BOOKING_TONES: Record<string, BadgeTone> = {
  requested: "warning",
  confirmed: "ok",
  in_progress: "aqueous",
  completed: "neutral",
  declined: "danger",
  cancelled: "neutral",
  no_show: "danger",
};

function BookingRow({ booking }: { booking: DashboardBooking }) {
  // Bookings are on the facility's clock, like the Schedule.
  const zone = useFacilityZone();
  return (
    <li className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1 py-2">
      <div className="min-w-0">
        <p className="font-medium text-grey-900">{booking.instrumentNames.join(" + ") || "Booking"}</p>
        <p className="text-xs text-grey-600">{formatSpan(booking.start, booking.end, zone)}</p>
      </div>
      <Badge tone={BOOKING_TONES[booking.status] ?? "neutral"}>{humanize(booking.status)}</Badge>
    </li>
  );
}

export function MemberSection({ member }: { member: Dashboard["member"] }) {
  return (
    <Card
      title="Your next bookings"
      actions={
        <Link to={paths.myBookings.getHref()} className="text-xs">
          All my bookings
        </Link>
      }
    >
      {member.nextBookings.length === 0 ? (
        <EmptyState
          title="No bookings ahead"
          action={
            <Link to={paths.schedule.getHref()} className="text-sm">
              Find a free slot on the Schedule
            </Link>
          }
        >
          Book a potentiostat and an interface cell together for your next run.
        </EmptyState>
      ) : (
        <ul className="divide-y divide-grey-100" data-testid="next-bookings">
          {member.nextBookings.map((b) => (
            <BookingRow key={b.id} booking={b} />
          ))}
        </ul>
      )}
    </Card>
  );
}

export function ManagerSection({ manager }: { manager: NonNullable<Dashboard["manager"]> }) {
  return (
    <section aria-labelledby="manager-heading" className="flex flex-col gap-2">
      <h2 id="manager-heading" className="text-sm font-semibold text-grey-900">
        Facility
      </h2>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <StatTile
          testId="stat-pending-approvals"
          label="Booking requests waiting for approval"
          value={manager.pendingApprovals}
          to={paths.approvals.getHref()}
          linkText="Open the approval queue"
          attention={{ tone: "warning", word: "Waiting" }}
        />
        <StatTile
          testId="stat-training-requests"
          label="Members asking for training"
          value={manager.openTrainingRequests}
          to={paths.training.getHref()}
          linkText="Answer the requests"
          attention={{ tone: "warning", word: "Asking" }}
        />
        <StatTile
          testId="stat-training-expiring"
          label="Training records expiring soon"
          value={manager.trainingExpiringSoon}
          to={paths.training.getHref()}
          linkText="Review training"
          attention={{ tone: "warning", word: "Expiring" }}
        />
        <StatTile
          testId="stat-out-of-service"
          label="Instruments out of service"
          value={manager.instrumentsOutOfService}
          to={paths.instruments.getHref()}
          linkText="See instruments"
          attention={{ tone: "danger", word: "Not bookable" }}
        />
      </div>
    </section>
  );
}

export function SafetySection({ safety }: { safety: NonNullable<Dashboard["safety"]> }) {
  return (
    <section aria-labelledby="safety-heading" className="flex flex-col gap-2">
      <h2 id="safety-heading" className="text-sm font-semibold text-grey-900">
        Safety
      </h2>
      <div className="grid gap-3 sm:grid-cols-3">
        <StatTile
          testId="stat-expired-containers"
          label="Containers past expiry or retest date"
          value={safety.expiredContainers}
          to={paths.safety.getHref()}
          linkText="See them in Safety review"
          attention={{ tone: "organic", word: "Expired" }}
        />
        <StatTile
          testId="stat-on-hold"
          label="Containers on hold"
          value={safety.onHold}
          to={paths.stockroom.getHref({ status: "on_hold" })}
          linkText="Show them in the Stockroom"
          attention={{ tone: "organic", word: "On hold" }}
        />
        <StatTile
          testId="stat-over-limit"
          label="Locations over their storage limit"
          value={safety.locationsOverLimit}
          to={paths.safety.getHref()}
          linkText="Open Safety review"
          attention={{ tone: "danger", word: "Over limit" }}
        />
        <StatTile
          testId="stat-expiring-soon"
          label="Containers expiring within 30 days"
          value={safety.expiringSoon}
          to={paths.stockroom.getHref({ sort: "expiresAt" })}
          linkText="Stockroom, soonest expiry first"
          attention={{ tone: "organic", word: "Expiring" }}
        />
        <StatTile
          testId="stat-chemicals-on-hold"
          label="Chemicals on hold"
          value={safety.chemicalsOnHold}
          to={paths.safety.getHref()}
          linkText="See them in Safety review"
          attention={{ tone: "organic", word: "On hold" }}
        />
      </div>
    </section>
  );
}
