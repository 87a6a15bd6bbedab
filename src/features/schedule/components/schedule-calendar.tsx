/**
 * The Schedule: FullCalendar week/day time grids and a month grid over the bookings of the
 * visible range. Selecting a free range opens the booking form; the bookings the server says you
 * may move (your own that have not started; any, for the manager) can be dragged or resized
 * (the server re-checks everything and a refusal puts the block back). Every block says its state in words. The grid runs on the facility's clock (the
 * luxon plugin gives FullCalendar named zones), so someone abroad sees and selects the same local
 * hours the instruments are bookable; the route passes the zone and the instruments in.
 *
 * The grid is the client's heaviest code (schedule-grid.tsx, a chunk of its own). The Schedule
 * first paints its filters, the legend and the opening week's bookings as a plain list (the data
 * the route's loader fetched), then loads the grid and swaps it in for the list.
 *
 * Without a mouse: "Book a slot" opens the same booking form with the next half hour filled in,
 * and every block is a button (Enter or Space) named by its state, instruments, time and person,
 * which opens its details. The toolbar and the blocks are Phasebook's own (schedule-toolbar.tsx,
 * schedule-calendar.css), not the library's defaults.
 */
import { lazy, Suspense, useDeferredValue, useEffect, useMemo, useRef, useState } from "react";
import { Link } from "react-router-dom";
import type { CalendarApi, DatesSetArg, EventChangeArg, EventInput } from "@fullcalendar/core";
import { BOOKING_STATUS_LABELS, type BookingListItem } from "@shared/schemas/bookings";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_KINDS, type InstrumentDto, type InstrumentKind } from "@shared/schemas/instruments";
import { zoneShortName } from "@shared/domain/facility-time";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { formatSpan } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/input";
import { Dialog } from "@/components/ui/dialog";
import { useBookings } from "../api/get-bookings";
import { useMoveBooking } from "../api/booking-actions";
import { useSetups } from "../api/get-schedule-data";
import { openingWeek, scheduleQuery, windowOfView, type ScheduleWindow } from "../api/schedule-window";
import { StatusBadge, StatusLegend } from "./booking-status";
import { ScheduleToolbar, type ScheduleView } from "./schedule-toolbar";
import "./schedule-calendar.css";

/** Narrower than Tailwind's `sm` breakpoint (40rem): a phone held upright. */
const PHONE_WIDTH = "(max-width: 39.99rem)";

const ScheduleGrid = lazy(() => import("./schedule-grid").then((m) => ({ default: m.ScheduleGrid })));
// The booking form (and its form library) comes when booking is near: with the grid at a desk,
// when "Book a slot" is pointed at or focused, or at the latest when a slot is chosen. The dialog
// opens once the form is there, so it opens with the form's first field focused.
const loadBookingForm = () => import("./booking-form");
type BookingFormComponent = Awaited<ReturnType<typeof loadBookingForm>>["BookingForm"];

const HALF_HOUR = 30 * 60_000;

function eventFor(b: BookingListItem, names: Map<number, string>): EventInput {
  const what = b.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ");
  const state = BOOKING_STATUS_LABELS[b.status];
  // Draggable only where the server's booking policy lets this person move it.
  const editable = !b.busy && b.abilities.move;
  return {
    id: String(b.id),
    start: b.start,
    end: b.end,
    title: b.busy ? `Busy · ${what}` : `${state} · ${what}${b.mine ? "" : ` · ${b.userName}`}`,
    classNames: [`booking-${b.busy ? "busy" : b.status}`],
    editable,
    extendedProps: { booking: b },
  };
}

/** One booking of the week list: a component of its own, so React can pause between bookings. */
function WeekItem({ event: e, zone }: { event: EventInput; zone: string }) {
  return (
    <li className={`pb-week-item ${(e.classNames as string[]).join(" ")}`}>
      <span className="font-mono text-xs">{formatSpan(String(e.start), String(e.end), zone)}</span> {e.title}
    </li>
  );
}

