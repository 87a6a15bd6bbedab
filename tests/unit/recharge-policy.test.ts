/**
 * Recharge's record policies, as tables: every action × every kind of person × the record's
 * states, read through the real policy functions. Kinds of person: a member of the owning
 * research group who may charge the account, a member of another group, an external customer's
 * person, the owning group lead, another group lead (and a lead who is only a member), the
 * manager, the safety officer and the administrator. States: an open and a closed internal
 * account, an external customer's account; statements internal and external, open, declined,
 * paid, queued and of a voided run; runs final, final with a paid invoice, voided.
 */
import { describe, expect, it } from "vitest";
import type { Role } from "@shared/schemas/auth";
import { ORGANISATION_MISMATCH_CODES } from "@shared/schemas/recharge";
import type { Denial } from "../../server/core/policy";
import type { AuthUser } from "../../server/middleware/auth";
import {
  accountPolicy,
  admitMember,
  listsAccount,
  organisationMismatch,
  type AccountFacts,
  type AccountWithMembership,
  type Newcomer,
} from "../../server/modules/recharge/account.policy";
import { statementPolicy, type StatementFacts } from "../../server/modules/recharge/statement.policy";
import { billingPeriodPolicy, billingRunPolicy, type BillingRunFacts } from "../../server/modules/recharge/billing-run.policy";

const TIDEWATER = "Tidewater Marine Research";

const person = (id: number, roles: Role[], more: Partial<AuthUser> = {}): AuthUser => ({
  id,
  email: `p${id}@kestrelbay.example`,
  name: `Person ${id}`,
  roles,
  groupId: null,
  leadOf: [],
  organisation: null,
  ...more,
});

const LEAD = person(1, ["group_lead", "member"], { groupId: 1, leadOf: [1] });
const MEMBER = person(2, ["member"], { groupId: 1 });
const OTHER_MEMBER = person(3, ["member"], { groupId: 2 });
const CUSTOMER = person(4, ["member"], { organisation: TIDEWATER });
const OTHER_LEAD = person(5, ["group_lead", "member"], { groupId: 2, leadOf: [2] });
const LEAD_AS_MEMBER = person(6, ["group_lead", "member"], { groupId: 3, leadOf: [3] });
const MANAGER = person(7, ["manager", "member"]);
const SAFETY = person(8, ["safety_officer"]);
const ADMIN = person(9, ["admin"]);

const INTERNAL: AccountFacts = { id: 1, code: "CHEM-0001", kind: "internal", organisation: null, ownerId: LEAD.id, chargeable: true };
const CLOSED: AccountFacts = { ...INTERNAL, id: 2, code: "CHEM-OLD", chargeable: false };
const EXTERNAL: AccountFacts = { id: 3, code: "EXT-0001-TMR", kind: "external", organisation: TIDEWATER, ownerId: null, chargeable: true };

const member = (exceptionReason: string | null = null) => ({ exceptionReason });
const rec = (account: AccountFacts, membership: { exceptionReason: string | null } | null = null): AccountWithMembership => ({ account, membership });

/** "ok", or "<status> <code>". */
const said = (d: Denial | null) => (d ? `${d.status} ${d.code}` : "ok");

const ACCOUNT_ACTIONS = ["view", "manageMembers", "addMember", "makeException", "edit", "adjust", "charge"] as const;

