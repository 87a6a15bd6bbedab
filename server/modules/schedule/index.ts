/** The Schedule's public entry: what other areas (Scan, Recharge, the start page) may use. */
export { instrumentPolicy, type InstrumentFacts } from "./instrument.policy";
export { reportInstrumentFault, recordCleaned, closeInstrumentFault, openFaults, type FaultRow } from "./instrument-fault.commands";
