/** Loaders of the Schedule's and the instruments' screens (see load.ts). */
import { facilityQueryOptions } from "@/lib/facility";
import { instrumentsQueryOptions } from "@/features/instruments/api/get-instruments";
import { instrumentQueryOptions } from "@/features/instruments/api/instrument";
import { bookingsQueryOptions } from "@/features/schedule/api/get-bookings";
import { setupsQueryOptions } from "@/features/schedule/api/get-schedule-data";
import { bookingSettingsQueryOptions } from "@/features/schedule/api/booking-settings";
import { openingWeek, scheduleQuery } from "@/features/schedule/api/schedule-window";
import { trainablePeopleQueryOptions, trainingRecordsQueryOptions, trainingRequestsQueryOptions } from "@/features/training/api/training";
import { idParam, type ScreenLoader } from "./load";

/** Every Schedule screen needs the facility's clock and the instruments (app/use-schedule-context.ts). */
const scheduleContext: ScreenLoader = (qc) => [qc.prefetchQuery(facilityQueryOptions()), qc.prefetchQuery(instrumentsQueryOptions({ limit: 500 }))];

/** The calendar's opening week, all instruments: its first fetch once it knows the facility's zone. */
export const schedule: ScreenLoader = (qc, args, user) => [
  ...(scheduleContext(qc, args, user) ?? []),
  qc.prefetchQuery(setupsQueryOptions()),
  qc
    .ensureQueryData(facilityQueryOptions())
    .then((facility) => qc.prefetchQuery(bookingsQueryOptions(scheduleQuery(openingWeek(facility.timeZone)))))
    .catch(() => undefined),
];

export const myBookings: ScreenLoader = (qc, args, user) => [...(scheduleContext(qc, args, user) ?? []), qc.prefetchQuery(bookingSettingsQueryOptions())];

export const approvals: ScreenLoader = scheduleContext;

export const scheduleSettings: ScreenLoader = (qc) => [
  qc.prefetchQuery(bookingSettingsQueryOptions()),
  qc.prefetchQuery(setupsQueryOptions()),
  qc.prefetchQuery(instrumentsQueryOptions({ limit: 500 })),
];

export const instruments: ScreenLoader = (qc) => [qc.prefetchQuery(instrumentsQueryOptions({ limit: 500 }))];

export const instrument: ScreenLoader = (qc, args) => {
  const id = idParam(args);
  if (id === null) return;
  return [qc.prefetchQuery(instrumentQueryOptions(id)), qc.prefetchQuery(trainingRecordsQueryOptions({ instrumentId: id })), qc.prefetchQuery(facilityQueryOptions())];
};

export const training: ScreenLoader = (qc) => [
  qc.prefetchQuery(instrumentsQueryOptions({ limit: 500 })),
  qc.prefetchQuery(trainablePeopleQueryOptions()),
  qc.prefetchQuery(trainingRecordsQueryOptions({ expiringWithinDays: 30 })),
  qc.prefetchQuery(trainingRecordsQueryOptions({ includeRevoked: true })),
  qc.prefetchQuery(trainingRequestsQueryOptions("open")),
];
