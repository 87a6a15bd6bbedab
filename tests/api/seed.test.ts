/**
 * The demo seed against a real database built from the migrations: the contract's demo
 * accounts (API.md), the training, accounts and stock they promise, the safety findings the
 * demo is meant to show, and that seeding twice adds nothing.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import bcrypt from "bcryptjs";
import { BCRYPT_COST } from "../../server/core/passwords";
import type { DataSource } from "typeorm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { isValidCas } from "@shared/domain/cas";
import { hazardLabel, isAcutelyToxic, isCarcinogen } from "@shared/domain/hazards";
import { openDatabase } from "../../server/db/data-source";
import { seedDemo } from "../../server/db/seed/demo";

const NOW = new Date("2026-03-02T15:00:00.000Z");
const NOW_ISO = NOW.toISOString();
const TODAY = NOW_ISO.slice(0, 10);
const IN_30_DAYS_ISO = new Date(NOW.getTime() + 30 * 24 * 60 * 60 * 1000).toISOString();

let dir: string;
let ds: DataSource;
let firstRun: { seeded: boolean };

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "pb-"));
  ds = await openDatabase(path.join(dir, "seed.db"));
  // The configured cost, as the seed uses without a test's lower one (about half a second, once).
  firstRun = await seedDemo(ds, { now: NOW });
});

afterAll(async () => {
  await ds?.destroy();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function userId(email: string): Promise<number> {
  const rows: Array<{ id: number }> = await ds.query(`SELECT id FROM users WHERE email = ?`, [email]);
  expect(rows, `user ${email}`).toHaveLength(1);
  return rows[0].id;
}

/** Training that lets the person book the instrument at NOW: not revoked, not expired, instrument in service. */
async function currentTrainingKinds(email: string): Promise<string[]> {
  const rows: Array<{ kind: string }> = await ds.query(
    `SELECT i.kind AS kind FROM training_records t JOIN instruments i ON i.id = t.instrumentId
     WHERE t.userId = ? AND t.revokedAt IS NULL AND (t.expiresAt IS NULL OR t.expiresAt > ?) AND i.status = 'in_service'`,
    [await userId(email), NOW_ISO],
  );
  return rows.map((r) => r.kind);
}

/** Internal accounts valid today that the person may charge. */
async function chargeableInternalAccounts(email: string): Promise<string[]> {
  const rows: Array<{ code: string }> = await ds.query(
    `SELECT a.code AS code FROM account_members m JOIN accounts a ON a.id = m.accountId
     WHERE m.userId = ? AND a.kind = 'internal' AND a.active = 1
       AND (a.validFrom IS NULL OR a.validFrom <= ?) AND (a.validTo IS NULL OR a.validTo >= ?)`,
    [await userId(email), TODAY, TODAY],
  );
  return rows.map((r) => r.code);
}

