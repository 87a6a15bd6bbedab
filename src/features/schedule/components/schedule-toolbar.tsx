/**
 * The Schedule's own toolbar, in Phasebook's controls and words instead of the calendar
 * library's: previous, today and next (named after the shown span: "Previous week"), the span's
 * title, announced when it changes, and the Day / Week / Month switch as pressed buttons.
 */
import { Button } from "@/components/ui/button";
import { cn } from "@/lib/cn";

export type ScheduleView = "timeGridDay" | "timeGridWeek" | "dayGridMonth";

const VIEWS: { view: ScheduleView; label: string; span: string }[] = [
  { view: "timeGridDay", label: "Day", span: "day" },
  { view: "timeGridWeek", label: "Week", span: "week" },
  { view: "dayGridMonth", label: "Month", span: "month" },
];

interface ScheduleToolbarProps {
  title: string;
  view: ScheduleView;
  onPrev: () => void;
  onToday: () => void;
  onNext: () => void;
  onView: (view: ScheduleView) => void;
}

function Arrow({ back }: { back?: boolean }) {
  return (
    <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.8" aria-hidden="true">
      <path d={back ? "M10 3.5 5.5 8l4.5 4.5" : "M6 3.5 10.5 8 6 12.5"} />
    </svg>
  );
}

export function ScheduleToolbar({ title, view, onPrev, onToday, onNext, onView }: ScheduleToolbarProps) {
  const span = VIEWS.find((v) => v.view === view)?.span ?? "week";
  return (
    <div className="flex flex-wrap items-center justify-between gap-2" data-testid="schedule-toolbar">
      <div className="flex items-center gap-1">
        <Button size="sm" onClick={onPrev} aria-label={`Previous ${span}`} data-testid="schedule-prev">
          <Arrow back />
        </Button>
        <Button size="sm" onClick={onToday} data-testid="schedule-today">
          Today
        </Button>
        <Button size="sm" onClick={onNext} aria-label={`Next ${span}`} data-testid="schedule-next">
          <Arrow />
        </Button>
      </div>
      <h2 className="order-first w-full text-base font-semibold text-grey-900 sm:order-none sm:w-auto" aria-live="polite" data-testid="schedule-title">
        {title}
      </h2>
      <div className="inline-flex rounded-md border border-grey-300 bg-white p-0.5" role="group" aria-label="Show">
        {VIEWS.map((v) => (
          <button
            key={v.view}
            type="button"
            aria-pressed={view === v.view}
            onClick={() => onView(v.view)}
            data-testid={`schedule-view-${v.span}`}
            className={cn(
              "h-6 rounded px-2.5 text-xs font-medium",
              view === v.view ? "bg-aqueous-700 text-white" : "text-grey-700 hover:bg-grey-100",
            )}
          >
            {v.label}
          </button>
        ))}
      </div>
    </div>
  );
}
