/**
 * Prints the OpenAPI 3.1 description of the API (the same document GET /api/openapi.json serves),
 * generated from the areas' route tables: `npm run --silent openapi > openapi.json`.
 */
import { ROUTE_TABLES } from "../modules";
import { openApiDocument } from "../http/openapi";

const doc = openApiDocument(ROUTE_TABLES, {
  title: "Phasebook API",
  version: process.env.npm_package_version ?? "dev",
  serverUrl: process.env.PUBLIC_URL ?? "http://localhost:3000",
});
process.stdout.write(`${JSON.stringify(doc, null, 2)}\n`);
