/** The system area's public entry: its route table, and the facility's settings for the page boot. */
export { systemTable } from "./routes";
export { facilitySettings } from "./system.queries";
