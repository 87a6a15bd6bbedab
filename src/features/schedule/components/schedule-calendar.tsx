/**
 * The Schedule: FullCalendar week/day time grids and a month grid over the bookings of the
 * visible range. Selecting a free range opens the booking form; the bookings the server says you
 * may move (your own that have not started; any, for the manager) can be dragged or resized
 * (the server re-checks everything and a refusal puts the block back). Every block says its state in words. The grid runs on the facility's clock (the
 * luxon plugin gives FullCalendar named zones), so someone abroad sees and selects the same local
 * hours the instruments are bookable; the route passes the zone and the instruments in.
 */
import { useMemo, useState } from "react";
import FullCalendar from "@fullcalendar/react";
import timeGridPlugin from "@fullcalendar/timegrid";
import dayGridPlugin from "@fullcalendar/daygrid";
import interactionPlugin from "@fullcalendar/interaction";
import luxonPlugin from "@fullcalendar/luxon3";
import type { DateSelectArg, EventChangeArg, EventInput } from "@fullcalendar/core";
import { BOOKING_STATUS_LABELS, type BookingListItem } from "@shared/schemas/bookings";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_KINDS, type InstrumentDto, type InstrumentKind } from "@shared/schemas/instruments";
import { zoneShortName } from "@shared/domain/facility-time";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Select } from "@/components/ui/input";
import { Dialog } from "@/components/ui/dialog";
import { useBookings } from "../api/get-bookings";
import { useMoveBooking } from "../api/booking-actions";
import { useSetups } from "../api/get-schedule-data";
import { BookingForm } from "./booking-form";
import { BLOCK_COLOURS, StatusLegend } from "./booking-status";

const SHOWN = "requested,confirmed,in_progress,completed,no_show";

function eventFor(b: BookingListItem, names: Map<number, string>): EventInput {
  const colours = BLOCK_COLOURS[b.busy ? "busy" : b.status];
  const what = b.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ");
  const state = BOOKING_STATUS_LABELS[b.status];
  // Draggable only where the server's booking policy lets this person move it.
  const editable = !b.busy && b.abilities.move;
  return {
    id: String(b.id),
    start: b.start,
    end: b.end,
    title: b.busy ? `Busy · ${what}` : `${state} · ${what}${b.mine ? "" : ` · ${b.userName}`}`,
    backgroundColor: colours.bg,
    borderColor: colours.border,
    textColor: colours.text,
    classNames: [`booking-${b.busy ? "busy" : b.status}`, ...(b.status === "requested" ? ["booking-requested"] : [])],
    editable,
    extendedProps: { booking: b },
  };
}

