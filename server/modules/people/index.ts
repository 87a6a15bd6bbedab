/**
 * The People area's public entry: what app.ts (sign-in, sessions), other areas, seeds, tests and
 * the benchmark may use. Nothing else of this folder is imported from outside it.
 */
export { peopleTable } from "./routes";
export { createPassport } from "./passport";
export { createSignIn, type SignIn } from "./sign-in";
export { DbSessionStore } from "./session-store";
export { hashPassword } from "./password.commands";
export { userPolicy, type PersonFacts } from "./user.policy";
export { trainingPolicy, trainingRequestPolicy, trainingAskPolicy, visibleTrainee, type TrainingRecordFacts, type TrainingRequestFacts } from "./training.policy";
