/**
 * My bookings: upcoming and past, with the actions the server's booking policy allows on each
 * (`abilities`: check in, check out, cancel), a per-booking .ics, and the personal calendar feed with its rotation. Times are on
 * the facility's clock; the route passes the zone and the instruments' names in.
 */
import { useState, type ReactNode } from "react";
import type { BookingDto } from "@shared/schemas/bookings";
import { describeError } from "@/lib/forms";
import { formatDateTime, formatSpan } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useBookings } from "../api/get-bookings";
import { useBookingAction, type BookingAction } from "../api/booking-actions";
import { useCalendarFeed, useRotateCalendarFeed } from "../api/calendar-feed";
import { useBookingSettings } from "../api/booking-settings";
import { useConfirm } from "@/components/ui/confirm-dialog";
import { StatusBadge } from "./booking-status";

/** The buttons a booking offers: only what the server said this person may do to it now. */
function actionsFor(b: BookingDto): { action: BookingAction; label: string }[] {
  const out: { action: BookingAction; label: string }[] = [];
  if (b.abilities.checkIn) out.push({ action: "check-in", label: "Check in" });
  if (b.abilities.checkOut) out.push({ action: "check-out", label: "Check out" });
  if (b.abilities.cancel) out.push({ action: "cancel", label: "Cancel" });
  return out;
}

/** `extra` adds a column the route composes from another feature (the booking's run plans). */
export function MyBookings({ names, zone, extra }: { names: ReadonlyMap<number, string>; zone: string; extra?: { title: string; cell: (b: BookingDto) => ReactNode } }) {
  const [tab, setTab] = useState<"upcoming" | "past">("upcoming");
  const [now] = useState(() => Date.now());
  const iso = new Date(now).toISOString();
  const list = useBookings(tab === "upcoming" ? { mine: true, from: iso, limit: 200 } : { mine: true, to: iso, limit: 200 });
  const action = useBookingAction();
  const [message, setMessage] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const settings = useBookingSettings();
  const [confirmation, confirm] = useConfirm();
  const items = (list.data?.items ?? []).filter((b): b is BookingDto => !b.busy);
  const sorted = tab === "upcoming" ? [...items].sort((a, b) => a.start.localeCompare(b.start)) : [...items].sort((a, b) => b.start.localeCompare(a.start));

  const run = async (b: BookingDto, a: BookingAction, label: string) => {
    if (a === "cancel") {
      const lateHours = settings.data?.lateCancelHours;
      const late = lateHours !== undefined && new Date(b.start).getTime() - Date.now() < lateHours * 3_600_000;
      const sure = await confirm({
        title: "Cancel this booking?",
        description: (
          <>
            <p>
              {formatSpan(b.start, b.end, zone)} on {b.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ")}. The time goes back to the Schedule for others.
            </p>
            {late && (
              <p className="mt-2 font-medium text-grey-900">
                This is less than {lateHours} hours before the start: a late cancellation may be charged to {b.accountCode}.
              </p>
            )}
          </>
        ),
        confirmLabel: "Cancel the booking",
        keepLabel: "Keep it",
      });
      if (!sure) return;
    }
    setMessage(null);
    try {
      const r = await action.mutateAsync({ id: b.id, action: a });
      const late = !r.busy && r.lateCancel ? " It was inside the late-cancellation window, so it may be charged." : "";
      setMessage({ tone: "ok", text: `${label}: done.${late}` });
    } catch (e) {
      setMessage({ tone: "danger", text: describeError(e) });
    }
  };

  return (
    <div className="flex flex-col gap-4">
      <div className="flex gap-2" role="tablist">
        {(["upcoming", "past"] as const).map((t) => (
          <Button key={t} variant={tab === t ? "primary" : "secondary"} size="sm" role="tab" aria-selected={tab === t} onClick={() => setTab(t)}>
            {t === "upcoming" ? "Upcoming" : "Past"}
          </Button>
        ))}
      </div>
      {confirmation}
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      {list.isPending && <LoadingLine label="Loading your bookings" />}
      {list.isError && <Alert tone="danger">{describeError(list.error)}</Alert>}
      {list.data && sorted.length === 0 && <EmptyState title={tab === "upcoming" ? "No bookings ahead" : "No past bookings"}>Book from the Schedule.</EmptyState>}
      {sorted.length > 0 && (
        <Table caption={tab === "upcoming" ? "Your upcoming bookings" : "Your past bookings"}>
          <THead>
            <tr>
              <Th>When</Th>
              <Th>Instruments</Th>
              <Th>State</Th>
              <Th>Account</Th>
              <Th>Checked in / out</Th>
              {extra && <Th>{extra.title}</Th>}
              <Th className="text-right">Actions</Th>
            </tr>
          </THead>
          <TBody>
            {sorted.map((b) => (
              <Tr key={b.id} data-testid={`my-booking-${b.id}`}>
                <Td>{formatSpan(b.start, b.end, zone)}</Td>
                <Td>{b.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ")}</Td>
                <Td>
                  <StatusBadge status={b.status} />
                  {b.lateCancel && <span className="ml-1 text-xs text-grey-600">late</span>}
                  {b.declineReason && <p className="text-xs text-grey-600">Reason: {b.declineReason}</p>}
                </Td>
                <Td className="font-mono text-xs">{b.accountCode}</Td>
                <Td className="text-xs">
                  {b.checkedInAt ? formatDateTime(b.checkedInAt, zone) : "—"} / {b.checkedOutAt ? formatDateTime(b.checkedOutAt, zone) : "—"}
                </Td>
                {extra && <Td>{extra.cell(b)}</Td>}
                <Td className="text-right">
                  <div className="flex justify-end gap-2">
                    {actionsFor(b).map((a) => (
                      <Button key={a.action} size="sm" variant={a.action === "cancel" ? "secondary" : "primary"} onClick={() => run(b, a.action, a.label)}>
                        {a.label}
                      </Button>
                    ))}
                    <a className="text-xs" href={`/api/bookings/${b.id}.ics`} download>
                      .ics
                    </a>
                  </div>
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
      <CalendarFeedCard />
    </div>
  );
}

export function CalendarFeedCard() {
  const feed = useCalendarFeed();
  const rotate = useRotateCalendarFeed();
  return (
    <Card title="Your calendar feed" description="Subscribe to this address in your calendar program to see your bookings there. Keep it private: anyone with it can read your bookings.">
      {feed.data ? (
        <div className="flex flex-wrap items-center gap-2">
          <code className="break-all rounded bg-grey-100 px-2 py-1 text-xs" data-testid="calendar-feed-url">
            {feed.data.url}
          </code>
          <Button size="sm" loading={rotate.isPending} onClick={() => rotate.mutate()}>
            Make a new address (the old one stops working)
          </Button>
        </div>
      ) : (
        <LoadingLine label="Loading" />
      )}
    </Card>
  );
}
