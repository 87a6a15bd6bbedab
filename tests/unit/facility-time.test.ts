/**
 * Wall-clock times on the facility's clock. Offsets and change-over dates for America/Halifax
 * are those of the IANA time zone database (file "northamerica": Atlantic time, UTC−4, with
 * daylight time UTC−3 from the second Sunday in March at 02:00 to the first Sunday in November
 * at 02:00, the rule Canada shares with the United States since 2007).
 */
import { afterEach, describe, expect, it, vi } from "vitest";
import { DateTime } from "luxon";
import { checkZonedIso, resolveWallClock, toZonedInput, zoneShortName, zonedInputToIso } from "@shared/domain/facility-time";

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

  it("takes the earlier reading of the repeated hour (01:30 ADT on 1 November 2026), whatever today's date", () => {
    for (const today of ["2026-07-15T12:00:00Z", "2026-12-15T12:00:00Z"]) {
      vi.useFakeTimers();
      vi.setSystemTime(new Date(today));
      expect(zonedInputToIso("2026-11-01T01:30", HALIFAX), today).toBe("2026-11-01T01:30:00-03:00");
      vi.useRealTimers();
    }
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

/**
 * Halifax, IANA tz database: clocks go back from 02:00 ADT (UTC−3) to 01:00 AST (UTC−4) on
 * Sunday 1 November 2026, so 01:00–01:59 happens twice; they go forward from 02:00 AST to
 * 03:00 ADT on Sunday 8 March 2026, so 02:00–02:59 does not exist. Abbreviations are CLDR's
 * English names. Europe/Berlin (EU rule: last Sunday of October and of March, at 01:00 UTC)
 * checks a zone east of Greenwich; Australia/Lord_Howe (a half-hour daylight shift, back on the
 * first Sunday in April at 02:00 local) checks a change that is not a whole hour (from memory).
 */
describe("resolveWallClock", () => {
  afterEach(() => {
    vi.useRealTimers();
  });

  const SEASONS = ["2026-07-15T12:00:00Z", "2026-12-15T12:00:00Z"];

  it("offers both instants of the repeated hour, 01:30 ADT then 01:30 AST, an hour apart", () => {
    const r = resolveWallClock("2026-11-01T01:30", HALIFAX);
    expect(r.kind).toBe("ambiguous");
    if (r.kind !== "ambiguous") return;
    expect(r.choices.map((c) => [c.iso, c.offset, c.abbreviation])).toEqual([
      ["2026-11-01T01:30:00-03:00", "-03:00", "ADT"],
      ["2026-11-01T01:30:00-04:00", "-04:00", "AST"],
    ]);
    expect(new Date(r.choices[1].iso).getTime() - new Date(r.choices[0].iso).getTime()).toBe(3_600_000);
    expect(r.choices[0].label).toMatch(/^01:30 ADT/);
    expect(r.choices[1].label).toMatch(/^01:30 AST/);
    expect(r.message).toMatch(/happens twice/);
  });

  it("refuses a time in the skipped hour with a sentence naming the gap", () => {
    const r = resolveWallClock("2026-03-08T02:30", HALIFAX);
    expect(r.kind).toBe("skipped");
    if (r.kind !== "skipped") return;
    expect(r.message).toBe(
      "02:30 does not exist on 8 March 2026 in America/Halifax: clocks go forward from 02:00 to 03:00 that night. Choose a time before 02:00 or from 03:00.",
    );
  });

  it("reads the hours either side of each change-over as one instant", () => {
    expect(resolveWallClock("2026-11-01T00:59", HALIFAX)).toEqual({ kind: "exact", iso: "2026-11-01T00:59:00-03:00" });
    expect(resolveWallClock("2026-11-01T02:00", HALIFAX)).toEqual({ kind: "exact", iso: "2026-11-01T02:00:00-04:00" });
    expect(resolveWallClock("2026-03-08T01:59", HALIFAX)).toEqual({ kind: "exact", iso: "2026-03-08T01:59:00-04:00" });
    expect(resolveWallClock("2026-03-08T03:00", HALIFAX)).toEqual({ kind: "exact", iso: "2026-03-08T03:00:00-03:00" });
    expect(resolveWallClock("2026-07-09T10:00:30", HALIFAX)).toEqual({ kind: "exact", iso: "2026-07-09T10:00:30-03:00" });
  });

  it("gives the same answers with the clock fixed in July and in December", () => {
    const cases = ["2026-11-01T01:30", "2026-11-01T01:00", "2026-03-08T02:30", "2026-07-09T10:00", "2026-12-10T10:00"];
    const answers = SEASONS.map((today) => {
      vi.useFakeTimers();
      vi.setSystemTime(new Date(today));
      const out = cases.map((c) => resolveWallClock(c, HALIFAX));
      vi.useRealTimers();
      return out;
    });
    expect(answers[0]).toEqual(answers[1]);
    expect(answers[0][0].kind).toBe("ambiguous");
  });

  it("(the fixed clock does reach the date library: its own reading of 01:30 changes with the season)", () => {
    // Luxon guesses the offset from "now" first, which is what made the old reading depend on when the page loaded.
    const readings = SEASONS.map((today) => {
      vi.useFakeTimers();
      vi.setSystemTime(new Date(today));
      const iso = DateTime.fromISO("2026-11-01T01:30", { zone: HALIFAX }).toISO();
      vi.useRealTimers();
      return iso;
    });
    expect(readings[0]).not.toBe(readings[1]);
  });

  it("handles a zone east of Greenwich and a half-hour change", () => {
    const berlin = resolveWallClock("2026-10-25T02:30", "Europe/Berlin");
    expect(berlin.kind === "ambiguous" && berlin.choices.map((c) => c.offset)).toEqual(["+02:00", "+01:00"]);
    expect(resolveWallClock("2026-03-29T02:30", "Europe/Berlin").kind).toBe("skipped");
    const lordHowe = resolveWallClock("2026-04-05T01:45", "Australia/Lord_Howe");
    expect(lordHowe.kind === "ambiguous" && lordHowe.choices.map((c) => c.offset)).toEqual(["+11:00", "+10:30"]);
  });

  it("says what is wrong with text that is not a time, a date not on the calendar, or an unknown zone", () => {
    expect(resolveWallClock("2026-12-10 10:00", HALIFAX).kind).toBe("invalid");
    expect(resolveWallClock("2026-02-30T10:00", HALIFAX).kind).toBe("invalid");
    expect(resolveWallClock("2026-12-10T24:00", HALIFAX).kind).toBe("invalid");
    expect(resolveWallClock("2026-12-10T10:00", "Atlantis/Harbour").kind).toBe("invalid");
  });
});

describe("checkZonedIso", () => {
  it("passes a time with the zone's offset at that instant, and UTC", () => {
    expect(checkZonedIso("2026-11-01T01:30:00-03:00", HALIFAX)).toEqual({ ok: true });
    expect(checkZonedIso("2026-11-01T01:30:00-04:00", HALIFAX)).toEqual({ ok: true });
    expect(checkZonedIso("2026-03-08T06:30:00Z", HALIFAX)).toEqual({ ok: true });
  });

  it("refuses a wall-clock time in the skipped hour written with the zone's offset, with the sentence", () => {
    for (const offset of ["-04:00", "-03:00"]) {
      const skipped = checkZonedIso(`2026-03-08T02:30:00${offset}`, HALIFAX);
      expect(skipped).toMatchObject({ ok: false, code: "skipped_time" });
      expect(!skipped.ok && skipped.message).toMatch(/does not exist on 8 March 2026/);
    }
  });

  it("passes the same instant sent from another zone (02:30+01:00 is not a Halifax wall-clock time)", () => {
    expect(checkZonedIso("2026-03-08T02:30:00+01:00", HALIFAX)).toEqual({ ok: true });
  });
});
