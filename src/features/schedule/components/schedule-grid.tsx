/**
 * The Schedule's grid: FullCalendar's week and day time grids and its month grid, on the
 * facility's clock (the luxon plugin gives FullCalendar named zones). It is the heaviest code of
 * the client, so it is a chunk of its own: the Schedule (schedule-calendar.tsx) paints its
 * filters and the week's bookings as a list first, then swaps this grid in. The grid says what
 * happens (dates shown, a block opened, a range selected, a block moved) and the Schedule decides.
 *
 * Every block is a button (Enter or Space opens it) named by its content: its state,
 * instruments, person and, for screen readers, the full date and time.
 */
import { useCallback, useMemo, useRef, type RefObject } from "react";
import FullCalendar from "@fullcalendar/react";
import timeGridPlugin from "@fullcalendar/timegrid";
import dayGridPlugin from "@fullcalendar/daygrid";
import interactionPlugin from "@fullcalendar/interaction";
import luxonPlugin from "@fullcalendar/luxon3";
import type { CalendarApi, DateSelectArg, DatesSetArg, EventChangeArg, EventClickArg, EventContentArg, EventInput, EventMountArg } from "@fullcalendar/core";
import type { BookingListItem } from "@shared/schemas/bookings";
import { formatSpan } from "@/lib/format";

function element(tag: string, className: string, text?: string): HTMLElement {
  const node = document.createElement(tag);
  node.className = className;
  if (text !== undefined) node.textContent = text;
  return node;
}

/**
 * A block's content: its time and title as the library shows them, then (for screen readers)
 * the full date and time, so its name says the state, instruments, person and when. Built as
 * plain elements the calendar inserts itself: a React tree per block would cost a render of its
 * own for every block of the week.
 */
function blockContent(arg: EventContentArg, zone: string) {
  // The range being selected is drawn as a block too (the "mirror"), with no booking behind it.
  const b = arg.event.extendedProps.booking as BookingListItem | undefined;
  const frame = element("div", "fc-event-main-frame");
  if (arg.timeText) frame.append(element("div", "fc-event-time", arg.timeText));
  const title = element("div", "fc-event-title-container");
  title.append(element("div", "fc-event-title fc-sticky", arg.event.title));
  frame.append(title);
  if (b) frame.append(element("span", "sr-only", `, ${formatSpan(b.start, b.end, zone)}`));
  return { domNodes: [frame] };
}

// The library draws a block as an <a> without href; as a button (Enter or Space opens it) it is reachable and named by its content.
const onMount = (arg: EventMountArg) => {
  if (arg.event.extendedProps.booking) arg.el.setAttribute("role", "button");
};

// Options the calendar compares by identity: a new object or function on every render of the
// Schedule would make it rebuild its options and draw the whole grid again.
const PLUGINS = [timeGridPlugin, dayGridPlugin, interactionPlugin, luxonPlugin];
const TIME_FORMAT = { hour: "2-digit", minute: "2-digit", hour12: false } as const;

export interface ScheduleGridProps {
  /** Set to the calendar's API while the grid is mounted, for the Schedule's own toolbar. */
  apiRef: RefObject<CalendarApi | null>;
  zone: string;
  events: EventInput[];
  onDates: (arg: DatesSetArg) => void;
  onOpen: (booking: BookingListItem) => void;
  onSelect: (range: { start: Date; end: Date }) => void;
  onChange: (arg: EventChangeArg) => void;
}

export function ScheduleGrid({ apiRef, zone, events, ...handlers }: ScheduleGridProps) {
  // The Schedule's handlers change on each of its renders; the calendar gets stable ones that call the latest.
  const latest = useRef(handlers);
  latest.current = handlers;
  const on = useMemo(
    () => ({
      dates: (arg: DatesSetArg) => latest.current.onDates(arg),
      click: (arg: EventClickArg) => {
        arg.jsEvent.preventDefault();
        const booking = arg.event.extendedProps.booking as BookingListItem | undefined;
        if (booking) latest.current.onOpen(booking);
      },
      select: (arg: DateSelectArg) => {
        latest.current.onSelect({ start: arg.start, end: arg.end });
        arg.view.calendar.unselect();
      },
      change: (arg: EventChangeArg) => latest.current.onChange(arg),
    }),
    [],
  );
  const content = useCallback((arg: EventContentArg) => blockContent(arg, zone), [zone]);
  const ref = useCallback(
    (calendar: FullCalendar | null) => {
      apiRef.current = calendar?.getApi() ?? null;
    },
    [apiRef],
  );
  return (
    <FullCalendar
      ref={ref}
      plugins={PLUGINS}
      timeZone={zone}
      initialView="timeGridWeek"
      headerToolbar={false}
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
      datesSet={on.dates}
      eventDidMount={onMount}
      eventContent={content}
      eventClick={on.click}
      select={on.select}
      eventChange={on.change}
      eventTimeFormat={TIME_FORMAT}
      slotLabelFormat={TIME_FORMAT}
    />
  );
}