/**
 * What the Schedule shows until its grid has arrived: the shown week's bookings as a list, each
 * with its state, instruments, person and time, in the order they start.
 */
function WeekList({ events, zone, loading, onShowGrid }: { events: EventInput[]; zone: string; loading: boolean; onShowGrid?: () => void }) {
  const blocks = [...events].sort((a, b) => String(a.start).localeCompare(String(b.start)));
  return (
    <div className="flex min-h-96 flex-col gap-2 p-1" data-testid="schedule-week-list">
      {loading ? (
        <p className="text-xs text-grey-600">Loading the bookings…</p>
      ) : onShowGrid ? (
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="text-xs text-grey-600">{blocks.length > 0 ? "This week's bookings." : "No bookings this week."} “Book a slot” books without the calendar.</p>
          <Button onClick={onShowGrid} data-testid="show-grid">
            Show the calendar
          </Button>
        </div>
      ) : (
        <p className="text-xs text-grey-600">Loading the calendar…</p>
      )}
      {blocks.length > 0 && (
        <ul className="flex flex-col gap-1" aria-label="Bookings shown">
          {blocks.map((e) => (
            <WeekItem key={e.id} event={e} zone={zone} />
          ))}
        </ul>
      )}
    </div>
  );
}

/** The next half hour and an hour on: what "Book a slot" proposes; the form lets the person change both. */
function nextSlot(now = Date.now()): { start: Date; end: Date } {
  const start = Math.ceil(now / HALF_HOUR) * HALF_HOUR;
  return { start: new Date(start), end: new Date(start + 2 * HALF_HOUR) };
}

function BookingDetails({ booking, names, zone }: { booking: BookingListItem; names: Map<number, string>; zone: string }) {
  const what = booking.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ");
  return (
    <dl className="grid grid-cols-[7rem_1fr] gap-x-3 gap-y-1.5 text-sm" data-testid="booking-details">
      <dt className="text-grey-600">State</dt>
      <dd>
        <StatusBadge status={booking.status} />
      </dd>
      <dt className="text-grey-600">Instruments</dt>
      <dd>{what}</dd>
      <dt className="text-grey-600">Time</dt>
      <dd>{formatSpan(booking.start, booking.end, zone)}</dd>
      {booking.busy ? (
        <>
          <dt className="text-grey-600">Booked by</dt>
          <dd>Someone else (the Schedule shows only that the time is taken)</dd>
        </>
      ) : (
        <>
          <dt className="text-grey-600">Booked by</dt>
          <dd>{booking.userName}</dd>
          <dt className="text-grey-600">Account</dt>
          <dd>{booking.accountCode}</dd>
          {booking.purpose && (
            <>
              <dt className="text-grey-600">Purpose</dt>
              <dd>{booking.purpose}</dd>
            </>
          )}
        </>
      )}
    </dl>
  );
}

