/**
 * The Schedule's policies as tables: every booking action × every kind of person × the booking's
 * state and time, then the instrument policy's actions and the status changes they guard. The
 * rules are the Schedule's as issue 9 moved them (bookings: owner or manager; instruments: anyone
 * reports a fault, only the manager changes the status). Expectations are written out, not computed.
 */
import { describe, expect, it } from "vitest";
import type { Role } from "@shared/schemas/auth";
import type { BookingStatus } from "@shared/schemas/bookings";
import { bookingPolicy, cancelReasonMissing, noShowDenial, seesInFull, type BookingCase, type BookingPolicyAction } from "../../server/modules/schedule/booking.policy";
import { instrumentPolicy, statusAction, type InstrumentAction, type InstrumentFacts } from "../../server/modules/schedule/instrument.policy";
import type { AuthUser } from "../../server/middleware/auth";

const OWN_GROUP = 1;
const OTHER_GROUP = 2;
const CUSTOMER = "Tidewater Metals Recovery Ltd";
const OWNER_ID = 10;
const MANAGER_ID = 20;

const person = (id: number, roles: Role[], extra: Partial<AuthUser> = {}): AuthUser => ({ id, email: `p${id}@kestrelbay.example`, name: `P${id}`, roles, groupId: null, leadOf: [], organisation: null, ...extra });

const PEOPLE = {
  owner: person(OWNER_ID, ["member"], { groupId: OWN_GROUP }),
  ownGroup: person(11, ["member"], { groupId: OWN_GROUP }),
  otherGroup: person(12, ["member"], { groupId: OTHER_GROUP }),
  ownLead: person(13, ["group_lead", "member"], { leadOf: [OWN_GROUP] }),
  external: person(14, ["member"], { organisation: CUSTOMER }),
  manager: person(MANAGER_ID, ["manager", "member"]),
  safety: person(30, ["safety_officer", "member"]),
  admin: person(40, ["admin"]),
} as const;
type Who = keyof typeof PEOPLE;

// Wednesday 2 December 2026, 15:00 UTC; check-in opens 15 minutes before the start.
const NOW = Date.parse("2026-12-02T15:00:00Z");
const MIN = 60_000;
const HOUR = 60 * MIN;
const EARLY = 15;

const booking = (status: BookingStatus, startIn: number, length = HOUR, userId = OWNER_ID): BookingCase => ({
  booking: { id: 5, userId, status, startMs: NOW + startIn, endMs: NOW + startIn + length },
  nowMs: NOW,
  checkInEarlyMinutes: EARLY,
});

const RECORDS = {
  requestedAhead: booking("requested", 48 * HOUR),
  requestedOver: booking("requested", -3 * HOUR),
  confirmedAhead: booking("confirmed", 48 * HOUR),
  confirmedIn10Min: booking("confirmed", 10 * MIN),
  confirmedIn20Min: booking("confirmed", 20 * MIN),
  confirmedStarted: booking("confirmed", -30 * MIN),
  confirmedOver: booking("confirmed", -2 * HOUR),
  inProgress: booking("in_progress", -30 * MIN),
  completed: booking("completed", -3 * HOUR),
  cancelled: booking("cancelled", 48 * HOUR),
  declined: booking("declined", 48 * HOUR),
  noShow: booking("no_show", -3 * HOUR),
  managersOwnSoon: booking("confirmed", 10 * MIN, HOUR, MANAGER_ID),
} as const;
type Rec = keyof typeof RECORDS;

const Y = null;
const NOBODY_ELSE: Partial<Record<Who, number>> = { ownGroup: 403, otherGroup: 403, ownLead: 403, external: 403, safety: 403, admin: 403 };
type Row = [BookingPolicyAction, Rec, Partial<Record<Who, number | null>>];

