/**
 * The invented organisation of the demo: Kestrel Bay University's three departments that use
 * the Liquid Interfaces Core, their research groups, and the people who sign in. The seven
 * addresses on @kestrelbay.example / @tidewater.example are the contract's demo accounts
 * (API.md); everyone else is here so that lists, training and spend have some variety.
 */
import type { Role } from "@shared/schemas/auth";

export const DEMO_PASSWORD = "phasebook-demo";
export const DEMO_UNIVERSITY = "Kestrel Bay University";
export const DEMO_FACILITY = "Liquid Interfaces Core";

export type DepartmentCode = "CHEM" | "CPE" | "EES";
export type GroupKey = "soft" | "separations" | "geochem";

export const DEMO_DEPARTMENTS: ReadonlyArray<{ code: DepartmentCode; name: string }> = [
  { code: "CHEM", name: "Chemistry" },
  { code: "CPE", name: "Chemical and Process Engineering" },
  { code: "EES", name: "Earth and Environmental Sciences" },
];

export const DEMO_GROUPS: ReadonlyArray<{ key: GroupKey; name: string; department: DepartmentCode; lead: PersonKey }> = [
  { key: "soft", name: "Soft Interfaces Group", department: "CHEM", lead: "lead" },
  { key: "separations", name: "Reactive Separations Group", department: "CPE", lead: "cpeLead" },
  { key: "geochem", name: "Aqueous Geochemistry Group", department: "EES", lead: "eesLead" },
];

export type PersonKey =
  | "member"
  | "member2"
  | "lead"
  | "manager"
  | "safety"
  | "admin"
  | "buyer"
  | "cpeLead"
  | "eesLead"
  | "postdoc"
  | "expiringStudent"
  | "industryGuest"
  | "eesStudent";

export interface DemoPerson {
  key: PersonKey;
  email: string;
  name: string;
  roles: Role[];
  department: DepartmentCode | null;
  group: GroupKey | null;
  /** An external customer's organisation (as on its account); left out: the host institution's own people. */
  organisation?: string;
  /** Who this person is in the story; not stored, it explains the choice of data. */
  story: string;
}

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  {
    key: "member",
    email: "member@kestrelbay.example",
    name: "Priya Nandakumar",
    roles: ["member"],
    department: "CHEM",
    group: "soft",
    story: "Third-year PhD student; trained on two potentiostats and two interface cells.",
  },
  {
    key: "member2",
    email: "member2@kestrelbay.example",
    name: "Owen Threlkeld",
    roles: ["member"],
    department: "CHEM",
    group: "soft",
    story: "First-year PhD student, not trained on anything yet.",
  },
  {
    key: "lead",
    email: "lead@kestrelbay.example",
    name: "Dr. Marguerite Solberg",
    roles: ["group_lead", "member"],
    department: "CHEM",
    group: "soft",
    story: "Leads the Soft Interfaces Group and owns its accounts.",
  },
  {
    key: "manager",
    email: "manager@kestrelbay.example",
    name: "Dr. Callum Ferreira",
    roles: ["manager", "member"],
    department: "CHEM",
    group: null,
    story: "Runs the Liquid Interfaces Core; grants training and runs billing.",
  },
  {
    key: "safety",
    email: "safety@kestrelbay.example",
    name: "Rosalind Achterberg",
    roles: ["safety_officer", "member"],
    department: "CHEM",
    group: null,
    story: "Departmental safety officer for the Halvorsen Chemistry Building.",
  },
  {
    key: "admin",
    email: "admin@kestrelbay.example",
    name: "Dev Ramaswamy",
    roles: ["admin"],
    department: null,
    group: null,
    story: "Keeps people, roles and facility settings.",
  },
  {
    key: "buyer",
    email: "buyer@tidewater.example",
    name: "Elena Marsh",
    roles: ["member"],
    department: null,
    group: null,
    organisation: "Tidewater Metals Recovery Ltd",
    story: "Process chemist at Tidewater Metals Recovery Ltd, the external customer who pays by card.",
  },
  {
    key: "cpeLead",
    email: "tomasz.brennan@kestrelbay.example",
    name: "Prof. Tomasz Brennan",
    roles: ["group_lead", "member"],
    department: "CPE",
    group: "separations",
    story: "Leads the Reactive Separations Group (metal extraction across liquid|liquid interfaces).",
  },
  {
    key: "eesLead",
    email: "aroha.ngata@kestrelbay.example",
    name: "Dr. Aroha Ngata",
    roles: ["group_lead", "member"],
    department: "EES",
    group: "geochem",
    story: "Leads the Aqueous Geochemistry Group.",
  },
  {
    key: "postdoc",
    email: "kofi.mensah@kestrelbay.example",
    name: "Dr. Kofi Mensah",
    roles: ["member"],
    department: "CHEM",
    group: "soft",
    story: "Postdoc back from a long field campaign; his cell and potentiostat training has expired.",
  },
  {
    key: "expiringStudent",
    email: "hana.kurosawa@kestrelbay.example",
    name: "Hana Kurosawa",
    roles: ["member"],
    department: "CPE",
    group: "separations",
    story: "PhD student whose training expires in twelve days.",
  },
  {
    key: "industryGuest",
    email: "mateus.oliveira@kestrelbay.example",
    name: "Mateus Oliveira",
    roles: ["member"],
    department: "CPE",
    group: "separations",
    story: "Industry guest researcher on a six-month visit; one training record was revoked.",
  },
  {
    key: "eesStudent",
    email: "saoirse.delaney@kestrelbay.example",
    name: "Saoirse Delaney",
    roles: ["member"],
    department: "EES",
    group: "geochem",
    story: "MSc student measuring metal ion transfer for groundwater remediation.",
  },
];
