/** The Safety review's public entry: its route table, its timed job and the figures of the start page. */
export { safetyTable } from "./routes";
export { runStockAlerts } from "./stock-alerts";
export { safetyLocationTotals, facilityToday } from "./safety.queries";
