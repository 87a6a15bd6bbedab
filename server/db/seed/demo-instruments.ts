/**
 * The demo's instruments and who is trained on them. Names are our own (shorebirds of the bay
 * for the potentiostats, letters for the cells); no vendor names. Booking rules follow the
 * brief: interface cells need 30 minutes of cleaning and drying between users, the
 * micro-interface cell and the glovebox need the manager's approval, the rest confirm at once.
 */
import type { InstrumentKind, InstrumentStatus } from "../../entities/instrument.entity";
import type { BookableHours } from "@shared/domain/booking-rules";
import type { LocationKey } from "./demo-locations";
import type { PersonKey } from "./demo-people";

const weekdays = (from: string, to: string): BookableHours => ({
  mon: [{ from, to }],
  tue: [{ from, to }],
  wed: [{ from, to }],
  thu: [{ from, to }],
  fri: [{ from, to }],
  sat: [],
  sun: [],
});

export const OFFICE_HOURS = weekdays("08:00", "18:00");

/** A 25 µm-diameter orifice: area = π r², r = 12.5 µm = 1.25 × 10⁻³ cm. */
const MICRO_HOLE_AREA_CM2 = Math.PI * 1.25e-3 ** 2;

export type InstrumentKey =
  | "tern"
  | "plover"
  | "curlew"
  | "godwit"
  | "cellA"
  | "cellB"
  | "cellC"
  | "microCell"
  | "shaker"
  | "uvVis"
  | "glovebox";

export interface DemoInstrument {
  key: InstrumentKey;
  name: string;
  kind: InstrumentKind;
  status: InstrumentStatus;
  model: string;
  serialNumber: string;
  description: string;
  location: LocationKey;
  fourElectrode: boolean;
  interfaceAreaCm2: number | null;
  /** Interface cells only (example values, invented for the demo; the manager keeps the real ones). */
  interfaceRadiusCm?: number | null;
  aqueousFillMl?: number | null;
  organicFillMl?: number | null;
  trainingRequired: boolean;
  requiresApproval: boolean;
  cleaningBufferMinutes: number;
  minLeadMinutes: number;
  maxLengthMinutes: number;
  bookableHours: BookableHours;
  afterHoursAllowed: boolean;
}

const potentiostat = (
  key: InstrumentKey,
  name: string,
  serial: string,
  over: Partial<DemoInstrument> = {},
): DemoInstrument => ({
  key,
  name,
  kind: "potentiostat",
  status: "in_service",
  model: "Four-electrode potentiostat/galvanostat, ±10 V compliance",
  serialNumber: serial,
  description: "Drives a four-electrode liquid|liquid cell: two reference and two counter electrodes.",
  location: "interfaceLab",
  fourElectrode: true,
  interfaceAreaCm2: null,
  trainingRequired: true,
  requiresApproval: false,
  cleaningBufferMinutes: 0,
  minLeadMinutes: 60,
  maxLengthMinutes: 720,
  bookableHours: OFFICE_HOURS,
  afterHoursAllowed: true,
  ...over,
});

const cell = (
  key: InstrumentKey,
  name: string,
  serial: string,
  areaCm2: number,
  over: Partial<DemoInstrument> = {},
): DemoInstrument => ({
  key,
  name,
  kind: "interface_cell",
  status: "in_service",
  model: "Glass four-electrode cell with Luggin capillaries",
  serialNumber: serial,
  description: `Water | organic interface of ${areaCm2} cm². Rinse with acetone and water, then dry, after each run.`,
  location: "interfaceLab",
  fourElectrode: false,
  interfaceAreaCm2: areaCm2,
  // Example fill volumes of a four-electrode glass cell (invented for the demo).
  aqueousFillMl: areaCm2 >= 1 ? 5 : 3,
  organicFillMl: areaCm2 >= 1 ? 4 : 2.5,
  trainingRequired: true,
  requiresApproval: false,
  cleaningBufferMinutes: 30,
  minLeadMinutes: 60,
  maxLengthMinutes: 480,
  bookableHours: OFFICE_HOURS,
  afterHoursAllowed: false,
  ...over,
});

