/** Labels and Scan's public entry: its route table, and the QR rendering the tests read back. */
export { labelsTable } from "./routes";
export { labelQr } from "./label-pdf";
