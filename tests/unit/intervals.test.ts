import { describe, expect, it } from "vitest";
import { blockedInterval, conflicts, holdsSlot, mergeIntervals, overlaps } from "@shared/domain/intervals";

const at = (hhmm: string) => new Date(`2026-05-04T${hhmm}:00Z`);
const slot = (from: string, to: string) => ({ start: at(from), end: at(to) });

describe("overlaps", () => {
  it("treats intervals as half-open, so touching intervals do not overlap", () => {
    expect(overlaps(slot("10:00", "11:00"), slot("11:00", "12:00"))).toBe(false);
  });

  it("sees a one-minute overlap", () => {
    expect(overlaps(slot("10:00", "11:00"), slot("10:59", "12:00"))).toBe(true);
  });

  it("never lets an empty interval overlap anything", () => {
    expect(overlaps(slot("10:30", "10:30"), slot("10:00", "11:00"))).toBe(false);
  });

  it("accepts epoch milliseconds as well as Dates", () => {
    expect(overlaps({ start: at("10:00").getTime(), end: at("11:00").getTime() }, slot("10:30", "10:45"))).toBe(true);
  });
});

describe("blockedInterval", () => {
  it("adds the cleaning buffer after the session, not before it", () => {
    expect(blockedInterval(slot("10:00", "11:00"), 15)).toEqual({ start: at("10:00").getTime(), end: at("11:15").getTime() });
  });

  it("refuses a negative buffer", () => {
    expect(() => blockedInterval(slot("10:00", "11:00"), -5)).toThrow(RangeError);
  });
});

describe("conflicts", () => {
  // The instrument already has a session 10:00–11:00 UTC.
  const existing = [{ id: 1, ...slot("10:00", "11:00") }];

  const cases: { name: string; candidate: [string, string]; buffer: number; clash: boolean }[] = [
    { name: "touching after it with no buffer", candidate: ["11:00", "12:00"], buffer: 0, clash: false },
    { name: "touching before it with no buffer", candidate: ["09:00", "10:00"], buffer: 0, clash: false },
    { name: "touching after it while its 15-minute cleaning runs", candidate: ["11:00", "12:00"], buffer: 15, clash: true },
    { name: "starting after it exactly when the 15-minute buffer ends", candidate: ["11:15", "12:00"], buffer: 15, clash: false },
    { name: "starting after it one minute before the buffer ends", candidate: ["11:14", "12:00"], buffer: 15, clash: true },
    { name: "ending before it with exactly the buffer to spare", candidate: ["08:45", "09:45"], buffer: 15, clash: false },
    { name: "ending before it one minute short of the buffer", candidate: ["08:46", "09:46"], buffer: 15, clash: true },
    { name: "lying inside it", candidate: ["10:15", "10:45"], buffer: 0, clash: true },
    { name: "containing it", candidate: ["09:00", "12:00"], buffer: 0, clash: true },
    { name: "identical to it", candidate: ["10:00", "11:00"], buffer: 0, clash: true },
    { name: "overlapping it by one minute with no buffer", candidate: ["10:59", "12:00"], buffer: 0, clash: true },
  ];

  it.each(cases)("a candidate $name: conflict = $clash", ({ candidate, buffer, clash }) => {
    const found = conflicts(slot(...candidate), buffer, existing);
    expect(found.map((b) => b.id)).toEqual(clash ? [1] : []);
  });

  it("names every booking it collides with and only those", () => {
    const day = [
      { id: 1, ...slot("08:00", "09:00") },
      { id: 2, ...slot("10:00", "11:00") },
      { id: 3, ...slot("13:00", "14:00") },
    ];
    // 08:30–10:30 with a 30-minute buffer blocks 08:30–11:00: it meets 1 and 2, not 3.
    expect(conflicts(slot("08:30", "10:30"), 30, day).map((b) => b.id)).toEqual([1, 2]);
  });
});

describe("holdsSlot", () => {
  it("frees the slot of declined and cancelled bookings and keeps it for the rest", () => {
    const held = (["requested", "confirmed", "declined", "cancelled", "in_progress", "completed", "no_show"] as const).filter(holdsSlot);
    expect(held).toEqual(["requested", "confirmed", "in_progress", "completed", "no_show"]);
  });
});

describe("mergeIntervals", () => {
  it("merges overlapping and touching pieces and drops empty ones", () => {
    const merged = mergeIntervals([
      { start: 30, end: 40 },
      { start: 0, end: 10 },
      { start: 10, end: 20 },
      { start: 35, end: 50 },
      { start: 60, end: 60 },
    ]);
    expect(merged).toEqual([
      { start: 0, end: 20 },
      { start: 30, end: 50 },
    ]);
  });
});