// [action, booking, who] → the denial's status (null = allowed).
const TABLE: Row[] = [
  // Cancel: owner or manager, while requested or confirmed; the owner not once it has started.
  ["cancel", "requestedAhead", { owner: Y, manager: Y, ...NOBODY_ELSE }],
  ["cancel", "confirmedAhead", { owner: Y, manager: Y, ...NOBODY_ELSE }],
  ["cancel", "confirmedStarted", { owner: 422, manager: Y, ...NOBODY_ELSE }],
  ["cancel", "inProgress", { owner: 409, manager: 409, ownGroup: 403 }],
  ["cancel", "completed", { owner: 409, manager: 409 }],
  ["cancel", "cancelled", { owner: 409, manager: 409 }],
  ["cancel", "declined", { owner: 409, manager: 409 }],
  ["cancel", "noShow", { owner: 409, manager: 409 }],
  // Move: owner or manager, before the start, while requested or confirmed.
  ["move", "requestedAhead", { owner: Y, manager: Y, ...NOBODY_ELSE }],
  ["move", "confirmedIn10Min", { owner: Y, manager: Y, external: 403 }],
  ["move", "confirmedStarted", { owner: 409, manager: 409, ownGroup: 403, admin: 403 }],
  ["move", "cancelled", { owner: 409, manager: 409 }],
  ["move", "inProgress", { owner: 409, manager: 409 }],
  // Check in: the owner only, of a confirmed booking, from 15 minutes before the start until its end.
  ["checkIn", "confirmedAhead", { owner: 422, manager: 403, ...NOBODY_ELSE }],
  ["checkIn", "confirmedIn20Min", { owner: 422 }],
  ["checkIn", "confirmedIn10Min", { owner: Y, manager: 403, ...NOBODY_ELSE }],
  ["checkIn", "confirmedStarted", { owner: Y, manager: 403 }],
  ["checkIn", "confirmedOver", { owner: 422 }],
  ["checkIn", "requestedAhead", { owner: 409 }],
  ["checkIn", "inProgress", { owner: 409 }],
  ["checkIn", "managersOwnSoon", { manager: Y, owner: 403 }],
  // Check out: the owner only, of a booking in progress.
  ["checkOut", "inProgress", { owner: Y, manager: 403, ...NOBODY_ELSE }],
  ["checkOut", "confirmedStarted", { owner: 409 }],
  ["checkOut", "completed", { owner: 409 }],
  // Approve: the manager, of a request that is not over. Decline: the manager, of a request.
  ["approve", "requestedAhead", { manager: Y, owner: 403, ...NOBODY_ELSE }],
  ["approve", "requestedOver", { manager: 422 }],
  ["approve", "confirmedAhead", { manager: 409 }],
  ["approve", "cancelled", { manager: 409 }],
  ["decline", "requestedAhead", { manager: Y, owner: 403, ...NOBODY_ELSE }],
  ["decline", "requestedOver", { manager: Y }],
  ["decline", "confirmedAhead", { manager: 409 }],
  // No-show: the manager, of a confirmed booking that has started.
  ["noShow", "confirmedStarted", { manager: Y, owner: 403, ...NOBODY_ELSE }],
  ["noShow", "confirmedOver", { manager: Y }],
  ["noShow", "confirmedAhead", { manager: 422 }],
  ["noShow", "inProgress", { manager: 409 }],
  ["noShow", "requestedOver", { manager: 409 }],
  ["noShow", "completed", { manager: 409 }],
];

describe("the booking policy", () => {
  for (const [action, rec, expected] of TABLE) {
    for (const [who, status] of Object.entries(expected) as [Who, number | null][]) {
      it(`${action} on a ${rec} booking by ${who}: ${status === null ? "allowed" : status}`, () => {
        const d = bookingPolicy.check(PEOPLE[who], action, RECORDS[rec]);
        expect(d?.status ?? null).toBe(status);
        if (d) expect(d.reason.length).toBeGreaterThan(10);
      });
    }
  }

  it("names each refusal with a stable code", () => {
    expect(bookingPolicy.check(PEOPLE.ownGroup, "cancel", RECORDS.confirmedAhead)?.code).toBe("not_your_booking");
    expect(bookingPolicy.check(PEOPLE.owner, "cancel", RECORDS.confirmedStarted)?.code).toBe("already_started");
    expect(bookingPolicy.check(PEOPLE.owner, "cancel", RECORDS.completed)?.code).toBe("not_cancellable");
    expect(bookingPolicy.check(PEOPLE.owner, "move", RECORDS.confirmedStarted)?.code).toBe("booking_started");
    expect(bookingPolicy.check(PEOPLE.owner, "checkIn", RECORDS.confirmedAhead)?.code).toBe("too_early");
    expect(bookingPolicy.check(PEOPLE.owner, "checkIn", RECORDS.confirmedOver)?.code).toBe("too_late");
    expect(bookingPolicy.check(PEOPLE.owner, "checkOut", RECORDS.confirmedStarted)?.code).toBe("not_in_progress");
    expect(bookingPolicy.check(PEOPLE.manager, "approve", RECORDS.requestedOver)?.code).toBe("booking_over");
    expect(bookingPolicy.check(PEOPLE.owner, "approve", RECORDS.requestedAhead)?.code).toBe("manager_only");
    expect(bookingPolicy.check(PEOPLE.manager, "noShow", RECORDS.confirmedAhead)?.code).toBe("not_started");
  });

  it("sends as abilities exactly what it allows, at the booking's moment", () => {
    expect(bookingPolicy.abilities(PEOPLE.owner, RECORDS.confirmedIn10Min)).toEqual({
      cancel: true,
      move: true,
      checkIn: true,
      checkOut: false,
      approve: false,
      decline: false,
      noShow: false,
    });
    expect(bookingPolicy.abilities(PEOPLE.manager, RECORDS.confirmedStarted)).toEqual({
      cancel: true,
      move: false,
      checkIn: false,
      checkOut: false,
      approve: false,
      decline: false,
      noShow: true,
    });
    expect(Object.values(bookingPolicy.abilities(PEOPLE.admin, RECORDS.requestedAhead)).some(Boolean)).toBe(false);
  });

  it("shows a booking in full to its owner and the manager only, whatever the group or organisation", () => {
    const b = RECORDS.confirmedAhead.booking;
    const seen = Object.fromEntries((Object.keys(PEOPLE) as Who[]).map((w) => [w, seesInFull(PEOPLE[w], b)]));
    expect(seen).toEqual({ owner: true, ownGroup: false, otherGroup: false, ownLead: false, external: false, manager: true, safety: false, admin: false });
  });

  it("asks a manager cancelling someone else's booking for a reason, and nobody else", () => {
    const b = RECORDS.confirmedAhead.booking;
    expect(cancelReasonMissing(PEOPLE.manager, b, undefined)).toMatchObject({ status: 422, code: "reason_required" });
    expect(cancelReasonMissing(PEOPLE.manager, b, "")).toMatchObject({ status: 422 });
    expect(cancelReasonMissing(PEOPLE.manager, b, "Recalibration")).toBeNull();
    expect(cancelReasonMissing(PEOPLE.owner, b, undefined)).toBeNull();
    expect(cancelReasonMissing(PEOPLE.manager, RECORDS.managersOwnSoon.booking, undefined)).toBeNull();
  });

  it("lets the no-show job (no person) decide by state and clock alone", () => {
    expect(noShowDenial(RECORDS.confirmedStarted)).toBeNull();
    expect(noShowDenial(RECORDS.confirmedAhead)?.status).toBe(422);
    expect(noShowDenial(RECORDS.inProgress)?.status).toBe(409);
  });
});

