/** The system area's public entry: its route table. */
export { systemTable } from "./routes";
