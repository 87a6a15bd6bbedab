/**
 * How a booking's state looks: the word (always shown), a badge tone, and the calendar block's
 * look, which adds a pattern for requests so the state never rests on colour alone.
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

/** Block colours on the calendar: background, border, text. Busy blocks of others are grey. */
export const BLOCK_COLOURS: Record<BookingStatus | "busy", { bg: string; border: string; text: string }> = {
  requested: { bg: "#fff7e0", border: "#b7791f", text: "#5f3b00" },
  confirmed: { bg: "#dcecf7", border: "#2b6c99", text: "#0f3552" },
  in_progress: { bg: "#fbe3d3", border: "#b5541c", text: "#5a2406" },
  completed: { bg: "#eceef0", border: "#7b8591", text: "#2c3239" },
  declined: { bg: "#f9e0e0", border: "#a83232", text: "#5c1010" },
  cancelled: { bg: "#f4f5f6", border: "#a9b0b8", text: "#4b525a" },
  no_show: { bg: "#f9e0e0", border: "#a83232", text: "#5c1010" },
  busy: { bg: "#e4e7ea", border: "#8a939c", text: "#2c3239" },
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
    { key: "no_show", label: "No-show" },
    { key: "busy", label: "Busy (someone else's booking)" },
  ];
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-grey-700" aria-label="Legend of booking states" data-testid="schedule-legend">
      {items.map((i) => (
        <li key={i.key} className="flex items-center gap-1.5">
          <span
            aria-hidden="true"
            className="inline-block size-3 rounded-sm border"
            style={{ background: BLOCK_COLOURS[i.key].bg, borderColor: BLOCK_COLOURS[i.key].border, borderStyle: i.key === "requested" ? "dashed" : "solid" }}
          />
          {i.label}
        </li>
      ))}
    </ul>
  );
}
