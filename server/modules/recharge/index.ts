/** Recharge's public entry: what other areas (the Schedule's booking checks, the start page) may use. */
export { accountPolicy, organisationMismatch, type AccountFacts, type AccountWithMembership, type Newcomer } from "./account.policy";
