/**
 * Times shown on the facility's clock with Intl alone (shared/domain/zone-labels.ts, and the
 * client's formatters in src/lib/format.ts) read the same as luxon's, the date library the
 * forms and the server use, around daylight-saving changes and in zones whose changes are not on
 * the hour. Halifax: clocks go back from 02:00 ADT to 01:00 AST on Sunday 1 November 2026 and
 * forward from 02:00 AST to 03:00 ADT on Sunday 8 March 2026 (IANA tz database).
 */
import { describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import { formatInZone, zoneShortName } from "@shared/domain/zone-labels";
import { formatDate, formatDateTime, formatSpan } from "@/lib/format";

const ZONES = ["America/Halifax", "Europe/London", "America/St_Johns", "Australia/Lord_Howe", "Asia/Kathmandu"];
const OPTIONS: Intl.DateTimeFormatOptions[] = [
  { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" },
  { hour: "2-digit", minute: "2-digit" },
  { day: "numeric", month: "short", year: "numeric" },
];
// Every 20 minutes through both of Halifax's 2026 changes and a day either side.
const INSTANTS = [Date.UTC(2026, 2, 7, 0), Date.UTC(2026, 9, 31, 0)].flatMap((from) => Array.from({ length: 3 * 72 }, (_, i) => from + i * 20 * 60_000));

describe("times on a zone's clock with Intl alone", () => {
  it("read as luxon writes them, for every format the screens use", () => {
    for (const zone of ZONES)
      for (const at of INSTANTS)
        for (const options of OPTIONS) expect(formatInZone(at, zone, options), `${zone} ${new Date(at).toISOString()}`).toBe(DateTime.fromMillis(at, { zone }).toLocaleString(options));
  });

  it("name the zone's offset as luxon does (AST / ADT in Halifax)", () => {
    for (const zone of ZONES)
      for (const at of INSTANTS) expect(zoneShortName(at, zone), `${zone} ${new Date(at).toISOString()}`).toBe(DateTime.fromMillis(at, { zone }).setLocale("en-US").offsetNameShort);
    expect(zoneShortName(Date.UTC(2026, 11, 10, 14), "America/Halifax")).toBe("AST");
    expect(zoneShortName(Date.UTC(2026, 6, 9, 13), "America/Halifax")).toBe("ADT");
    expect(zoneShortName(0, "Not/AZone")).toBe("Not/AZone");
  });

  it("put a span crossing the facility's midnight on two dates, and one inside a day on one", () => {
    const zone = "America/Halifax";
    // 23:00–01:00 AST on 9–10 December: two dates on the facility's clock, whatever the device's zone.
    const across = formatSpan("2026-12-10T03:00:00Z", "2026-12-10T05:00:00Z", zone);
    expect(across).toBe(`${DateTime.fromISO("2026-12-10T03:00:00Z", { zone }).toLocaleString(OPTIONS[0])} – ${DateTime.fromISO("2026-12-10T05:00:00Z", { zone }).toLocaleString(OPTIONS[0])} AST`);
    const inside = formatSpan("2026-12-10T14:00:00Z", "2026-12-10T16:30:00Z", zone);
    expect(inside).toBe(`${DateTime.fromISO("2026-12-10T14:00:00Z", { zone }).toLocaleString(OPTIONS[0])} – ${DateTime.fromISO("2026-12-10T16:30:00Z", { zone }).toLocaleString(OPTIONS[1])} AST`);
    expect(formatDateTime("2026-07-09T13:00:00Z", zone)).toMatch(/ ADT$/);
    // An expiry at 23:59 local stays on its own day on the facility's clock.
    expect(formatDate("2026-12-11T03:59:00Z", zone)).toBe(DateTime.fromISO("2026-12-11T03:59:00Z", { zone }).toLocaleString(OPTIONS[2]));
    expect(formatDateTime("not a time", zone)).toBe("not a time");
  });
});
