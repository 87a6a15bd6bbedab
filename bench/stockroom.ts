/**
 * Stockroom benchmark scenarios for `npm run bench` (issue 4, "Speed"): seeds 20 000 containers
 * (`count`: 200 000 with BENCH_SCALE=10) into a given data source and describes the routes to
 * measure, next to the baselines the runner measures in the same run:
 *  - the Stockroom search (text + filters, one page of 50) at 50 connections: throughput at
 *    least 0.3 of the signed-in baseline's (GET /api/auth/me, the same session stack alone);
 *  - the same search at 10 connections: p99 under 30 ms;
 *  - one usage decrement (POST /api/containers/:id/usage, serialised write) at 10 connections:
 *    p99 under 25 ms.
 * Every scenario needs a signed-in session: the runner signs in with `signIn` (POST
 * /api/auth/login), fetches GET /api/auth/csrf, and sends the cookie and x-csrf-token header
 * with each request. See bench/README.md.
 */
import crypto from "node:crypto";
import type { DataSource } from "typeorm";
import { hashPassword } from "../server/modules/people";

export interface BenchGoal {
  /** Requests per second at least this share of the signed-in baseline's (GET /api/auth/me), measured in the same run. */
  ratioToSignedIn?: number;
  /** 99th-percentile latency below this many milliseconds. */
  p99MsBelow?: number;
}

export interface BenchScenario {
  name: string;
  method: "GET" | "POST";
  path: string;
  body?: unknown;
  connections: number;
  goal: BenchGoal;
  /** The scenario needs the signed-in session (cookie + CSRF token) of `signIn`. */
  session: true;
}

export interface StockroomBench {
  signIn: { email: string; password: string };
  scenarios: BenchScenario[];
  containerCount: number;
}

export const BENCH_CONTAINERS = 20_000;
const BENCH_CHEMICALS = 200;
const STEMS = ["chloride", "bromide", "nitrate", "sulfate", "perchlorate", "acetate", "phosphate", "borate"];
const CATIONS = ["Lithium", "Sodium", "Potassium", "Tetrabutylammonium", "Tetramethylammonium", "Caesium", "Magnesium", "Calcium"];
const STATUSES = ["sealed", "in_use", "in_use", "in_use", "empty", "on_hold", "disposed"];

/** A CAS-shaped number with a correct check digit (CAS check-digit rule), unique per index. */
function casFor(i: number): string {
  const body = String(100000 + i * 7);
  const digits = body + "12";
  let sum = 0;
  for (let k = 0; k < digits.length; k++) sum += Number(digits[digits.length - 1 - k]) * (k + 1);
  return `${body}-12-${sum % 10}`;
}

async function insertMany(ds: DataSource, table: string, columns: string[], rows: unknown[][], batch = 400): Promise<void> {
  const cols = columns.map((c) => `"${c}"`).join(", ");
  for (let i = 0; i < rows.length; i += batch) {
    const part = rows.slice(i, i + batch);
    const placeholders = part.map(() => `(${columns.map(() => "?").join(", ")})`).join(", ");
    await ds.query(`INSERT INTO "${table}" (${cols}) VALUES ${placeholders}`, part.flat());
  }
}

