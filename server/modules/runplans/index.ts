/**
 * Run plans' public entry: what other areas (the Schedule's booking changes, Scan) may use.
 * Nothing else of this folder is imported from outside it.
 */
export { runPlansTable } from "./routes";
export { bookingEnded, bookingCheckedIn } from "./run-plan.commands";
export { runPlanPolicy, type RunPlanFacts } from "./run-plan.policy";
export { plansOfBookings, factsOf } from "./run-plan.queries";
