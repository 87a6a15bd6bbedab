/**
 * The Schedule's public entry: what other areas (Scan, Recharge, the start page) and the job
 * scheduler may use. Nothing else of this folder is imported from outside it.
 */
export { scheduleTable } from "./routes";
export { instrumentPolicy, statusAction, type InstrumentFacts, type InstrumentAction } from "./instrument.policy";
export { reportInstrumentFault, recordCleaned, closeInstrumentFault } from "./instrument-fault.commands";
export { openFaults, type FaultRow } from "./instrument.queries";
export { bookingPolicy, seesInFull, type BookingFacts, type BookingCase, type BookingPolicyAction } from "./booking.policy";
export { readBookingSettings, isLateCancel } from "./booking-settings";
export { MAX_BOOKING_MS } from "./booking.queries";
export { markNoShows, sendBookingReminders, sendTrainingExpiryNotices } from "./booking.jobs";