/** Seeds the bench data (into a migrated, otherwise empty or demo database) and returns the scenarios. */
export async function seedStockroomBench(ds: DataSource, opts: { count?: number; now?: Date } = {}): Promise<StockroomBench> {
  const count = opts.count ?? BENCH_CONTAINERS;
  const now = (opts.now ?? new Date()).toISOString();
  const email = `bench-${crypto.randomBytes(4).toString("hex")}@kestrelbay.example`;
  const password = "bench-password-1234";

  await ds.transaction(async (em) => {
    const userRes = (await em.query(
      `INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, 'Bench Runner', ?, 1, ?, ?, ?) RETURNING id`,
      [email, await hashPassword(password, 10), crypto.randomBytes(18).toString("base64url"), now, now],
    )) as { id: number }[];
    await em.query(`INSERT INTO user_roles (userId, role) VALUES (?, 'member')`, [userRes[0].id]);
  });

  const locStart = Number(((await ds.query(`SELECT COALESCE(MAX(id), 0) AS m FROM locations`)) as { m: number }[])[0].m);
  const locationRows: unknown[][] = [[null, "building", "Bench Building", "general", ""]];
  for (let r = 0; r < 10; r++) locationRows.push([locStart + 1, "room", `Bench room ${r + 1}`, "general", "Example only"]);
  for (let r = 0; r < 10; r++) for (let c = 0; c < 4; c++) locationRows.push([locStart + 2 + r, "cabinet", `Cabinet ${r + 1}-${c + 1}`, "flammable_cabinet", "Example only"]);
  await insertMany(ds, "locations", ["parentId", "level", "name", "type", "limitNote"], locationRows);
  const cabinetIds = Array.from({ length: 40 }, (_, k) => locStart + 12 + k);
  // Storage limits by fire-code class (location_limits): 80 L per room, a cabinet's 227.12 L (60 US gal) of
  // Class I–II and 454.25 L (120 US gal) of Class III liquids. Example figures only, as in the demo.
  const limitRows: unknown[][] = [];
  for (let r = 0; r < 10; r++) limitRows.push([locStart + 2 + r, '["IA","IB","IC","II"]', 80, 80, "L", 1, "Example only", now]);
  for (const id of cabinetIds) {
    limitRows.push([id, '["IA","IB","IC","II"]', 227.12, 60, "US gal", 1, "Example only", now]);
    limitRows.push([id, '["IIIA","IIIB"]', 454.25, 120, "US gal", 1, "Example only", now]);
  }
  await insertMany(ds, "location_limits", ["locationId", "classes", "maxLitres", "enteredVolume", "enteredUnit", "includesCabinets", "note", "createdAt"], limitRows);

  const chemStart = Number(((await ds.query(`SELECT COALESCE(MAX(id), 0) AS m FROM chemicals`)) as { m: number }[])[0].m);
  const chemicalRows: unknown[][] = [];
  for (let i = 0; i < BENCH_CHEMICALS; i++) {
    const name = `${CATIONS[i % CATIONS.length]} ${STEMS[Math.floor(i / CATIONS.length) % STEMS.length]} grade ${Math.floor(i / 64) + 1}`;
    const liquid = i % 5 === 0;
    chemicalRows.push([name, "[]", casFor(i), null, liquid ? 100 : 58.44, 0, "[]", "[]", null, "", liquid ? 15 : null, liquid ? 80 : null, liquid ? 1.1 : null, 0, 0, "", null, null, 5, liquid ? "mL" : "g", now]);
  }
  await insertMany(
    ds,
    "chemicals",
    ["name", "synonyms", "casNumber", "formula", "molarMass", "molarMassOverridden", "hazardStatements", "pictograms", "signalWord", "precautions", "flashPointC", "boilingPointC", "densityGPerMl", "carcinogen", "acuteToxic", "storageGroup", "reorderPoint", "reorderUnit", "unitCostCents", "costUnit", "createdAt"],
    chemicalRows,
  );

  const containerRows: unknown[][] = [];
  for (let i = 0; i < count; i++) {
    const chem = i % BENCH_CHEMICALS;
    const liquid = chem % 5 === 0;
    const status = STATUSES[i % STATUSES.length];
    const day = String(1 + (i % 28)).padStart(2, "0");
    containerRows.push([
      chemStart + 1 + chem,
      "bottle",
      status === "empty" || status === "disposed" ? 0 : 50 + (i % 400),
      500,
      liquid ? "mL" : "g",
      cabinetIds[i % cabinetIds.length],
      status,
      status === "sealed" ? null : now,
      `2027-${String(1 + (i % 12)).padStart(2, "0")}-${day}`,
      crypto.randomBytes(18).toString("base64url"),
      "Bench Supplier",
      `LOT-${i}`,
      1000,
      status === "on_hold" ? "bench hold" : null,
      now,
    ]);
  }
  await insertMany(
    ds,
    "containers",
    ["chemicalId", "kind", "quantity", "initialQuantity", "unit", "locationId", "status", "openedAt", "expiresAt", "labelToken", "supplier", "lot", "priceCents", "holdReason", "createdAt"],
    containerRows,
  );

  // One bottle that never runs out, for the decrement scenario: a tiny amount per request.
  const big = (await ds.query(
    `INSERT INTO containers (chemicalId, kind, quantity, initialQuantity, unit, locationId, status, labelToken, supplier, lot, createdAt)
     VALUES (?, 'bottle', 1e9, 1e9, 'mL', ?, 'in_use', ?, 'Bench Supplier', 'LOT-BIG', ?) RETURNING id`,
    [chemStart + 1, cabinetIds[0], crypto.randomBytes(18).toString("base64url"), now],
  )) as { id: number }[];
  await ds.query("ANALYZE");

  const search = `/api/containers?q=chloride&status=sealed,in_use&locationId=${cabinetIds[3]}&sort=chemical&limit=50`;
  return {
    signIn: { email, password },
    containerCount: count + 1,
    scenarios: [
      { name: "stockroom search (text + filters, one page) ×50", method: "GET", path: search, connections: 50, goal: { ratioToSignedIn: 0.3 }, session: true },
      { name: "stockroom search (text + filters, one page) ×10", method: "GET", path: search, connections: 10, goal: { p99MsBelow: 30 }, session: true },
      {
        name: "usage decrement ×10",
        method: "POST",
        path: `/api/containers/${big[0].id}/usage`,
        body: { amount: 0.001, unit: "mL" },
        connections: 10,
        goal: { p99MsBelow: 25 },
        session: true,
      },
    ],
  };
}
