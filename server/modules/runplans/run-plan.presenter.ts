/** Run plans → the DTOs of shared/schemas/run-plan-records, computed afresh on each read, with what the viewer may do. */
import type { DataSource } from "typeorm";
import { IonTransferError } from "@shared/domain/ion-transfer";
import { PRECEDENCE_CAUTION } from "@shared/domain/cautions";
import type { RunPlanDto, RunPlanParsed, RunPlanSummaryDto } from "@shared/schemas/run-plan-records";
import { runPlanInput } from "@shared/schemas/run-plan-records";
import type { AuthUser } from "../../middleware/auth";
import { reservationsWhere } from "../stockroom";
import { runPlanPolicy } from "./run-plan.policy";
import { computePlan, stockLines, wasteOf, type ComputedPlan } from "./run-plan.compute";
import { bookingFacts, factsOf, instrumentById, type PlanRow } from "./run-plan.queries";

/** The cautions of every plan, beside the solvent's own (Phasebook's wording; the SDS and local rules decide). */
export const RUN_CAUTIONS: readonly string[] = [
  "Work with the organic phase in a fume hood: 1,2-dichloroethane and similar solvents are volatile, toxic and suspected or known carcinogens.",
  "Wear gloves that suit chlorinated solvents (thin nitrile gives little protection against 1,2-dichloroethane; use the material the safety data sheet names) and eye protection.",
  "Collect the organic phase and every rinse as halogenated waste; never down the sink.",
  PRECEDENCE_CAUTION,
];

/** The solvent's own cautions where the table has them (they already ask for a hood, gloves and the waste stream), Phasebook's general ones otherwise. */
function cautionsFor(computed: ComputedPlan | null): string[] {
  const own = computed?.preview.cautions ?? [];
  const specific = own.length > 1;
  return [...new Set(specific ? [...own.slice(0, -1), "Wear eye protection and a lab coat; keep the filled cell and its waste in the hood until they are emptied.", PRECEDENCE_CAUTION] : RUN_CAUTIONS)];
}

export function presentRunPlan(ds: DataSource, viewer: AuthUser, row: PlanRow): RunPlanDto {
  const input = runPlanInput.parse(JSON.parse(row.input)) as RunPlanParsed;
  let computed: ComputedPlan | null = null;
  let problem: string | null = null;
  try {
    computed = computePlan(ds, input);
  } catch (e) {
    if (!(e instanceof IonTransferError)) throw e;
    problem = `This plan cannot be computed now: ${e.message}`;
  }
  const reservations = reservationsWhere(ds, { runPlanId: row.id });
  const ownHeld = new Map<number, number>();
  for (const r of reservations) if (r.state === "held") ownHeld.set(r.containerId, (ownHeld.get(r.containerId) ?? 0) + r.amount - r.drawn);
  const booking = bookingFacts(ds, row.bookingId);
  const cell = computed?.cell ?? instrumentById(ds, input.cellId);
  return {
    id: row.id,
    title: row.title,
    authorId: row.authorId,
    authorName: row.authorName,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    input,
    booking: booking ? { id: booking.id, start: booking.startsAt, end: booking.endsAt, status: booking.status, instruments: booking.instruments.map((i) => i.name) } : null,
    cell: cell
      ? { id: cell.id, name: cell.name, interfaceAreaCm2: cell.interfaceAreaCm2, interfaceRadiusCm: cell.interfaceRadiusCm, aqueousFillMl: cell.aqueousFillMl, organicFillMl: cell.organicFillMl }
      : null,
    electrolytes: computed?.electrolytes ?? [],
    preview: computed?.preview ?? null,
    problem,
    volumes: computed?.volumes ?? { aqueousMl: null, organicMl: null },
    weighing: computed?.weighing ?? [],
    stock: computed ? stockLines(ds, viewer, computed.weighing, new Map(), ownHeld) : [],
    waste: computed ? wasteOf(ds, computed) : { halogenated: false, volumeMl: null, containerId: null, roomMl: null, hasRoom: null, message: "" },
    reservations: reservations.map((r) => ({
      id: r.id,
      containerId: r.containerId,
      chemicalName: r.chemicalName,
      bookingId: r.bookingId,
      runPlanId: r.runPlanId,
      amount: r.amount,
      drawn: r.drawn,
      unit: r.unit,
      state: r.state,
      note: r.note,
      createdAt: r.createdAt,
    })),
    cautions: cautionsFor(computed),
    abilities: runPlanPolicy.abilities(viewer, factsOf(row)),
  };
}

export function presentRunPlanSummary(viewer: AuthUser, row: PlanRow, cellName: string | null): RunPlanSummaryDto {
  return {
    id: row.id,
    title: row.title,
    authorName: row.authorName,
    solvent: row.solvent,
    bookingId: row.bookingId,
    cellName,
    heldReservations: row.heldCount,
    createdAt: row.createdAt,
    abilities: runPlanPolicy.abilities(viewer, factsOf(row)),
  };
}
