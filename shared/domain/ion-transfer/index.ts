/**
 * Run plans' ion-transfer computations: the one entry the server and the client import.
 * See each module for its equations and sources.
 */
export * from "./constants";
export * from "./ion-table";
export * from "./resolve-ions";
export * from "./window";
export * from "./analytes";
export * from "./distribution";
export * from "./scale";
export * from "./voltammogram";
export * from "./run-plan";
export * from "./chemical-ions";
