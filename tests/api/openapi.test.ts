/**
 * GET /api/openapi.json: the contract generated from the route tables is valid OpenAPI 3.1
 * (checked by @seriousme/openapi-schema-validator against the OpenAPI Initiative's published
 * schema) and describes every route the app mounts, with who may call it.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Validator } from "@seriousme/openapi-schema-validator";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";

let t: TestApp;
let doc: { openapi: string; paths: Record<string, Record<string, { "x-access": unknown; responses: Record<string, unknown> }>> };

beforeAll(async () => {
  t = await startTestApp();
  const r = await new ApiClient(t.url).get("/api/openapi.json");
  expect(r.status).toBe(200);
  doc = r.body;
});
afterAll(async () => {
  await t.close();
});

const asOpenApi = (route: string) => {
  const [method, path] = route.split(" ");
  return { method: method.toLowerCase(), path: path.replace(/:([A-Za-z0-9_]+)/g, "{$1}") };
};

describe("GET /api/openapi.json", () => {
  it("is valid OpenAPI 3.1", async () => {
    expect(doc.openapi).toBe("3.1.0");
    const result = await new Validator().validate(structuredClone(doc));
    expect(result.errors ?? [], JSON.stringify(result.errors ?? []).slice(0, 2000)).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it("lists every route the app mounts, each saying who may call it", () => {
    const described = t.routes.map(asOpenApi);
    for (const { method, path } of described) {
      expect(doc.paths[path]?.[method], `${method.toUpperCase()} ${path}`).toBeDefined();
      expect(doc.paths[path][method]["x-access"]).toBeDefined();
    }
    const count = Object.values(doc.paths).reduce((n, ops) => n + Object.keys(ops).length, 0);
    expect(count).toBe(described.length);
  });

  it("describes the contract's problem answers as RFC 9457 problem JSON", () => {
    const login = doc.paths["/api/containers/{id}/usage"].post;
    expect(Object.keys(login.responses)).toEqual(expect.arrayContaining(["200", "400", "401", "403", "404", "409", "422"]));
  });
});
