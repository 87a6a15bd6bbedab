/**
 * One change, one rule: each container change reachable from the Stockroom's route and from the
 * Scan page's quick action answers the same for the same people and the same container, and
 * both write the same records (a move writes its movement row either way).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeCabinet, makeContainer, makeDichloroethane, makeGroup } from "../support/label-factories";
import { ContainerMovement } from "../../server/entities";
import type { Role } from "@shared/schemas/auth";

let t: TestApp;
let chemicalId: number;
let ownGroup: number;
let otherGroup: number;
let places: number[];
const people: Record<string, ApiClient> = {};

async function client(roles: Role[], extra: { groupId?: number | null; organisation?: string | null } = {}): Promise<ApiClient> {
  const u = await makeUser(t.ds, { roles, ...extra });
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

beforeAll(async () => {
  t = await startTestApp();
  chemicalId = (await makeDichloroethane(t.ds)).id;
  ownGroup = (await makeGroup(t.ds)).id;
  otherGroup = (await makeGroup(t.ds)).id;
  places = [(await makeCabinet(t.ds, "Cabinet A")).id, (await makeCabinet(t.ds, "Cabinet B")).id];
  people.ownMember = await client(["member"], { groupId: ownGroup });
  people.otherMember = await client(["member"], { groupId: otherGroup });
  people.external = await client(["member"], { organisation: "Tidewater Metals Recovery Ltd" });
  people.manager = await client(["manager"]);
  people.safety = await client(["safety_officer"]);
  people.admin = await client(["admin"]);
});
afterAll(async () => {
  await t.close();
});

const SETUPS = {
  "own group's": { groupId: () => ownGroup },
  "other group's": { groupId: () => otherGroup },
  "shared stock": { groupId: () => null },
  "on hold": { groupId: () => ownGroup, status: "on_hold" as const, holdReason: "Cap liner cracked; do not open" },
  disposed: { groupId: () => ownGroup, status: "disposed" as const },
};

const CHANGES: { name: string; contract: (id: number) => [string, object]; scan: (id: number) => [string, object] }[] = [
  { name: "move", contract: (id: number) => [`/api/containers/${id}/move`, { locationId: places[1] }], scan: (id: number) => [`/api/scan-actions/containers/${id}/move`, { locationId: places[1] }] },
  { name: "mark empty", contract: (id: number) => [`/api/containers/${id}/empty`, {}], scan: (id: number) => [`/api/scan-actions/containers/${id}/empty`, { wasteNote: "" }] },
  { name: "dispose", contract: (id: number) => [`/api/containers/${id}/dispose`, { reason: "Halogenated waste W3" }], scan: (id: number) => [`/api/scan-actions/containers/${id}/dispose`, { wasteNote: "Halogenated waste W3" }] },
];

describe("container changes through the Stockroom's route and the Scan page's", () => {
  for (const change of CHANGES) {
    for (const [setupName, setup] of Object.entries(SETUPS)) {
      it(`${change.name} of a ${setupName} container: every person gets the same answer both ways`, async () => {
        for (const [who, api] of Object.entries(people)) {
          const fresh = async () =>
            (await makeContainer(t.ds, { chemicalId, groupId: setup.groupId(), status: "status" in setup ? setup.status : "in_use", holdReason: "holdReason" in setup ? setup.holdReason : null, locationId: places[0] })).id;
          const a = await fresh();
          const b = await fresh();
          const [pathA, bodyA] = change.contract(a);
          const [pathB, bodyB] = change.scan(b);
          const viaContract = await api.post(pathA, bodyA);
          const viaScan = await api.post(pathB, bodyB);
          expect({ status: viaScan.status, code: viaScan.body?.code }, `${who}: ${change.name} of a ${setupName} container`).toEqual({ status: viaContract.status, code: viaContract.body?.code });
          if (change.name === "move" && viaContract.status === 200) {
            const rows = await t.ds.getRepository(ContainerMovement).findBy([{ containerId: a, kind: "moved" }, { containerId: b, kind: "moved" }]);
            expect(rows.map((r) => r.containerId).sort()).toEqual([a, b].sort());
          }
        }
      });
    }
  }
});