export function ScheduleCalendar({ instruments: all, zone }: { instruments: InstrumentDto[]; zone: string }) {
  const setups = useSetups();
  const move = useMoveBooking();
  const calendar = useRef<CalendarApi | null>(null);
  // The opening week until the grid says what it shows: the same query the route's loader sent.
  const [range, setRange] = useState<ScheduleWindow>(() => openingWeek(zone));
  const [gridWanted, setGridWanted] = useState(false);
  const [phone] = useState(() => window.matchMedia?.(PHONE_WIDTH).matches ?? false);
  const [title, setTitle] = useState("");
  const [view, setView] = useState<ScheduleView>("timeGridWeek");
  const [opened, setOpened] = useState<BookingListItem | null>(null);
  const [instrumentId, setInstrumentId] = useState("");
  const [kind, setKind] = useState<"" | InstrumentKind>("");
  const [setupId, setSetupId] = useState("");
  const [selection, setSelection] = useState<{ start: Date; end: Date } | null>(null);
  const [BookingForm, setBookingForm] = useState<BookingFormComponent | null>(null);
  const book = (range: { start: Date; end: Date }) =>
    void loadBookingForm().then((m) => {
      setBookingForm(() => m.BookingForm);
      setSelection(range);
    });
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

  const bookings = useBookings(
    scheduleQuery(range, instrumentId ? Number(instrumentId) : undefined),
  );
  const api = () => calendar.current;

  // The grid's code is asked for once the list has been painted (a frame, then a task), so the
  // page's first paint never waits for the grid's code or its first layout. On a phone-width
  // screen the list stays until the person asks for the grid: seven day columns are cramped
  // there, the list reads better, "Book a slot" books without the grid, and the phone is spared
  // the grid's code and layout, the heaviest work of any screen.
  useEffect(() => {
    if (phone) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(
      () =>
        (timer = setTimeout(() => {
          setGridWanted(true);
          void loadBookingForm();
        })),
    );
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
    };
  }, [phone]);

  const onDates = (arg: DatesSetArg) => {
    const shown = windowOfView(arg.view);
    setRange((now) => (now.from === shown.from && now.to === shown.to ? now : shown));
    setTitle(arg.view.title);
    setView(arg.view.type as ScheduleView);
  };

  const events = useMemo(
    () => (bookings.data?.items ?? []).filter((b) => b.instrumentIds.some((id) => visibleIds.has(id))).map((b) => eventFor(b, names)),
    [bookings.data, visibleIds, names],
  );

  // The list renders a new week's answer as a transition, in slices (the grid takes it at once).
  const week = useDeferredValue(useMemo(() => ({ events, loading: bookings.isPending }), [events, bookings.isPending]));
  const list = <WeekList events={week.events} zone={zone} loading={week.loading} onShowGrid={phone ? () => setGridWanted(true) : undefined} />;

  const preselected = instrumentId ? [Number(instrumentId)] : setup ? setup.instrumentIds : [];

  const onSelect = (range: { start: Date; end: Date }) => {
    setNotice(null);
    book(range);
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
      <div className="flex flex-wrap items-center justify-between gap-2">
        <StatusLegend />
        <Button
          variant="primary"
          data-testid="book-slot"
          onPointerEnter={() => void loadBookingForm()}
          onFocus={() => void loadBookingForm()}
          onClick={() => {
            setNotice(null);
            book(nextSlot());
          }}
        >
          Book a slot
        </Button>
      </div>
      {notice && <Alert tone={notice.tone}>{notice.text}</Alert>}
      {bookings.isError && <Alert tone="danger">{describeError(bookings.error)}</Alert>}
      <div className="pb-calendar flex flex-col gap-2 rounded-lg border border-grey-200 bg-white p-2 text-sm" data-testid="schedule-calendar" aria-busy={bookings.isFetching || undefined}>
        {title && (
          <ScheduleToolbar
            title={title}
            view={view}
            onPrev={() => api()?.prev()}
            onToday={() => api()?.today()}
            onNext={() => api()?.next()}
            onView={(v) => api()?.changeView(v)}
          />
        )}
        {gridWanted ? (
          <Suspense fallback={list}>
            <ScheduleGrid apiRef={calendar} zone={zone} events={events} onDates={onDates} onOpen={setOpened} onSelect={onSelect} onChange={onChange} />
          </Suspense>
        ) : (
          list
        )}
      </div>
      <Dialog open={opened !== null} onClose={() => setOpened(null)} title="Booking">
        {opened && (
          <>
            <BookingDetails booking={opened} names={names} zone={zone} />
            <div className="flex justify-end gap-2">
              {opened.mine && (
                <Link to={paths.myBookings.getHref()} className="self-center text-sm">
                  Check in, out or cancel in My bookings
                </Link>
              )}
              <Button onClick={() => setOpened(null)} autoFocus>
                Close
              </Button>
            </div>
          </>
        )}
      </Dialog>
      <Dialog open={selection !== null && BookingForm !== null} onClose={() => setSelection(null)} title="Book this slot" className="w-[min(40rem,calc(100vw-2rem))]">
        {selection && BookingForm && (
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