export const DEMO_INSTRUMENTS: readonly DemoInstrument[] = [
  potentiostat("tern", "Tern – four-electrode potentiostat", "LIC-P-001"),
  potentiostat("plover", "Plover – four-electrode potentiostat", "LIC-P-002"),
  potentiostat("curlew", "Curlew – four-electrode potentiostat", "LIC-P-003", {
    status: "under_maintenance",
    description: "Away for calibration of the current ranges; back in service when the manager says so.",
  }),
  potentiostat("godwit", "Godwit – three-electrode potentiostat", "LIC-P-004", {
    model: "Three-electrode potentiostat, ±10 V compliance",
    description: "Three-electrode only: for solid-electrode voltammetry and checking redox probes, not for liquid|liquid cells.",
    fourElectrode: false,
    cleaningBufferMinutes: 10,
    maxLengthMinutes: 480,
    afterHoursAllowed: false,
  }),
  cell("cellA", "Interface cell A – 1.53 cm²", "LIC-C-001", 1.53, { afterHoursAllowed: true }),
  cell("cellB", "Interface cell B – 1.53 cm²", "LIC-C-002", 1.53),
  cell("cellC", "Interface cell C – 0.50 cm²", "LIC-C-003", 0.5),
  cell("microCell", "Micro-interface cell M1 – 25 µm", "LIC-C-010", Number(MICRO_HOLE_AREA_CM2.toPrecision(4)), {
    model: "Micro-interface cell: 25 µm hole in a polyester film",
    description: "Single micro-hole interface for steady-state ion-transfer voltammetry. The film is fragile: ask the manager first.",
    requiresApproval: true,
    // The hole's radius; the film separates two small reservoirs (example volumes).
    interfaceRadiusCm: 1.25e-3,
    aqueousFillMl: 2,
    organicFillMl: 1.5,
  }),
  {
    key: "shaker",
    name: "Fume-hood shaker station",
    kind: "support",
    status: "in_service",
    model: "Orbital shaker in fume hood FH-2",
    serialNumber: "LIC-S-001",
    description: "Two-phase equilibration and extraction in the hood; halogenated solvents only here.",
    location: "hoodInterface",
    fourElectrode: false,
    interfaceAreaCm2: null,
    trainingRequired: true,
    requiresApproval: false,
    cleaningBufferMinutes: 15,
    minLeadMinutes: 60,
    maxLengthMinutes: 480,
    bookableHours: OFFICE_HOURS,
    afterHoursAllowed: false,
  },
  {
    key: "uvVis",
    name: "UV-vis spectrometer",
    kind: "support",
    status: "in_service",
    model: "Double-beam UV-vis spectrometer, 190–1100 nm",
    serialNumber: "LIC-S-002",
    description: "For checking solution concentrations and partition experiments.",
    location: "interfaceLab",
    fourElectrode: false,
    interfaceAreaCm2: null,
    trainingRequired: false,
    requiresApproval: false,
    cleaningBufferMinutes: 0,
    minLeadMinutes: 0,
    maxLengthMinutes: 240,
    bookableHours: OFFICE_HOURS,
    afterHoursAllowed: false,
  },
  {
    key: "glovebox",
    name: "Argon glovebox",
    kind: "support",
    status: "in_service",
    model: "Single-station argon glovebox with antechamber",
    serialNumber: "LIC-S-003",
    description: "For weighing moisture-sensitive borate salts. Book the antechamber cycle time into your slot.",
    location: "interfaceLab",
    fourElectrode: false,
    interfaceAreaCm2: null,
    trainingRequired: true,
    requiresApproval: true,
    cleaningBufferMinutes: 15,
    minLeadMinutes: 120,
    maxLengthMinutes: 480,
    bookableHours: weekdays("09:00", "17:00"),
    afterHoursAllowed: false,
  },
];

export interface DemoTraining {
  person: PersonKey;
  instrument: InstrumentKey;
  /** Days from the seeding moment. */
  grantedDays: number;
  /** null: never expires. */
  expiresDays: number | null;
  afterHours: boolean;
  revokedDays?: number;
  notes: string;
}

/**
 * Training is renewed yearly in the story (grant date = expiry − 365 days). The set holds
 * current, expiring (< 30 days), expired and revoked records; member2 has none.
 */
export const DEMO_TRAINING: readonly DemoTraining[] = [
  { person: "member", instrument: "tern", grantedDays: -65, expiresDays: 300, afterHours: true, notes: "After-hours endorsement after lone-working induction." },
  { person: "member", instrument: "plover", grantedDays: -65, expiresDays: 300, afterHours: false, notes: "" },
  { person: "member", instrument: "cellA", grantedDays: -65, expiresDays: 300, afterHours: true, notes: "After-hours endorsement after lone-working induction." },
  { person: "member", instrument: "cellC", grantedDays: -85, expiresDays: 280, afterHours: false, notes: "" },
  { person: "member", instrument: "shaker", grantedDays: -65, expiresDays: 300, afterHours: false, notes: "" },
  { person: "lead", instrument: "tern", grantedDays: -120, expiresDays: 245, afterHours: true, notes: "" },
  { person: "lead", instrument: "cellA", grantedDays: -120, expiresDays: 245, afterHours: true, notes: "" },
  { person: "lead", instrument: "microCell", grantedDays: -120, expiresDays: 245, afterHours: false, notes: "" },
  { person: "expiringStudent", instrument: "plover", grantedDays: -353, expiresDays: 12, afterHours: false, notes: "Renewal due: book a refresher with the manager." },
  { person: "expiringStudent", instrument: "cellB", grantedDays: -353, expiresDays: 12, afterHours: false, notes: "" },
  { person: "postdoc", instrument: "tern", grantedDays: -385, expiresDays: -20, afterHours: false, notes: "" },
  { person: "postdoc", instrument: "cellB", grantedDays: -385, expiresDays: -20, afterHours: false, notes: "" },
  { person: "postdoc", instrument: "glovebox", grantedDays: -100, expiresDays: 265, afterHours: false, notes: "" },
  {
    person: "industryGuest",
    instrument: "tern",
    grantedDays: -40,
    expiresDays: 140,
    afterHours: false,
    revokedDays: -9,
    notes: "Revoked: ran a cell outside the hood with 1,2-dichloroethane. Retrain before booking again.",
  },
  { person: "industryGuest", instrument: "cellB", grantedDays: -40, expiresDays: 140, afterHours: false, notes: "Guest visit ends with the training period." },
  { person: "eesStudent", instrument: "plover", grantedDays: -200, expiresDays: 165, afterHours: false, notes: "" },
  { person: "eesStudent", instrument: "cellB", grantedDays: -200, expiresDays: 165, afterHours: false, notes: "" },
  { person: "eesStudent", instrument: "uvVis", grantedDays: -200, expiresDays: null, afterHours: false, notes: "No expiry: walk-up instrument." },
];
