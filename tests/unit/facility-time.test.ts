/**
 * Wall-clock times on the facility's clock. Offsets and change-over dates for America/Halifax
 * are those of the IANA time zone database (file "northamerica": Atlantic time, UTC−4, with
 * daylight time UTC−3 from the second Sunday in March at 02:00 to the first Sunday in November
 * at 02:00, the rule Canada shares with the United States since 2007).
 */
import { describe, expect, it } from "vitest";
import { toZonedInput, zoneShortName, zonedInputToIso } from "@shared/domain/facility-time";

const HALIFAX = "America/Halifax";

describe("zonedInputToIso", () => {
  it("reads a winter wall-clock time in Halifax with the UTC−4 offset (IANA tz database)", () => {
    expect(zonedInputToIso("2026-12-10T10:00", HALIFAX)).toBe("2026-12-10T10:00:00-04:00");
  });

  it("reads a summer wall-clock time in Halifax with the UTC−3 daylight offset (IANA tz database)", () => {
    expect(zonedInputToIso("2026-07-09T10:00", HALIFAX)).toBe("2026-07-09T10:00:00-03:00");
  });

  it("gives the same wall-clock hour a different instant either side of the November change-over", () => {
    const before = new Date(zonedInputToIso("2026-10-26T10:00", HALIFAX)!).getTime();
    const after = new Date(zonedInputToIso("2026-11-02T10:00", HALIFAX)!).getTime();
    // One week of 24-hour days plus the hour given back on 1 November 2026.
    expect(after - before).toBe((7 * 24 + 1) * 3_600_000);
  });

  it("moves a time inside the spring-forward gap (02:30 on 8 March 2026 does not exist in Halifax) an hour ahead", () => {
    expect(zonedInputToIso("2026-03-08T02:30", HALIFAX)).toBe("2026-03-08T03:30:00-03:00");
  });

  it("answers null for text that is not a wall-clock time", () => {
    expect(zonedInputToIso("", HALIFAX)).toBeNull();
    expect(zonedInputToIso("2026-12-10 10:00", HALIFAX)).toBeNull();
    expect(zonedInputToIso("2026-13-10T10:00", HALIFAX)).toBeNull();
  });
});

describe("toZonedInput", () => {
  it("shows an instant on the facility's clock, not the computer's", () => {
    const instant = new Date("2026-12-10T14:00:00Z");
    expect(toZonedInput(instant, HALIFAX)).toBe("2026-12-10T10:00");
    expect(toZonedInput(instant, "Europe/Berlin")).toBe("2026-12-10T15:00");
  });

  it("round-trips with zonedInputToIso through a daylight-saving date", () => {
    const iso = zonedInputToIso("2026-11-01T09:30", HALIFAX)!;
    expect(toZonedInput(new Date(iso), HALIFAX)).toBe("2026-11-01T09:30");
  });
});

describe("zoneShortName", () => {
  it("names Halifax's standard and daylight time as AST and ADT (CLDR English names)", () => {
    expect(zoneShortName(new Date("2026-12-10T14:00:00Z"), HALIFAX)).toBe("AST");
    expect(zoneShortName(new Date("2026-07-09T13:00:00Z"), HALIFAX)).toBe("ADT");
  });
});
