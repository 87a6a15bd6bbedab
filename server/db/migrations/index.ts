// Every migration in order. Migrations are never edited after they land: add a new one
// (npm run db:migration -- <name>) and list it here.
import { InitialSchema1796173192009 } from "./1796173192009-initial-schema";
import { BookingsAndUsages1796173432958 } from "./1796173432958-bookings-and-usages";
import { ScheduleSetupsAndTrainingRequests1796173773439 } from "./1796173773439-schedule-setups-and-training-requests";
import { LabelsAndStocks1796173796292 } from "./1796173796292-labels-and-stocks";
import { StockroomAndSafety1796173804700 } from "./1796173804700-stockroom-and-safety";
import { Recharge1796174960945 } from "./1796174960945-recharge";
import { BookingInstrumentTimes1796183167192 } from "./1796183167192-booking-instrument-times";
import { RecordOwnersAndFaults1796231102622 } from "./1796231102622-record-owners-and-faults";
import { StorageLimitsByClass1796233973566 } from "./1796233973566-storage-limits-by-class";
import { UsageExactCost1796235000000 } from "./1796235000000-usage-exact-cost";
import { ChargeLineExactFigures1796238557056 } from "./1796238557056-charge-line-exact-figures";
import { RunPlansAndReservations1796239193256 } from "./1796239193256-run-plans-and-reservations";
import { TextSearch1796239235279 } from "./1796239235279-text-search";

export const migrations = [
  InitialSchema1796173192009,
  BookingsAndUsages1796173432958,
  ScheduleSetupsAndTrainingRequests1796173773439,
  LabelsAndStocks1796173796292,
  StockroomAndSafety1796173804700,
  Recharge1796174960945,
  BookingInstrumentTimes1796183167192,
  RecordOwnersAndFaults1796231102622,
  StorageLimitsByClass1796233973566,
  UsageExactCost1796235000000,
  ChargeLineExactFigures1796238557056,
  RunPlansAndReservations1796239193256,
  TextSearch1796239235279,
];