describe("the instrument policy", () => {
  const instrument = (over: Partial<InstrumentFacts> = {}): InstrumentFacts => ({ id: 1, name: "Cell A", kind: "interface_cell", status: "in_service", ...over });
  const INSTRUMENTS = {
    cell: instrument(),
    potentiostat: instrument({ kind: "potentiostat" }),
    down: instrument({ status: "under_maintenance" }),
    retired: instrument({ status: "retired" }),
  } as const;
  type Inst = keyof typeof INSTRUMENTS;
  const EVERYONE_BUT_MANAGER: Partial<Record<Who, number>> = { owner: 403, ownGroup: 403, otherGroup: 403, ownLead: 403, external: 403, safety: 403, admin: 403 };
  const ITABLE: [InstrumentAction, Inst, Partial<Record<Who, number | null>>][] = [
    ["reportFault", "cell", { owner: Y, otherGroup: Y, external: Y, safety: Y, admin: Y, manager: Y }],
    ["reportFault", "down", { external: Y, manager: Y }],
    ["reportFault", "retired", { owner: 409, manager: 409 }],
    ["recordCleaned", "cell", { owner: Y, external: Y, admin: Y }],
    ["recordCleaned", "potentiostat", { owner: 422, manager: 422 }],
    ["edit", "cell", { manager: Y, ...EVERYONE_BUT_MANAGER }],
    ["takeOutOfService", "cell", { manager: Y, ...EVERYONE_BUT_MANAGER }],
    ["takeOutOfService", "down", { manager: 409, external: 403 }],
    ["takeOutOfService", "retired", { manager: 409 }],
    ["returnToService", "down", { manager: Y, ...EVERYONE_BUT_MANAGER }],
    ["returnToService", "retired", { manager: Y, owner: 403 }],
    ["returnToService", "cell", { manager: 409, external: 403 }],
    ["closeFault", "cell", { manager: Y, ...EVERYONE_BUT_MANAGER }],
  ];

  for (const [action, inst, expected] of ITABLE) {
    for (const [who, status] of Object.entries(expected) as [Who, number | null][]) {
      it(`${action} on the ${inst} instrument by ${who}: ${status === null ? "allowed" : status}`, () => {
        expect(instrumentPolicy.check(PEOPLE[who], action, INSTRUMENTS[inst])?.status ?? null).toBe(status);
      });
    }
  }

  it.each([
    ["in_service", "under_maintenance", "takeOutOfService"],
    ["in_service", "retired", "takeOutOfService"],
    ["under_maintenance", "in_service", "returnToService"],
    ["retired", "in_service", "returnToService"],
    ["under_maintenance", "retired", "edit"],
    ["retired", "under_maintenance", "edit"],
  ] as const)("a status change from %s to %s asks for %s", (from, to, action) => {
    expect(statusAction(from, to)).toBe(action);
  });
});