// Each row: who, which account with what membership, then the answer for every action in
// ACCOUNT_ACTIONS order, and whether the account list shows it.
const NO = "403 not_account_owner";
const MGR = "403 manager_only";
const EXC = "403 exception_manager_only";
const HIDDEN = "404 not_found";
const NOT_ALLOWED = "403 account_not_allowed";
const accountTable: [string, AuthUser, AccountWithMembership, string[], boolean][] = [
  ["the owning group's member, on the account they charge", MEMBER, rec(INTERNAL, member()), ["ok", NO, NO, EXC, MGR, MGR, "ok"], true],
  ["a member of another group", OTHER_MEMBER, rec(INTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["an external customer's person let onto an internal account without an exception", CUSTOMER, rec(INTERNAL, member()), ["ok", NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["an external customer's person let on by the manager's exception", CUSTOMER, rec(INTERNAL, member("Joint project with the host lab, 2026")), ["ok", NO, NO, EXC, MGR, MGR, "ok"], true],
  ["an external customer's person not on it", CUSTOMER, rec(INTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["the owning group lead", LEAD, rec(INTERNAL), ["ok", "ok", "ok", EXC, MGR, MGR, "ok"], true],
  ["a group lead who is only a member", LEAD_AS_MEMBER, rec(INTERNAL, member()), ["ok", NO, NO, EXC, MGR, MGR, "ok"], true],
  ["another group lead", OTHER_LEAD, rec(INTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["the manager", MANAGER, rec(INTERNAL), ["ok", "ok", "ok", "ok", "ok", "ok", "ok"], true],
  ["the safety officer", SAFETY, rec(INTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["the administrator", ADMIN, rec(INTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  // A closed account: still seen by those who saw it (old statements), nobody new is added, and members no longer find it in their list.
  ["the owning group lead, closed account", LEAD, rec(CLOSED), ["ok", "ok", "422 account_not_valid", EXC, MGR, MGR, "ok"], true],
  ["the manager, closed account", MANAGER, rec(CLOSED), ["ok", "ok", "422 account_not_valid", "ok", "ok", "ok", "ok"], true],
  ["the owning group's member, closed account", MEMBER, rec(CLOSED, member()), ["ok", NO, NO, EXC, MGR, MGR, "ok"], false],
  // The external customer's own account.
  ["the customer's person, on their organisation's account", CUSTOMER, rec(EXTERNAL, member()), ["ok", NO, NO, EXC, MGR, MGR, "ok"], true],
  ["a host-institution member put on the customer's account without an exception", MEMBER, rec(EXTERNAL, member()), ["ok", NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["a host-institution member not on the customer's account", MEMBER, rec(EXTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
  ["the manager, customer's account", MANAGER, rec(EXTERNAL), ["ok", "ok", "ok", "ok", "ok", "ok", "ok"], true],
  ["the safety officer, customer's account", SAFETY, rec(EXTERNAL), [HIDDEN, NO, NO, EXC, MGR, MGR, NOT_ALLOWED], false],
];

describe("the account policy", () => {
  describe.each(accountTable)("%s", (_label, actor, record, answers, listed) => {
    it.each(ACCOUNT_ACTIONS.map((action, i) => [action, answers[i]] as const))("%s → %s", (action, answer) => {
      expect(said(accountPolicy.check(actor, action, record))).toBe(answer);
      expect(accountPolicy.abilities(actor, record)[action]).toBe(answer === "ok");
    });
    it(`${listed ? "lists" : "does not list"} the account`, () => {
      expect(listsAccount(actor, record)).toBe(listed);
    });
  });
});

describe("organisationMismatch", () => {
  const cases: [string, AccountFacts, string | null, string][] = [
    ["a host-institution person on an internal account", INTERNAL, null, "ok"],
    ["a customer's person on an internal account", INTERNAL, TIDEWATER, "422 external_person_internal_account"],
    ["a host-institution person on a customer's account", EXTERNAL, null, "422 internal_person_external_account"],
    ["the customer's own person (however the name is cased and spaced)", EXTERNAL, "  tidewater marine RESEARCH ", "ok"],
    ["another customer's person on a customer's account", EXTERNAL, "Harbour Analytical Ltd", "422 other_organisation"],
  ];
  it.each(cases)("%s → %s", (_label, account, organisation, answer) => {
    expect(said(organisationMismatch(account, { id: 40, name: "Newcomer", organisation }))).toBe(answer);
  });
  it("answers only with the codes the client knows to offer an exception for", () => {
    const codes = cases.map(([, account, organisation]) => organisationMismatch(account, { id: 40, name: "N", organisation })?.code).filter(Boolean);
    expect(new Set(codes)).toEqual(new Set(ORGANISATION_MISMATCH_CODES));
  });
});

describe("admitting a new member", () => {
  const HOST: Newcomer = { id: 40, name: "Host Person", organisation: null };
  const OUTSIDER: Newcomer = { id: 41, name: "Customer Person", organisation: TIDEWATER };
  const WHY = "Joint grant with Tidewater, signed off in May";
  type Case = [string, AuthUser, AccountFacts, Newcomer, { exceptionReason?: string; existingException?: string }, string, string | null];
  const cases: Case[] = [
    ["the lead adds a host-institution person", LEAD, INTERNAL, HOST, {}, "ok", null],
    ["the lead adds a customer's person", LEAD, INTERNAL, OUTSIDER, {}, "422 external_person_internal_account", null],
    ["the lead sends an exception for a customer's person", LEAD, INTERNAL, OUTSIDER, { exceptionReason: WHY }, EXC, null],
    ["the lead sends an exception where none is needed", LEAD, INTERNAL, HOST, { exceptionReason: WHY }, EXC, null],
    ["the lead changes the cap of someone the manager excused", LEAD, INTERNAL, OUTSIDER, { existingException: WHY }, "ok", WHY],
    ["the lead adds to a closed account", LEAD, CLOSED, HOST, {}, "422 account_not_valid", null],
    ["another lead adds to the account", OTHER_LEAD, INTERNAL, HOST, {}, NO, null],
    ["a member adds to the account", MEMBER, INTERNAL, HOST, {}, NO, null],
    ["the manager adds a customer's person without saying why", MANAGER, INTERNAL, OUTSIDER, {}, "422 external_person_internal_account", null],
    ["the manager adds a customer's person as an exception", MANAGER, INTERNAL, OUTSIDER, { exceptionReason: WHY }, "ok", WHY],
    ["the manager sends an exception where none is needed (not kept)", MANAGER, INTERNAL, HOST, { exceptionReason: WHY }, "ok", null],
    ["the manager adds a host person to the customer's account as an exception", MANAGER, EXTERNAL, HOST, { exceptionReason: WHY }, "ok", WHY],
    ["the manager adds the customer's own person", MANAGER, EXTERNAL, OUTSIDER, {}, "ok", null],
  ];
  it.each(cases)("%s → %s", (_label, actor, account, newcomer, opts, answer, kept) => {
    const a = admitMember(actor, rec(account), newcomer, opts);
    expect(said(a.denial)).toBe(answer);
    if (!a.denial) expect(a.exceptionReason).toBe(kept);
  });
});

// ---- statements ----------------------------------------------------------------------------

const stmt = (over: Partial<StatementFacts>): StatementFacts => ({
  id: 10,
  accountKind: "external",
  accountOwnerId: null,
  actorIsMember: false,
  runStatus: "final",
  invoiceStatus: "open",
  invoiceUrl: "https://pay.example/in_1",
  ...over,
});
const INT_STATEMENT = { accountKind: "internal", accountOwnerId: LEAD.id, invoiceStatus: "none", invoiceUrl: null } as const;
const S_HIDDEN = "404 not_found";

// who, statement (with the actor's membership), download, pay
const statementTable: [string, AuthUser, StatementFacts, string, string][] = [
  ["the owning lead, internal statement", LEAD, stmt(INT_STATEMENT), "ok", "422 internal_statement"],
  ["a member of the internal account (their charges are on My charges)", MEMBER, stmt({ ...INT_STATEMENT, actorIsMember: true }), S_HIDDEN, S_HIDDEN],
  ["a member of another group, internal statement", OTHER_MEMBER, stmt(INT_STATEMENT), S_HIDDEN, S_HIDDEN],
  ["another group lead, internal statement", OTHER_LEAD, stmt(INT_STATEMENT), S_HIDDEN, S_HIDDEN],
  ["the manager, internal statement", MANAGER, stmt(INT_STATEMENT), "ok", "422 internal_statement"],
  ["the safety officer, internal statement", SAFETY, stmt(INT_STATEMENT), S_HIDDEN, S_HIDDEN],
  ["the administrator, internal statement", ADMIN, stmt(INT_STATEMENT), S_HIDDEN, S_HIDDEN],
  ["the customer's person, open invoice", CUSTOMER, stmt({ actorIsMember: true }), "ok", "ok"],
  ["the customer's person, declined payment (still open)", CUSTOMER, stmt({ actorIsMember: true, invoiceStatus: "payment_failed" }), "ok", "ok"],
  ["the customer's person, paid invoice", CUSTOMER, stmt({ actorIsMember: true, invoiceStatus: "paid" }), "ok", "409 invoice_paid"],
  ["the customer's person, invoice still queued", CUSTOMER, stmt({ actorIsMember: true, invoiceStatus: "queued", invoiceUrl: null }), "ok", "409 invoice_not_open"],
  ["the customer's person, voided run", CUSTOMER, stmt({ actorIsMember: true, runStatus: "voided" }), "ok", "409 run_voided"],
  ["another customer's person", person(11, ["member"], { organisation: "Harbour Analytical Ltd" }), stmt({}), S_HIDDEN, S_HIDDEN],
  ["a host member, customer's statement", MEMBER, stmt({}), S_HIDDEN, S_HIDDEN],
  ["the manager, customer's open invoice", MANAGER, stmt({}), "ok", "ok"],
  ["the manager, customer's paid invoice", MANAGER, stmt({ invoiceStatus: "paid" }), "ok", "409 invoice_paid"],
  ["the safety officer, customer's statement", SAFETY, stmt({}), S_HIDDEN, S_HIDDEN],
  ["the administrator, customer's statement", ADMIN, stmt({}), S_HIDDEN, S_HIDDEN],
];

describe("the statement policy", () => {
  it.each(statementTable)("%s: download → %s, pay → %s", (_label, actor, facts, download, pay) => {
    expect(said(statementPolicy.check(actor, "download", facts))).toBe(download);
    expect(said(statementPolicy.check(actor, "pay", facts))).toBe(pay);
    expect(statementPolicy.abilities(actor, facts)).toEqual({ download: download === "ok", pay: pay === "ok" });
  });
});

// ---- billing runs --------------------------------------------------------------------------

const run = (over: Partial<BillingRunFacts>): BillingRunFacts => ({ id: 20, period: "2026-11", status: "final", paidInvoices: 0, ...over });
const RUN_MGR = "403 manager_only";
const NOT_MANAGERS: [string, AuthUser][] = [
  ["a member", MEMBER],
  ["the owning group lead", LEAD],
  ["an external customer's person", CUSTOMER],
  ["the safety officer", SAFETY],
  ["the administrator", ADMIN],
];

// who, run, void, journal, reversal
const runTable: [string, AuthUser, BillingRunFacts, string, string, string][] = [
  ["the manager, a final run", MANAGER, run({}), "ok", "ok", "409 run_not_void"],
  ["the manager, a final run with a paid invoice", MANAGER, run({ paidInvoices: 1 }), "409 invoice_paid", "ok", "409 run_not_void"],
  ["the manager, a voided run", MANAGER, run({ status: "voided" }), "409 already_void", "ok", "ok"],
  ...NOT_MANAGERS.flatMap(([label, who]): [string, AuthUser, BillingRunFacts, string, string, string][] => [
    [`${label}, a final run`, who, run({}), RUN_MGR, RUN_MGR, RUN_MGR],
    [`${label}, a voided run`, who, run({ status: "voided" }), RUN_MGR, RUN_MGR, RUN_MGR],
  ]),
];

describe("the billing-run policy", () => {
  it.each(runTable)("%s: void → %s, journal → %s, reversal → %s", (_label, actor, facts, voiding, journal, reversal) => {
    expect(said(billingRunPolicy.check(actor, "void", facts))).toBe(voiding);
    expect(said(billingRunPolicy.check(actor, "journal", facts))).toBe(journal);
    expect(said(billingRunPolicy.check(actor, "reversal", facts))).toBe(reversal);
    expect(billingRunPolicy.abilities(actor, facts)).toEqual({ void: voiding === "ok", journal: journal === "ok", reversal: reversal === "ok" });
  });

  const periodTable: [string, AuthUser, number | null, string][] = [
    ["the manager, a month not yet billed", MANAGER, null, "ok"],
    ["the manager, a month with a final run", MANAGER, 20, "409 period_final"],
    ...NOT_MANAGERS.map(([label, who]): [string, AuthUser, number | null, string] => [`${label}, a month not yet billed`, who, null, "403 manager_only"]),
  ];
  it.each(periodTable)("finalising a month: %s → %s", (_label, actor, finalRunId, answer) => {
    expect(said(billingPeriodPolicy.check(actor, "finalise", { period: "2026-11", finalRunId }))).toBe(answer);
  });
});
