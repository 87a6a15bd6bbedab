/**
 * The remembered facility zone (shared/domain/zones.ts) must answer exactly what luxon's own
 * IANA zone answers — the platform's copy of the IANA tz database — at every instant, including
 * around daylight-saving changes and in zones whose changes are not on the hour.
 */
import { describe, expect, it } from "vitest";
import { DateTime, IANAZone } from "luxon";
import { facilityZone, RememberedZone } from "@shared/domain/zones";

// Zones with unusual transitions (IANA tz database, from memory): Halifax and London on the hour,
// St John's at -3:30, Lord Howe's half-hour DST, Kathmandu at +5:45, Chatham at +12:45.
const ZONES = ["America/Halifax", "Europe/London", "America/St_Johns", "Australia/Lord_Howe", "Asia/Kathmandu", "Pacific/Chatham"];

describe("the remembered facility zone", () => {
  for (const name of ZONES) {
    it(`gives luxon's offset for ${name} through 2026 and 2027, minute by minute around each change`, () => {
      const remembered = new RememberedZone(name);
      const plain = IANAZone.create(name);
      const wrong: string[] = [];
      const compare = (ts: number) => {
        // Asking twice: the second answer comes from memory.
        for (let k = 0; k < 2; k++) if (remembered.offset(ts) !== plain.offset(ts)) wrong.push(new Date(ts).toISOString());
      };
      let changes = 0;
      for (let hour = Date.UTC(2026, 0, 1); hour < Date.UTC(2028, 0, 1); hour += 3_600_000) {
        compare(hour + 1_234_567);
        if (plain.offset(hour) !== plain.offset(hour + 3_600_000)) {
          changes++;
          for (let ts = hour; ts <= hour + 3_600_000; ts += 60_000) compare(ts);
        }
      }
      expect(wrong).toEqual([]);
      // Kathmandu keeps +5:45 all year; the others change twice a year (IANA tz database, from memory).
      expect(changes).toBe(name === "Asia/Kathmandu" ? 0 : 4);
    });
  }

  it("gives the same local days, wall-clock times and ISO strings as luxon around a change", () => {
    const zone = facilityZone("America/Halifax");
    // 2026-03-08 02:00 local does not exist (clocks go to 03:00); 2026-11-01 01:00–02:00 happens twice (from memory).
    for (const iso of ["2026-03-08T05:59:59Z", "2026-03-08T06:00:00Z", "2026-03-08T06:30:00Z", "2026-11-01T04:30:00Z", "2026-11-01T05:00:00Z", "2026-11-01T05:30:00Z"]) {
      const ms = Date.parse(iso);
      const a = DateTime.fromMillis(ms, { zone });
      const b = DateTime.fromMillis(ms, { zone: "America/Halifax" });
      expect(a.toISO()).toBe(b.toISO());
      expect(a.startOf("day").toISO()).toBe(b.startOf("day").toISO());
      expect(a.set({ hour: 2, minute: 30 }).toMillis()).toBe(b.set({ hour: 2, minute: 30 }).toMillis());
      expect(a.plus({ weeks: 1 }).toMillis()).toBe(b.plus({ weeks: 1 }).toMillis());
      expect(a.toFormat("ccc d LLL yyyy, HH:mm ZZZZ")).toBe(b.toFormat("ccc d LLL yyyy, HH:mm ZZZZ"));
    }
  });

  it("leaves unknown zones invalid and other zone names to luxon", () => {
    expect(facilityZone("Atlantic/Nowhere").isValid).toBe(false);
    expect(DateTime.fromMillis(0, { zone: facilityZone("UTC+3") }).toISO()).toBe("1970-01-01T03:00:00.000+03:00");
    expect(facilityZone("America/Halifax")).toBe(facilityZone("America/Halifax"));
  });
});
