/**
 * The People area's public entry: what app.ts (sign-in, sessions), other areas, seeds, tests and
 * the benchmark may use. Nothing else of this folder is imported from outside it.
 */
export { peopleTable } from "./routes";
export { createPassport } from "./passport";
export { createSignIn, DEFAULT_RATE_LIMITS, SESSION_COOKIE, type RateLimits, type SignIn } from "./sign-in";
export { DbSessionStore } from "./session-store";
export { hashPassword, checkCredentials } from "./password.commands";
export { isCommonPassword, passwordRefusal } from "./password-rules";
export { userPolicy, type PersonFacts } from "./user.policy";
export { trainingPolicy, trainingRequestPolicy, trainingAskPolicy, visibleTrainee, type TrainingRecordFacts, type TrainingRequestFacts } from "./training.policy";
