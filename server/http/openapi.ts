/**
 * The OpenAPI 3.1 description of Phasebook's HTTP API, generated from the modules' route tables
 * and the shared zod schemas (zod's own JSON Schema output, draft 2020-12, which OpenAPI 3.1
 * uses). GET /api/openapi.json serves it; /api/docs shows it to people.
 */
import { z, type ZodType } from "zod";
import type { AnyRoute, RouteTable } from "./route-table";

type Json = Record<string, unknown>;

const PROBLEM_SCHEMA: Json = {
  type: "object",
  description: "RFC 9457 problem details; `code` is stable and says why.",
  required: ["type", "title", "status"],
  properties: {
    type: { type: "string" },
    title: { type: "string" },
    status: { type: "integer" },
    detail: { type: "string" },
    code: { type: "string" },
    errors: {
      type: "array",
      items: { type: "object", required: ["path", "message"], properties: { path: { type: "string" }, message: { type: "string" } } },
    },
  },
};

const PROBLEM_STATUSES: Record<number, string> = {
  400: "Malformed input: `errors` names each field.",
  401: "Not signed in.",
  403: "Signed in, but this person may not do this (to this record); `detail` says why.",
  404: "No such record, or one the caller may not see.",
  409: "Conflicts with the record's state or another record.",
  422: "Well-formed, but breaks a rule; `code` names the rule.",
};

function jsonSchema(schema: ZodType, io: "input" | "output"): Json {
  const out = z.toJSONSchema(schema, { target: "draft-2020-12", io, unrepresentable: "any" }) as Json;
  delete out.$schema;
  return out;
}

/** Express "/containers/:id.ics" → OpenAPI "/containers/{id}.ics". */
function openApiPath(path: string): string {
  return path.replace(/:([A-Za-z0-9_]+)/g, "{$1}");
}

function parameters(r: AnyRoute): Json[] {
  const out: Json[] = [];
  for (const [where, schema] of [
    ["path", r.params],
    ["query", r.query],
  ] as const) {
    if (!schema) continue;
    const s = jsonSchema(schema, "input");
    const props = (s.properties ?? {}) as Record<string, Json>;
    const required = new Set((s.required ?? []) as string[]);
    for (const [name, prop] of Object.entries(props)) {
      out.push({ name, in: where, required: where === "path" || required.has(name), schema: prop, ...(prop.description ? { description: prop.description } : {}) });
    }
  }
  // A path parameter the schema does not name still has to be described.
  for (const m of r.path.matchAll(/:([A-Za-z0-9_]+)/g)) {
    if (!out.some((p) => p.in === "path" && p.name === m[1])) out.push({ name: m[1], in: "path", required: true, schema: { type: "string" } });
  }
  return out;
}

function accessText(r: AnyRoute): string {
  if (r.access === "public") return "Anyone, signed in or not.";
  if (r.access === "signed_in") return "Anyone signed in.";
  return `Roles: ${r.access.join(", ")}.`;
}

function operation(r: AnyRoute, tag: string): Json {
  const status = r.status ?? 200;
  const success: Json = { description: r.output || r.produces ? "Success." : "Done; no content." };
  if (r.output) success.content = { "application/json": { schema: jsonSchema(r.output, "output") } };
  else if (r.produces) success.content = { [r.produces]: { schema: { type: "string", ...(r.produces.startsWith("text/") ? {} : { format: "binary" }) } } };
  const responses: Json = { [String(r.output || r.produces || status !== 200 ? status : 204)]: success };
  const problems = [400, 404, 409, 422, ...(r.access === "public" ? [] : [401, 403])];
  for (const code of problems.sort()) {
    responses[String(code)] = { description: PROBLEM_STATUSES[code], content: { "application/problem+json": { schema: { $ref: "#/components/schemas/Problem" } } } };
  }
  const op: Json = {
    tags: [tag],
    summary: r.summary,
    description: [r.description, `Who: ${accessText(r)}`, r.policy ? `Record rule: the \`${r.policy}\` policy decides on the record.` : ""].filter(Boolean).join("\n\n"),
    operationId: `${r.method}${r.path.replace(/[^A-Za-z0-9]+(.)?/g, (_m, c: string | undefined) => (c ? c.toUpperCase() : ""))}`,
    "x-access": r.access,
    ...(r.policy ? { "x-policy": r.policy } : {}),
    parameters: parameters(r),
    responses,
  };
  if (r.access !== "public") op.security = [{ session: [] }];
  if (r.body || r.consumes) {
    const media = r.consumes ?? "application/json";
    op.requestBody = { required: true, content: { [media]: { schema: r.body && media === "application/json" ? jsonSchema(r.body, "input") : { type: "string" } } } };
  }
  return op;
}

export function openApiDocument(tables: RouteTable[], info: { title: string; version: string; serverUrl: string }): Json {
  const paths: Record<string, Json> = {};
  for (const t of tables) {
    for (const r of t.routes) {
      const p = `/api${openApiPath(r.path)}`;
      paths[p] = { ...(paths[p] ?? {}), [r.method]: operation(r, t.module) };
    }
  }
  return {
    openapi: "3.1.0",
    info: {
      title: info.title,
      version: info.version,
      description: [
        "Phasebook's HTTP contract: JSON in and out under /api; times are ISO 8601 with an offset or Z.",
        "Sign in with POST /api/auth/login (a session cookie). Requests that change state send the token of GET /api/auth/csrf in the x-csrf-token header.",
        "Errors are RFC 9457 problem JSON with a stable `code`. Lists take ?limit=&offset= and answer { items, total }.",
        "Ids are positive integers, as JSON numbers or strings of digits; anything else is 400 naming the field.",
        "Run plans follow the IUPAC convention for liquid|liquid interfaces (Pure Appl. Chem. 76 (2004) 2147): the Galvani potential difference Δ_o^w φ = φ(water) − φ(organic).",
      ].join("\n\n"),
    },
    servers: [{ url: info.serverUrl }],
    tags: tables.map((t) => ({ name: t.module, description: t.description })),
    paths,
    components: {
      schemas: { Problem: PROBLEM_SCHEMA },
      securitySchemes: {
        session: { type: "apiKey", in: "cookie", name: "phasebook.sid", description: "The session cookie set by POST /api/auth/login." },
      },
    },
  };
}
