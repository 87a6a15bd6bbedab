/**
 * How a booking's state looks: the word (always shown), a badge tone, and the key to the
 * calendar's blocks, whose look (schedule-calendar.css, classes `booking-<state>`) adds a dashed
 * border for requests and a hatching for busy time, so the state never rests on colour alone.
 */
import { BOOKING_STATUS_LABELS, type BookingStatus } from "@shared/schemas/bookings";
import { Badge, type BadgeTone } from "@/components/ui/badge";

export const STATUS_TONES: Record<BookingStatus, BadgeTone> = {
  requested: "warning",
  confirmed: "aqueous",
  in_progress: "organic",
  completed: "neutral",
  declined: "danger",
  cancelled: "neutral",
  no_show: "danger",
};

export function StatusBadge({ status }: { status: BookingStatus }) {
  return <Badge tone={STATUS_TONES[status]}>{BOOKING_STATUS_LABELS[status]}</Badge>;
}

/** The key to the calendar's blocks: each state's word beside its swatch. */
export function StatusLegend() {
  const items: { key: BookingStatus | "busy"; label: string }[] = [
    { key: "requested", label: "Requested (waiting for approval, dashed border)" },
    { key: "confirmed", label: "Confirmed" },
    { key: "in_progress", label: "In progress" },
    { key: "completed", label: "Completed" },
    { key: "no_show", label: "No-show (struck through)" },
    { key: "busy", label: "Busy (someone else's booking, hatched)" },
  ];
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-grey-700" aria-label="Legend of booking states" data-testid="schedule-legend">
      {items.map((i) => (
        <li key={i.key} className="flex items-center gap-1.5">
          <span aria-hidden="true" className={`pb-swatch booking-${i.key}`} />
          {i.label}
        </li>
      ))}
    </ul>
  );
}
