/**
 * The two answers every first page load needs, the session (GET /api/auth/me) and the facility
 * (GET /api/facility), checked without zod. Everywhere else the client parses answers with the
 * shared zod schemas (`parseResponse`); here that would put zod (about 23 kB compressed) on the
 * sign-in page, which needs neither it nor anything else of the shared schemas to appear. The
 * types still come from the shared schemas, the server checks both answers against those
 * schemas in its tests (`checkResponses`), and a drift still fails loudly here, naming the field.
 */
import type { UserDto } from "@shared/schemas/auth";
import type { FacilityDto } from "@shared/schemas/facility";

type Check = (value: unknown) => boolean;

const isString: Check = (v) => typeof v === "string";
const isNumber: Check = (v) => typeof v === "number" && Number.isFinite(v);
const isBoolean: Check = (v) => typeof v === "boolean";
const orNull = (check: Check): Check => (v) => v === null || check(v);
const listOf = (check: Check): Check => (v) => Array.isArray(v) && v.every(check);

function checked<T>(fields: Record<string, Check>, value: unknown, route: string): T {
  if (typeof value !== "object" || value === null) throw new Error(`The server's answer to ${route} does not match the shared schema ((root): expected an object).`);
  for (const [name, check] of Object.entries(fields)) {
    if (!check((value as Record<string, unknown>)[name])) throw new Error(`The server's answer to ${route} does not match the shared schema (${name}: unexpected value).`);
  }
  return value as T;
}

const USER: Record<string, Check> = {
  id: isNumber,
  email: isString,
  name: isString,
  roles: listOf(isString),
  groupId: orNull(isNumber),
  leadOf: (v) => v === undefined || listOf(isNumber)(v),
  organisation: orNull(isString),
};

/** `{ user }` of GET /api/auth/me and POST /api/auth/login. */
export function sessionUser(data: unknown, route: string): UserDto {
  const { user } = checked<{ user: unknown }>({ user: (v) => typeof v === "object" && v !== null }, data, route);
  const person = checked<UserDto>(USER, user, route);
  return { ...person, leadOf: person.leadOf ?? [] };
}

export function facilityAnswer(data: unknown): FacilityDto {
  return checked<FacilityDto>({ name: isString, timeZone: isString, currency: isString, publicDemo: isBoolean }, data, "GET /api/facility");
}