export function ScheduleCalendar({ instruments: all, zone }: { instruments: InstrumentDto[]; zone: string }) {
  const setups = useSetups();
  const move = useMoveBooking();
  const [range, setRange] = useState<{ from: string; to: string } | null>(null);
  const [instrumentId, setInstrumentId] = useState("");
  const [kind, setKind] = useState<"" | InstrumentKind>("");
  const [setupId, setSetupId] = useState("");
  const [selection, setSelection] = useState<{ start: Date; end: Date } | null>(null);
  const [notice, setNotice] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);

  const names = useMemo(() => new Map(all.map((i) => [i.id, i.name])), [all]);
  const setup = (setups.data ?? []).find((s) => String(s.id) === setupId);
  const visibleIds = useMemo(() => {
    let list: InstrumentDto[] = all;
    if (kind) list = list.filter((i) => i.kind === kind);
    if (setup) list = list.filter((i) => setup.instrumentIds.includes(i.id));
    if (instrumentId) list = list.filter((i) => String(i.id) === instrumentId);
    return new Set(list.map((i) => i.id));
  }, [all, kind, setup, instrumentId]);

  const bookings = useBookings({ from: range?.from, to: range?.to, instrumentId: instrumentId ? Number(instrumentId) : undefined, status: SHOWN }, range !== null);
  const events = useMemo(
    () => (bookings.data?.items ?? []).filter((b) => b.instrumentIds.some((id) => visibleIds.has(id))).map((b) => eventFor(b, names)),
    [bookings.data, visibleIds, names],
  );

  const preselected = instrumentId ? [Number(instrumentId)] : setup ? setup.instrumentIds : [];

  const onSelect = (arg: DateSelectArg) => {
    setNotice(null);
    setSelection({ start: arg.start, end: arg.end });
    arg.view.calendar.unselect();
  };

  const onChange = async (arg: EventChangeArg) => {
    const id = Number(arg.event.id);
    try {
      await move.mutateAsync({ id, start: arg.event.start!.toISOString(), end: arg.event.end!.toISOString() });
      setNotice({ tone: "ok", text: "Booking moved." });
    } catch (e) {
      arg.revert();
      setNotice({ tone: "danger", text: `Not moved: ${describeError(e)}` });
    }
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-3" role="group" aria-label="Filter the Schedule">
        <Select label="Instrument" value={instrumentId} onChange={(e) => setInstrumentId(e.target.value)} data-testid="filter-instrument">
          <option value="">All instruments</option>
          {all.map((i) => (
            <option key={i.id} value={i.id}>
              {i.name}
              {i.status !== "in_service" ? ` (${i.status.replace("_", " ")})` : ""}
            </option>
          ))}
        </Select>
        <Select label="Kind" value={kind} onChange={(e) => setKind(e.target.value as InstrumentKind | "")} data-testid="filter-kind">
          <option value="">All kinds</option>
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {INSTRUMENT_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
        <Select label="Setup" value={setupId} onChange={(e) => setSetupId(e.target.value)} data-testid="filter-setup">
          <option value="">Any setup</option>
          {(setups.data ?? []).map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </Select>
      </div>
      <p className="text-xs text-grey-600" data-testid="schedule-zone">
        Times are the facility's local time ({zone.replace(/_/g, " ")}, {zoneShortName(Date.now(), zone)}), whatever your own device's time zone.
      </p>
      <StatusLegend />
      {notice && <Alert tone={notice.tone}>{notice.text}</Alert>}
      {bookings.isError && <Alert tone="danger">{describeError(bookings.error)}</Alert>}
      <div className="rounded-lg border border-grey-200 bg-white p-2 text-sm" data-testid="schedule-calendar" aria-busy={bookings.isFetching || undefined}>
        <FullCalendar
          plugins={[timeGridPlugin, dayGridPlugin, interactionPlugin, luxonPlugin]}
          timeZone={zone}
          initialView="timeGridWeek"
          headerToolbar={{ left: "prev,next today", center: "title", right: "timeGridDay,timeGridWeek,dayGridMonth" }}
          buttonText={{ today: "Today", day: "Day", week: "Week", month: "Month" }}
          firstDay={1}
          allDaySlot={false}
          slotMinTime="06:00:00"
          slotMaxTime="22:00:00"
          slotDuration="00:30:00"
          scrollTime="08:00:00"
          height="auto"
          nowIndicator
          selectable
          selectMirror
          events={events}
          datesSet={(arg) => setRange({ from: arg.start.toISOString(), to: arg.end.toISOString() })}
          select={onSelect}
          eventChange={onChange}
          eventTimeFormat={{ hour: "2-digit", minute: "2-digit", hour12: false }}
          slotLabelFormat={{ hour: "2-digit", minute: "2-digit", hour12: false }}
        />
      </div>
      <Dialog open={selection !== null} onClose={() => setSelection(null)} title="Book this slot" className="w-[min(40rem,calc(100vw-2rem))]">
        {selection && (
          <BookingForm
            start={selection.start}
            end={selection.end}
            instruments={all}
            zone={zone}
            preselected={preselected}
            onCancel={() => setSelection(null)}
            onDone={(text) => {
              setSelection(null);
              setNotice({ tone: "ok", text });
            }}
          />
        )}
      </Dialog>
    </div>
  );
}
