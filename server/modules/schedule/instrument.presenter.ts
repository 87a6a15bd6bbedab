/** Instruments → the DTOs of shared/schemas/instruments, with what the viewer may do to each. */
import type { BookableHours, InstrumentDetailDto, InstrumentDto } from "@shared/schemas/instruments";
import type { Instrument } from "../../entities";
import type { AuthUser } from "../../middleware/auth";
import { instrumentPolicy } from "./instrument.policy";
import type { FaultRow } from "./instrument.queries";

export function presentInstrument(i: Instrument, viewer: AuthUser): InstrumentDto {
  return {
    id: i.id,
    name: i.name,
    kind: i.kind,
    status: i.status,
    model: i.model,
    serialNumber: i.serialNumber,
    description: i.description,
    locationId: i.locationId,
    fourElectrode: i.fourElectrode,
    interfaceAreaCm2: i.interfaceAreaCm2,
    interfaceRadiusCm: i.interfaceRadiusCm,
    aqueousFillMl: i.aqueousFillMl,
    organicFillMl: i.organicFillMl,
    trainingRequired: i.trainingRequired,
    requiresApproval: i.requiresApproval,
    cleaningBufferMinutes: i.cleaningBufferMinutes,
    minLeadMinutes: i.minLeadMinutes,
    maxLengthMinutes: i.maxLengthMinutes,
    bookableHours: JSON.parse(i.bookableHours) as BookableHours,
    afterHoursAllowed: i.afterHoursAllowed,
    abilities: instrumentPolicy.abilities(viewer, i),
  };
}

/** The instrument's page: the instrument with its open fault reports. */
export function presentInstrumentDetail(i: Instrument, viewer: AuthUser, faults: FaultRow[]): InstrumentDetailDto {
  return { ...presentInstrument(i, viewer), openFaults: faults };
}
