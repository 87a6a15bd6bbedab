/**
 * The Stockroom's public entry: what other areas (Scan, Safety review, Recharge, the start page)
 * may use. Nothing else of this folder is imported from outside it.
 */
export { stockroomTable } from "./routes";
export { containerPolicy, sameOrganisation, type ContainerFacts } from "./container.policy";
export { moveContainer, markContainerEmpty, disposeContainer, reportContainerProblem, logUsage, withdraw, requireLocation } from "./container.commands";
export { containerRow, descendantIds } from "./container.queries";
export { presentChemical, presentContainer, presentLocation, presentLimit, locationPaths, type ContainerRow } from "./stock.presenter";
export { allLocations } from "./location.commands";
export { holdReservation, releaseReservations, useReservations } from "./reservation.commands";
export { reservationsWhere, freeInContainer, type ReservationRow } from "./reservation.queries";
