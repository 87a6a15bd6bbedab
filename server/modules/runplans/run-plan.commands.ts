/**
 * Run plans as records: save, edit, attach to a booking (reserving what to weigh in named
 * containers), release; and what the Schedule's booking changes do to a plan's reservations
 * (cancel, decline, no-show release them; check-in turns them into usage). Each command is one
 * serialised transaction that computes the plan, asks the run-plan policy and writes.
 */
import type { EntityManager } from "typeorm";
import { IonTransferError } from "@shared/domain/ion-transfer";
import type { z } from "zod";
import type { reserveInput, RunPlanParsed } from "@shared/schemas/run-plan-records";
import { RunPlan } from "../../entities";
import { Conflict, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { hasRole, type AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import { holdReservation, releaseReservations, useReservations } from "../stockroom";
import { ionProblem } from "./ion-problem";
import { runPlanPolicy } from "./run-plan.policy";
import { computePlan, stockLines } from "./run-plan.compute";
import { bookingFacts, factsOf, instrumentById, planRow } from "./run-plan.queries";

/** Computes the plan to check it (unknown names → 422 naming the field); answers nothing. */
function checkComputes(em: EntityManager, input: RunPlanParsed): void {
  const cell = instrumentById(em.connection, input.cellId);
  if (input.cellId !== undefined && input.cellId !== null && (!cell || cell.kind !== "interface_cell")) {
    throw new RuleBroken(`Instrument ${input.cellId} is not an interface cell.`, [{ path: "cellId", message: "Choose an interface cell." }], "not_an_interface_cell");
  }
  try {
    computePlan(em.connection, input);
  } catch (e) {
    if (e instanceof IonTransferError) throw ionProblem(e);
    throw e;
  }
}

export async function createRunPlan(deps: Deps, actor: AuthUser, input: RunPlanParsed): Promise<number> {
  return serialTransaction(deps.ds, async (em) => {
    checkComputes(em, input);
    const now = deps.now().toISOString();
    const res = await em.insert(RunPlan, { authorId: actor.id, bookingId: null, cellId: input.cellId ?? null, title: input.title, solvent: input.solvent, input: JSON.stringify(input), createdAt: now, updatedAt: now });
    const id = res.identifiers[0].id as number;
    await audit(em, deps.now(), actor.id, "run_plan.created", "run_plan", id, { title: input.title });
    return id;
  });
}

export async function updateRunPlan(deps: Deps, actor: AuthUser, id: number, input: RunPlanParsed): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const plan = planRow(em.connection, id);
    runPlanPolicy.authorize(actor, "edit", factsOf(plan));
    checkComputes(em, input);
    await em.update(RunPlan, id, { title: input.title, solvent: input.solvent, cellId: input.cellId ?? null, input: JSON.stringify(input), updatedAt: deps.now().toISOString() });
    await audit(em, deps.now(), actor.id, "run_plan.updated", "run_plan", id, { title: input.title });
  });
}

const OPEN = ["requested", "confirmed"];

/**
 * Attaches the plan to a booking and reserves what it weighs, in named containers, for that
 * booking: all or nothing. The booking's interface cell becomes the plan's cell (its fill volumes
 * decide the amounts). 409 naming the container and what is left when the stock is short.
 */
export async function reserveForBooking(deps: Deps, actor: AuthUser, id: number, input: z.output<typeof reserveInput>): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const plan = planRow(em.connection, id);
    runPlanPolicy.authorize(actor, "attach", factsOf(plan));
    const booking = bookingFacts(em.connection, input.bookingId);
    const bookingField = [{ path: "bookingId", message: "Choose one of your bookings that is still ahead." }];
    if (!booking || (booking.userId !== actor.id && !hasRole(actor, "manager"))) {
      throw new RuleBroken(`Booking ${input.bookingId} is not one of yours.`, bookingField, "unknown_booking");
    }
    if (!OPEN.includes(booking.status) || booking.endMs <= now.getTime()) {
      throw new Conflict(`Booking ${booking.id} is ${booking.status.replace("_", " ")}${booking.endMs <= now.getTime() ? " and over" : ""}: a plan reserves stock only for a booking still ahead.`, "booking_not_open");
    }
    const cell = booking.instruments.find((i) => i.kind === "interface_cell");
    if (!cell || !booking.instruments.some((i) => i.kind === "potentiostat")) {
      throw new RuleBroken(`Booking ${booking.id} does not hold both a potentiostat and an interface cell.`, bookingField, "booking_needs_cell");
    }
    const stored = JSON.parse(plan.input) as RunPlanParsed;
    const parsed: RunPlanParsed = { ...stored, cellId: cell.id };
    let computed;
    try {
      computed = computePlan(em.connection, parsed);
    } catch (e) {
      if (e instanceof IonTransferError) throw ionProblem(e);
      throw e;
    }
    // Salts named from the ion table are not Stockroom chemicals: nothing to reserve for them (the plan says so).
    const missing = computed.weighing.filter((w) => w.chemicalId !== null && w.amount === null);
    if (missing.length) {
      throw new RuleBroken(`Phasebook cannot say how much to reserve: ${missing.map((m) => m.note).join(" ")}`, undefined, "plan_incomplete");
    }
    const chosen = new Map(input.containers.map((c) => [c.chemicalId, c.containerId]));
    const lines = stockLines(em.connection, actor, computed.weighing, chosen);
    for (const [k, line] of lines.entries()) {
      if (line.containerId === null) throw new Conflict(line.message, "not_in_stock", { chemicalId: line.chemicalId });
      await holdReservation(em, now, actor, { containerId: line.containerId, bookingId: booking.id, runPlanId: plan.id, amount: line.amount, unit: line.unit, field: `containers.${k}` });
    }
    await em.update(RunPlan, id, { bookingId: booking.id, cellId: cell.id, input: JSON.stringify(parsed), updatedAt: now.toISOString() });
    await audit(em, now, actor.id, "run_plan.reserved", "run_plan", id, { bookingId: booking.id, containers: lines.map((l) => l.containerId) });
  });
}

/** Releases what the plan holds (it stays attached to its booking). */
export async function releaseRunPlan(deps: Deps, actor: AuthUser, id: number): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const plan = planRow(em.connection, id);
    runPlanPolicy.authorize(actor, "release", factsOf(plan));
    const n = await releaseReservations(em, deps.now(), actor.id, { runPlanId: id }, `Released by ${actor.name}.`);
    await audit(em, deps.now(), actor.id, "run_plan.released", "run_plan", id, { reservations: n });
  });
}

// ---------------------------------------------------------------- booking changes (the Schedule calls these)

/** A booking cancelled, declined or recorded as a no-show: its reservations go back to the shelf. */
export function bookingEnded(em: EntityManager, now: Date, actorId: number | null, bookingId: number, why: string): Promise<number> {
  return releaseReservations(em, now, actorId, { bookingId }, why);
}

/** A booking checked in: what its reservations still hold becomes usage on the booking. */
export function bookingCheckedIn(em: EntityManager, now: Date, actor: AuthUser, bookingId: number): Promise<{ used: number; released: number }> {
  return useReservations(em, now, actor, bookingId);
}