describe("seedDemo", () => {
  it("seeds an empty database and records when in the demo_seeded setting", async () => {
    expect(firstRun).toEqual({ seeded: true });
    const rows: Array<{ value: string }> = await ds.query(`SELECT value FROM settings WHERE key = 'demo_seeded'`);
    expect(rows).toHaveLength(1);
    expect(JSON.parse(rows[0].value)).toEqual({ at: NOW_ISO });
  });

  describe("demo accounts (API.md)", () => {
    const expected: Record<string, string[]> = {
      "member@kestrelbay.example": ["member"],
      "member2@kestrelbay.example": ["member"],
      "lead@kestrelbay.example": ["group_lead", "member"],
      "manager@kestrelbay.example": ["manager", "member"],
      "safety@kestrelbay.example": ["member", "safety_officer"],
      "admin@kestrelbay.example": ["admin"],
      "buyer@tidewater.example": ["member"],
    };

    it.each(Object.entries(expected))("creates %s with roles %j", async (email, roles) => {
      const rows: Array<{ role: string }> = await ds.query(
        `SELECT r.role AS role FROM user_roles r JOIN users u ON u.id = r.userId WHERE u.email = ? AND u.active = 1 ORDER BY r.role`,
        [email],
      );
      expect(rows.map((r) => r.role)).toEqual(roles);
    });

    it("gives every demo person the password phasebook-demo, hashed at the configured cost, and no one a wrong one", async () => {
      const rows: Array<{ email: string; passwordHash: string }> = await ds.query(`SELECT email, passwordHash FROM users`);
      expect(rows.length).toBeGreaterThanOrEqual(11);
      // One comparison per distinct hash: at cost 12 each takes about half a second.
      const hashes = [...new Set(rows.map((r) => r.passwordHash))];
      for (const h of hashes) {
        expect(bcrypt.getRounds(h)).toBe(BCRYPT_COST);
        expect(await bcrypt.compare("phasebook-demo", h)).toBe(true);
      }
      expect(await bcrypt.compare("phasebook-demo!", rows[0].passwordHash)).toBe(false);
    });

    it("gives each person their own calendar token", async () => {
      const rows: Array<{ calendarToken: string }> = await ds.query(`SELECT calendarToken FROM users`);
      const tokens = rows.map((r) => r.calendarToken);
      expect(new Set(tokens).size).toBe(tokens.length);
      for (const t of tokens) expect(t.length).toBeGreaterThanOrEqual(32);
    });

    it("names buyer@'s organisation exactly as the external customer's account does, and nobody else's", async () => {
      const people: Array<{ email: string; organisation: string | null }> = await ds.query(`SELECT email, organisation FROM users WHERE organisation IS NOT NULL`);
      expect(people).toEqual([{ email: "buyer@tidewater.example", organisation: "Tidewater Metals Recovery Ltd" }]);
      const [account] = await ds.query(
        `SELECT a.organisation FROM accounts a JOIN account_members m ON m.accountId = a.id JOIN users u ON u.id = m.userId
         WHERE u.email = 'buyer@tidewater.example' AND a.kind = 'external'`,
      );
      expect(account.organisation).toBe(people[0].organisation);
    });

    it("puts every Kestrel Bay researcher in a department and the external buyer in none", async () => {
      const rows: Array<{ email: string; departmentId: number | null; groupId: number | null }> = await ds.query(
        `SELECT email, departmentId, groupId FROM users`,
      );
      const buyer = rows.find((r) => r.email === "buyer@tidewater.example");
      expect(buyer?.departmentId).toBeNull();
      const member = rows.find((r) => r.email === "member@kestrelbay.example");
      expect(member?.departmentId).not.toBeNull();
      expect(member?.groupId).not.toBeNull();
      const departments: Array<{ code: string }> = await ds.query(`SELECT code FROM departments ORDER BY code`);
      expect(departments.map((d) => d.code)).toEqual(["CHEM", "CPE", "EES"]);
      const groups: Array<{ leadId: number | null }> = await ds.query(`SELECT leadId FROM research_groups`);
      expect(groups).toHaveLength(3);
      for (const g of groups) expect(g.leadId).not.toBeNull();
    });
  });

  describe("training", () => {
    it("has member@ currently trained on at least one potentiostat and one interface cell", async () => {
      const kinds = await currentTrainingKinds("member@kestrelbay.example");
      expect(kinds.filter((k) => k === "potentiostat").length).toBeGreaterThanOrEqual(1);
      expect(kinds.filter((k) => k === "interface_cell").length).toBeGreaterThanOrEqual(1);
    });

    it("gives member@ an after-hours endorsement on a current record", async () => {
      const rows = await ds.query(
        `SELECT id FROM training_records WHERE userId = ? AND afterHours = 1 AND revokedAt IS NULL AND expiresAt > ?`,
        [await userId("member@kestrelbay.example"), NOW_ISO],
      );
      expect(rows.length).toBeGreaterThanOrEqual(1);
    });

    it("has member2@ trained on nothing", async () => {
      const rows = await ds.query(`SELECT id FROM training_records WHERE userId = ?`, [await userId("member2@kestrelbay.example")]);
      expect(rows).toHaveLength(0);
    });

    it("holds a record expiring within 30 days, an expired one and a revoked one, all granted by the manager", async () => {
      const expiring = await ds.query(
        `SELECT id FROM training_records WHERE revokedAt IS NULL AND expiresAt > ? AND expiresAt <= ?`,
        [NOW_ISO, IN_30_DAYS_ISO],
      );
      const expired = await ds.query(`SELECT id FROM training_records WHERE revokedAt IS NULL AND expiresAt <= ?`, [NOW_ISO]);
      const revoked = await ds.query(`SELECT id FROM training_records WHERE revokedAt IS NOT NULL`);
      expect(expiring.length).toBeGreaterThanOrEqual(1);
      expect(expired.length).toBeGreaterThanOrEqual(1);
      expect(revoked.length).toBeGreaterThanOrEqual(1);
      const grantors: Array<{ grantedById: number }> = await ds.query(`SELECT DISTINCT grantedById FROM training_records`);
      expect(grantors.map((g) => g.grantedById)).toEqual([await userId("manager@kestrelbay.example")]);
    });

    it("writes an audit entry for each training grant", async () => {
      const [{ records }] = await ds.query(`SELECT COUNT(*) AS records FROM training_records`);
      const [{ grants }] = await ds.query(`SELECT COUNT(*) AS grants FROM audit_log WHERE action = 'training.granted'`);
      expect(grants).toBe(records);
    });
  });

  describe("instruments", () => {
    it("has several of each kind, one under maintenance, with random label tokens", async () => {
      const rows: Array<{ kind: string; status: string; labelToken: string }> = await ds.query(
        `SELECT kind, status, labelToken FROM instruments`,
      );
      for (const kind of ["potentiostat", "interface_cell", "support"]) {
        expect(rows.filter((r) => r.kind === kind).length, kind).toBeGreaterThanOrEqual(3);
      }
      expect(rows.filter((r) => r.status === "under_maintenance")).toHaveLength(1);
      expect(new Set(rows.map((r) => r.labelToken)).size).toBe(rows.length);
      // 24 random bytes in base64url are 32 characters; a token made from the id would be short.
      for (const r of rows) expect(r.labelToken).toMatch(/^[A-Za-z0-9_-]{32}$/);
    });

    it("gives interface cells a 30-minute cleaning buffer and asks approval for the micro-interface cell and the glovebox", async () => {
      const cells: Array<{ cleaningBufferMinutes: number }> = await ds.query(
        `SELECT cleaningBufferMinutes FROM instruments WHERE kind = 'interface_cell'`,
      );
      for (const c of cells) expect(c.cleaningBufferMinutes).toBe(30);
      const approval: Array<{ name: string }> = await ds.query(`SELECT name FROM instruments WHERE requiresApproval = 1 ORDER BY name`);
      expect(approval.map((a) => a.name)).toEqual([expect.stringMatching(/glovebox/i), expect.stringMatching(/micro-interface/i)]);
    });

    it("stores bookable hours on weekdays only", async () => {
      const rows: Array<{ bookableHours: string }> = await ds.query(`SELECT bookableHours FROM instruments`);
      for (const r of rows) {
        const hours = JSON.parse(r.bookableHours) as Record<string, Array<{ from: string; to: string }>>;
        expect(hours.mon?.length).toBe(1);
        expect(hours.fri?.length).toBe(1);
        expect(hours.sat ?? []).toEqual([]);
        expect(hours.sun ?? []).toEqual([]);
      }
    });
  });

  describe("accounts", () => {
    it("lets member@ and member2@ charge an internal account that is valid today", async () => {
      expect((await chargeableInternalAccounts("member@kestrelbay.example")).length).toBeGreaterThanOrEqual(1);
      expect((await chargeableInternalAccounts("member2@kestrelbay.example")).length).toBeGreaterThanOrEqual(1);
    });

    it("makes lead@ the owner of internal accounts", async () => {
      const rows = await ds.query(`SELECT id FROM accounts WHERE ownerId = ? AND kind = 'internal'`, [await userId("lead@kestrelbay.example")]);
      expect(rows.length).toBeGreaterThanOrEqual(2);
    });

    it("bills Tidewater Metals Recovery Ltd as a commercial external customer whose member is buyer@", async () => {
      const rows: Array<{ id: number; customerClass: string; billingEmail: string }> = await ds.query(
        `SELECT id, customerClass, billingEmail FROM accounts WHERE kind = 'external' AND organisation = 'Tidewater Metals Recovery Ltd'`,
      );
      expect(rows).toHaveLength(1);
      expect(rows[0].customerClass).toBe("commercial");
      expect(rows[0].billingEmail).toBe("buyer@tidewater.example");
      const members: Array<{ userId: number }> = await ds.query(`SELECT userId FROM account_members WHERE accountId = ?`, [rows[0].id]);
      expect(members.map((m) => m.userId)).toEqual([await userId("buyer@tidewater.example")]);
    });

    it("stores validity as calendar dates", async () => {
      const rows: Array<{ validFrom: string | null; validTo: string | null }> = await ds.query(`SELECT validFrom, validTo FROM accounts`);
      for (const r of rows) {
        for (const d of [r.validFrom, r.validTo]) if (d !== null) expect(d).toMatch(/^\d{4}-\d{2}-\d{2}$/);
      }
    });
  });

  describe("stock", () => {
    async function usableContainers(cas: string): Promise<number> {
      const memberGroup: Array<{ groupId: number }> = await ds.query(`SELECT groupId FROM users WHERE email = 'member@kestrelbay.example'`);
      const rows = await ds.query(
        `SELECT c.id FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
         WHERE ch.casNumber = ? AND c.kind <> 'waste' AND c.status IN ('sealed', 'in_use') AND c.quantity > 0
           AND (c.expiresAt IS NULL OR c.expiresAt >= ?) AND (c.groupId IS NULL OR c.groupId = ?)`,
        [cas, TODAY, memberGroup[0].groupId],
      );
      return rows.length;
    }

    it("holds 1,2-dichloroethane (107-06-2) and lithium chloride (7447-41-8) in containers the member may use", async () => {
      expect(await usableContainers("107-06-2")).toBeGreaterThanOrEqual(1);
      expect(await usableContainers("7447-41-8")).toBeGreaterThanOrEqual(1);
    });

    it("gives every demo chemical a CAS number that passes the check digit (CAS check-digit rule)", async () => {
      const rows: Array<{ casNumber: string }> = await ds.query(`SELECT casNumber FROM chemicals`);
      expect(rows.length).toBeGreaterThanOrEqual(12);
      for (const r of rows) expect(isValidCas(r.casNumber), r.casNumber).toBe(true);
    });

    it("stores 1,2-dichloroethane's published data", async () => {
      const [dce] = await ds.query(`SELECT * FROM chemicals WHERE casNumber = '107-06-2'`);
      expect(dce.formula).toBe("C2H4Cl2");
      expect(dce.densityGPerMl).toBe(1.2569); // Merck Index, 20 °C
      expect(dce.boilingPointC).toBe(83.5); // IARC Monographs vol. 71
      expect(dce.flashPointC).toBe(13); // Merck Index, closed cup
      expect(dce.signalWord).toBe("Danger"); // suppliers' safety data sheets
      expect(JSON.parse(dce.hazardStatements)).toEqual(expect.arrayContaining(["H225", "H302", "H315", "H319", "H335", "H350"]));
      expect(dce.carcinogen).toBe(1);
    });

    it("computes molar masses from IUPAC/CIAAW 2021 abridged atomic weights", async () => {
      const rows: Array<{ casNumber: string; molarMass: number }> = await ds.query(`SELECT casNumber, molarMass FROM chemicals`);
      const byCas = new Map(rows.map((r) => [r.casNumber, r.molarMass]));
      // Molar masses summed from the IUPAC/CIAAW 2021 abridged standard atomic weights (Prohaska et al., Pure Appl. Chem. 94 (2022) 573–600).
      expect(byCas.get("7447-41-8")).toBeCloseTo(42.39, 2); // LiCl
      expect(byCas.get("7647-14-5")).toBeCloseTo(58.44, 2); // NaCl
      expect(byCas.get("7447-40-7")).toBeCloseTo(74.55, 2); // KCl
      expect(byCas.get("107-06-2")).toBeCloseTo(98.95, 2); // C2H4Cl2
      expect(byCas.get("1112-67-0")).toBeCloseTo(277.92, 2); // C16H36ClN
      expect(byCas.get("102-54-5")).toBeCloseTo(186.04, 2); // C10H10Fe
    });

    it("weighs the borate etherate with the bottle form's molar mass, marked as overridden", async () => {
      const [row] = await ds.query(`SELECT formula, molarMass, molarMassOverridden FROM chemicals WHERE name LIKE '%etherate%'`);
      expect(row.molarMassOverridden).toBe(1);
      // LiB(C6F5)4 · 2.5 (C2H5)2O by hand, IUPAC/CIAAW 2021 abridged: C 12.011, H 1.008, Li 6.94,
      // B 10.81, O 15.999, F 18.998. Salt 24·12.011 + 10.81 + 20·18.998 + 6.94 = 685.974;
      // ether 4·12.011 + 10·1.008 + 15.999 = 74.123.
      expect(row.molarMass).toBeCloseTo(685.974 + 2.5 * 74.123, 2);
    });

    it("labels each chemical with the pictograms and signal word its H-codes call for (UN GHS 1.4.10.5)", async () => {
      const rows: Array<{ name: string; hazardStatements: string; pictograms: string; signalWord: string | null; carcinogen: number; acuteToxic: number }> =
        await ds.query(`SELECT name, hazardStatements, pictograms, signalWord, carcinogen, acuteToxic FROM chemicals`);
      for (const r of rows) {
        const codes = JSON.parse(r.hazardStatements) as string[];
        const label = hazardLabel(codes);
        expect(label.unknownCodes, r.name).toEqual([]);
        expect((JSON.parse(r.pictograms) as string[]).sort(), r.name).toEqual(label.pictograms);
        if (label.signalWord === "none") expect(r.signalWord, r.name).toBeNull();
        else if (label.signalWord === "undetermined") expect(r.signalWord, r.name).not.toBeNull();
        else expect(r.signalWord, r.name).toBe(label.signalWord);
        expect(r.carcinogen === 1, r.name).toBe(isCarcinogen(codes));
        expect(r.acuteToxic === 1, r.name).toBe(isAcutelyToxic(codes));
      }
    });

    it("keeps a halogenated waste container of 1,2-dichloroethane in the waste area", async () => {
      const rows = await ds.query(
        `SELECT c.id FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId JOIN locations l ON l.id = c.locationId
         WHERE c.kind = 'waste' AND ch.casNumber = '107-06-2' AND l.type = 'waste_area'`,
      );
      expect(rows).toHaveLength(1);
    });

    it("keeps a prepared 10 mM lithium chloride solution", async () => {
      const rows: Array<{ concentrationMolPerL: number; unit: string }> = await ds.query(
        `SELECT c.concentrationMolPerL, c.unit FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
         WHERE c.kind = 'solution' AND ch.casNumber = '7447-41-8'`,
      );
      expect(rows).toHaveLength(1);
      expect(rows[0].concentrationMolPerL).toBe(0.01);
      expect(rows[0].unit).toBe("mL");
    });

    it("has containers in every state the safety review looks for: on hold with a reason, empty, expired, expiring", async () => {
      const onHold: Array<{ holdReason: string | null }> = await ds.query(`SELECT holdReason FROM containers WHERE status = 'on_hold'`);
      expect(onHold.length).toBeGreaterThanOrEqual(1);
      for (const c of onHold) expect(c.holdReason).toBeTruthy();
      expect((await ds.query(`SELECT id FROM containers WHERE status = 'empty'`)).length).toBeGreaterThanOrEqual(1);
      expect((await ds.query(`SELECT id FROM containers WHERE expiresAt < ?`, [TODAY])).length).toBeGreaterThanOrEqual(1);
      const in30 = IN_30_DAYS_ISO.slice(0, 10);
      expect((await ds.query(`SELECT id FROM containers WHERE expiresAt >= ? AND expiresAt <= ?`, [TODAY, in30])).length).toBeGreaterThanOrEqual(1);
    });
  });

  describe("storage limits", () => {
    it("labels every configured limit as an example", async () => {
      const rows: Array<{ note: string }> = await ds.query(`SELECT note FROM location_limits`);
      expect(rows.length).toBeGreaterThanOrEqual(5);
      for (const r of rows) expect(r.note).toMatch(/^Example only/);
    });

    it("keeps the 60-gallon cabinet's limit as 227.124707 L (60 × 3.785 411 784 L, OSHA 29 CFR 1910.106(d)(3); the US gallon per NIST Handbook 44 App. C)", async () => {
      const rows: Array<{ maxLitres: number; enteredVolume: number; enteredUnit: string }> = await ds.query(
        `SELECT maxLitres, enteredVolume, enteredUnit FROM location_limits WHERE enteredUnit = 'US gal' AND enteredVolume = 60`,
      );
      expect(rows).toHaveLength(1);
      expect(rows[0].maxLitres).toBeCloseTo(60 * 3.785411784, 9);
    });

    it("has limits of the kinds the fire codes set: a class alone, Class I together, Classes I + II + IIIA together, with and without cabinets", async () => {
      const rows: Array<{ classes: string; includesCabinets: number }> = await ds.query(`SELECT classes, includesCabinets FROM location_limits`);
      const sets = rows.map((r) => (JSON.parse(r.classes) as string[]).join("+"));
      expect(sets).toEqual(expect.arrayContaining(["IA", "IA+IB+IC", "IA+IB+IC+II+IIIA"]));
      expect(rows.some((r) => !r.includesCabinets)).toBe(true);
    });

    it("overfills exactly one cabinet's Class I + II limit (NFPA 30 closed-cup thresholds: Class I below 100 °F = 37.8 °C, Class II below 140 °F = 60 °C)", async () => {
      const rows: Array<{ locationId: number; limit: number; quantity: number; unit: string; flashPointC: number | null }> = await ds.query(
        `SELECT l.id AS locationId, ll.maxLitres AS "limit", c.quantity, c.unit, ch.flashPointC
           FROM locations l JOIN location_limits ll ON ll.locationId = l.id AND ll.classes = '["IA","IB","IC","II"]'
           JOIN containers c ON c.locationId = l.id JOIN chemicals ch ON ch.id = c.chemicalId
          WHERE l.level = 'cabinet' AND c.status NOT IN ('empty', 'disposed')`,
      );
      const litres = new Map<number, { limit: number; total: number }>();
      for (const r of rows) {
        if (r.flashPointC === null || r.flashPointC >= 60) continue;
        expect(r.unit).toBe("mL");
        const entry = litres.get(r.locationId) ?? { limit: r.limit, total: 0 };
        entry.total += r.quantity / 1000;
        litres.set(r.locationId, entry);
      }
      const over = [...litres.values()].filter((e) => e.total > e.limit);
      expect(over).toHaveLength(1);
      expect(over[0].limit).toBe(10);
    });
  });

  it("adds nothing when run a second time", async () => {
    const tables: Array<{ name: string }> = await ds.query(
      `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name`,
    );
    const counts = async () => {
      const out: Record<string, number> = {};
      for (const t of tables) out[t.name] = (await ds.query(`SELECT COUNT(*) AS n FROM "${t.name}"`))[0].n;
      return out;
    };
    const before = await counts();
    expect(before.users).toBeGreaterThan(0);
    const again = await seedDemo(ds, { now: new Date(NOW.getTime() + 86_400_000), bcryptCost: 4 });
    expect(again).toEqual({ seeded: false });
    expect(await counts()).toEqual(before);
  });
});
