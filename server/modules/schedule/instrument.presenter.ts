import type { BookableHours, InstrumentDto } from "@shared/schemas/instruments";
import type { Instrument } from "../entities";

export function presentInstrument(i: Instrument): InstrumentDto {
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
    trainingRequired: i.trainingRequired,
    requiresApproval: i.requiresApproval,
    cleaningBufferMinutes: i.cleaningBufferMinutes,
    minLeadMinutes: i.minLeadMinutes,
    maxLengthMinutes: i.maxLengthMinutes,
    bookableHours: JSON.parse(i.bookableHours) as BookableHours,
    afterHoursAllowed: i.afterHoursAllowed,
  };
}
