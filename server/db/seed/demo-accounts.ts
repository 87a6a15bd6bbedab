/**
 * The demo's billing accounts: internal cost centres and grants owned by the group leads, and
 * two external customers. Codes, names and caps are invented; validity is in days from the
 * seeding moment so the demo always has a live grant, a closed one and one ending soon.
 */
import type { AccountKind, CustomerClass } from "../../entities/account.entity";
import type { DepartmentCode, PersonKey } from "./demo-people";

export interface DemoAccount {
  code: string;
  name: string;
  kind: AccountKind;
  customerClass: CustomerClass;
  department: DepartmentCode | null;
  owner: PersonKey | null;
  /** Days from the seeding moment; null leaves the date open. */
  validFromDays: number | null;
  validToDays: number | null;
  organisation: string | null;
  billingEmail: string | null;
  /** Who may charge it; a cap is in cents per calendar month, null for none. */
  members: ReadonlyArray<{ person: PersonKey; monthlyCapCents: number | null }>;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  {
    code: "CHEM-4410-SIG",
    name: "Soft Interfaces Group – operating cost centre",
    kind: "internal",
    customerClass: "internal",
    department: "CHEM",
    owner: "lead",
    validFromDays: -400,
    validToDays: 730,
    organisation: null,
    billingEmail: null,
    members: [
      { person: "member", monthlyCapCents: null },
      { person: "member2", monthlyCapCents: 40_000 },
      { person: "postdoc", monthlyCapCents: null },
      { person: "lead", monthlyCapCents: null },
    ],
  },
  {
    code: "CHEM-7720-ITG",
    name: "Ion transfer at soft interfaces – research grant",
    kind: "internal",
    customerClass: "internal",
    department: "CHEM",
    owner: "lead",
    validFromDays: -200,
    validToDays: 165,
    organisation: null,
    billingEmail: null,
    members: [
      { person: "member", monthlyCapCents: 150_000 },
      { person: "postdoc", monthlyCapCents: 150_000 },
    ],
  },
  {
    // Closed grant: still listed for old statements, no longer chargeable.
    code: "CHEM-3105-PFG",
    name: "Pilot fund for micro-interface arrays (closed)",
    kind: "internal",
    customerClass: "internal",
    department: "CHEM",
    owner: "lead",
    validFromDays: -730,
    validToDays: -31,
    organisation: null,
    billingEmail: null,
    members: [{ person: "member", monthlyCapCents: null }],
  },
  {
    code: "CPE-5102-RSG",
    name: "Reactive Separations – metal extraction grant",
    kind: "internal",
    customerClass: "internal",
    department: "CPE",
    owner: "cpeLead",
    validFromDays: -300,
    validToDays: 430,
    organisation: null,
    billingEmail: null,
    members: [
      { person: "expiringStudent", monthlyCapCents: null },
      { person: "industryGuest", monthlyCapCents: 60_000 },
      { person: "cpeLead", monthlyCapCents: null },
    ],
  },
  {
    code: "EES-2207-AQG",
    name: "Aqueous Geochemistry Group – operating cost centre",
    kind: "internal",
    customerClass: "internal",
    department: "EES",
    owner: "eesLead",
    validFromDays: -500,
    validToDays: 20,
    organisation: null,
    billingEmail: null,
    members: [{ person: "eesStudent", monthlyCapCents: 25_000 }],
  },
  {
    code: "EXT-0001-TMR",
    name: "Tidewater Metals Recovery Ltd",
    kind: "external",
    customerClass: "commercial",
    department: null,
    owner: null,
    validFromDays: -90,
    validToDays: null,
    organisation: "Tidewater Metals Recovery Ltd",
    billingEmail: "buyer@tidewater.example",
    members: [{ person: "buyer", monthlyCapCents: null }],
  },
  {
    code: "EXT-0002-NCU",
    name: "Northcape University – Marine Electrochemistry Lab",
    kind: "external",
    customerClass: "external_academic",
    department: null,
    owner: null,
    validFromDays: -150,
    validToDays: 215,
    organisation: "Northcape University, Department of Ocean Sciences",
    billingEmail: "lab-accounts@northcape.example",
    members: [],
  },
];
