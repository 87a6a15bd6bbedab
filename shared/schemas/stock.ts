/**
 * The Stockroom's contract between client and server: chemicals, containers, usage, solution
 * preparation, locations and the safety review. Inputs validate shape and sane ranges here;
 * rules that need the database or a domain computation (CAS check digit, formula, stock left,
 * unit conversion) are checked by the services and answered 422 naming the field.
 */
import { z } from "zod";
import { id, isoDate, pageQuery, searchText } from "./common";
import { locationClassTotals, nfpaClassSchema, storageLimitResultDto } from "./storage";
import { chemicalIon, chemicalIons } from "./ions";

export const CONTAINER_STATUSES = ["sealed", "in_use", "on_hold", "empty", "disposed"] as const;
export const containerStatus = z.enum(CONTAINER_STATUSES);
export type ContainerStatusValue = z.infer<typeof containerStatus>;
export const CONTAINER_STATUS_LABELS: Record<ContainerStatusValue, string> = {
  sealed: "Sealed",
  in_use: "In use",
  on_hold: "On hold",
  empty: "Empty",
  disposed: "Disposed",
};

export const CONTAINER_KINDS = ["bottle", "vial", "solution", "waste"] as const;
export const containerKind = z.enum(CONTAINER_KINDS);
export const CONTAINER_KIND_LABELS: Record<(typeof CONTAINER_KINDS)[number], string> = {
  bottle: "Bottle",
  vial: "Vial",
  solution: "Prepared solution",
  waste: "Waste container",
};

export const LOCATION_TYPES = ["general", "flammable_cabinet", "corrosives_cabinet", "fridge", "bench", "fume_hood", "waste_area"] as const;
export const locationType = z.enum(LOCATION_TYPES);
export const LOCATION_TYPE_LABELS: Record<(typeof LOCATION_TYPES)[number], string> = {
  general: "General",
  flammable_cabinet: "Flammable cabinet",
  corrosives_cabinet: "Corrosives cabinet",
  fridge: "Fridge",
  bench: "Bench",
  fume_hood: "Fume hood",
  waste_area: "Waste area",
};
export const LOCATION_LEVELS = ["building", "room", "cabinet", "shelf"] as const;
export const locationLevel = z.enum(LOCATION_LEVELS);

/** Units a person may log or receive in (see shared/domain/units.ts for the aliases it reads). */
export const STOCK_UNITS = ["mg", "g", "kg", "µL", "mL", "L", "mmol", "mol"] as const;

const finite = (what: string) => z.number({ message: `Enter the ${what} as a number` }).refine(Number.isFinite, `The ${what} must be a finite number`);
const optionalNumber = (what: string, min: number, max: number) =>
  finite(what).min(min, `The ${what} must be at least ${min}`).max(max, `The ${what} must be at most ${max}`).nullable().optional();

// ---------------------------------------------------------------- chemicals

export const chemicalDto = z.object({
  id: z.number(),
  name: z.string(),
  synonyms: z.array(z.string()),
  casNumber: z.string(),
  formula: z.string().nullable(),
  molarMass: z.number().nullable(),
  molarMassOverridden: z.boolean(),
  hazardStatements: z.array(z.string()),
  pictograms: z.array(z.string()),
  signalWord: z.enum(["Danger", "Warning"]).nullable(),
  precautions: z.string(),
  flashPointC: z.number().nullable(),
  boilingPointC: z.number().nullable(),
  densityGPerMl: z.number().nullable(),
  ghsFlammableCategory: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4)]).nullable(),
  nfpaClass: z.enum(["IA", "IB", "IC", "II", "IIIA", "IIIB"]).nullable(),
  carcinogen: z.boolean(),
  acuteToxic: z.boolean(),
  halogenated: z.boolean(),
  storageGroup: z.string(),
  reorderPoint: z.number().nullable(),
  reorderUnit: z.string().nullable(),
  unitCostCents: z.number().nullable(),
  costUnit: z.string().nullable(),
  onHoldReason: z.string().nullable(),
  /** Electrolytes: the ions one formula unit gives (LiCl → Li+ + Cl−), so a run plan can start from the bottle; null otherwise. */
  ions: z.array(chemicalIon).nullable(),
  createdAt: z.string(),
});
export type ChemicalDto = z.infer<typeof chemicalDto>;

export const CHEMICAL_SORTS = ["name", "casNumber", "flashPointC", "createdAt"] as const;
export const chemicalListQuery = pageQuery.extend({
  q: searchText.optional(),
  sort: z.enum(CHEMICAL_SORTS).default("name"),
  dir: z.enum(["asc", "desc"]).default("asc"),
  onHold: z.enum(["true", "false"]).optional(),
});
export type ChemicalListQuery = z.infer<typeof chemicalListQuery>;

export const chemicalInput = z.object({
  name: z.string({ message: "Enter the chemical's name" }).trim().min(1, "Enter the chemical's name").max(200),
  synonyms: z.array(z.string().trim().min(1).max(200)).max(20).optional(),
  // Shape only: the CAS check digit is a rule, checked by the service (422).
  casNumber: z.string({ message: "Enter the CAS number" }).trim().min(1, "Enter the CAS number").max(20),
  formula: z.string().trim().max(200).nullable().optional(),
  molarMass: optionalNumber("molar mass", 0.5, 1e6),
  hazardStatements: z.array(z.string().trim().max(30)).max(60).optional(),
  signalWord: z.enum(["Danger", "Warning"]).nullable().optional(),
  precautions: z.string().max(4000).optional(),
  flashPointC: optionalNumber("flash point", -273, 1000),
  boilingPointC: optionalNumber("boiling point", -273, 6000),
  densityGPerMl: optionalNumber("density", 0.0001, 25),
  carcinogen: z.boolean().optional(),
  acuteToxic: z.boolean().optional(),
  storageGroup: z.string().max(120).optional(),
  reorderPoint: optionalNumber("reorder point", 0, 1e9),
  reorderUnit: z.enum(STOCK_UNITS).nullable().optional(),
  unitCostCents: z.number().int("Give the unit cost in whole cents").min(0).max(1e9).nullable().optional(),
  costUnit: z.enum(STOCK_UNITS).nullable().optional(),
  ions: chemicalIons.optional(),
});
export type ChemicalInput = z.infer<typeof chemicalInput>;
export const chemicalUpdate = chemicalInput.partial();
export type ChemicalUpdate = z.infer<typeof chemicalUpdate>;

export const holdInput = z.object({
  reason: z.string({ message: "Say why it is on hold" }).trim().min(3, "Say why it is on hold (at least 3 characters)").max(1000),
});
export type HoldInput = z.infer<typeof holdInput>;

// ---------------------------------------------------------------- reservations

/** An amount of a container held for a booking's run plan (made by the run plans, shown on the container). */
export const RESERVATION_STATES = ["held", "released", "used"] as const;
export const reservationState = z.enum(RESERVATION_STATES);

export const reservationDto = z.object({
  id: z.number(),
  containerId: z.number(),
  chemicalName: z.string(),
  bookingId: z.number(),
  runPlanId: z.number().nullable(),
  /** In the container's unit. */
  amount: z.number(),
  /** Already drawn on the booking. */
  drawn: z.number(),
  unit: z.string(),
  state: reservationState,
  note: z.string(),
  createdAt: z.string(),
});
export type ReservationDto = z.infer<typeof reservationDto>;

// ---------------------------------------------------------------- containers

export const CONTAINER_ACTIONS = ["draw", "move", "markEmpty", "pourWaste", "dispose", "hold", "release", "seeHistory", "reportProblem", "relabel"] as const;
export const containerAbilities = z.object(Object.fromEntries(CONTAINER_ACTIONS.map((a) => [a, z.boolean()])) as Record<(typeof CONTAINER_ACTIONS)[number], z.ZodBoolean>);
export type ContainerAbilities = z.infer<typeof containerAbilities>;

export const containerDto = z.object({
  id: z.number(),
  chemicalId: z.number(),
  chemicalName: z.string(),
  casNumber: z.string(),
  kind: containerKind,
  quantity: z.number(),
  initialQuantity: z.number(),
  unit: z.string(),
  /** Held for bookings' run plans (in the container's unit); only those bookings draw it. */
  reservedQuantity: z.number(),
  /** quantity − reservedQuantity: what anyone else may draw. */
  freeQuantity: z.number(),
  locationId: z.number().nullable(),
  locationName: z.string().nullable(),
  status: containerStatus,
  openedAt: z.string().nullable(),
  expiresAt: z.string().nullable(),
  retestAt: z.string().nullable(),
  groupId: z.number().nullable(),
  /** An external customer's own container: its organisation; null for the host institution's stock. */
  organisation: z.string().nullable(),
  labelToken: z.string(),
  supplier: z.string(),
  lot: z.string(),
  priceCents: z.number().nullable(),
  concentrationMolPerL: z.number().nullable(),
  holdReason: z.string().nullable(),
  /** The chemical's hold, which applies to every container of it. */
  chemicalHoldReason: z.string().nullable(),
  createdAt: z.string(),
  /** What the signed-in person may do to it, decided by the server's container policy. */
  abilities: containerAbilities,
});
export type ContainerDto = z.infer<typeof containerDto>;

export const CONTAINER_SORTS = ["id", "chemical", "quantity", "status", "expiresAt", "location", "lot"] as const;
export const containerListQuery = pageQuery.extend({
  chemicalId: id().optional(),
  locationId: id().optional(),
  /** One status or several separated by commas. */
  status: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(",").map((x) => x.trim()).filter(Boolean) : undefined))
    .pipe(z.array(containerStatus).optional()),
  kind: containerKind.optional(),
  /** Part of a chemical name, synonym, CAS number or formula, a lot or a supplier; a label code or #number exactly. */
  q: searchText.optional(),
  /** Include containers in the location's sub-locations too. */
  within: z.enum(["true", "false"]).optional(),
  sort: z.enum(CONTAINER_SORTS).default("chemical"),
  dir: z.enum(["asc", "desc"]).default("asc"),
});
export type ContainerListQuery = z.infer<typeof containerListQuery>;

export const usageInput = z.object({
  // Type only: zero, negative and absurd amounts are rules (422), checked with the stock left.
  amount: z.number({ message: "Enter the amount as a number" }),
  unit: z.string({ message: "Choose a unit" }).trim().min(1, "Choose a unit").max(10),
  bookingId: id().nullable().optional(),
  note: z.string().max(500).optional(),
});
export type UsageInput = z.infer<typeof usageInput>;

/** Pouring into a waste container (POST /api/containers/:id/waste). */
export const wasteAddInput = usageInput.pick({ amount: true, unit: true, note: true });
export type WasteAddInput = z.infer<typeof wasteAddInput>;

export const receiveInput = z.object({
  chemicalId: id("Choose the chemical"),
  count: z.number({ message: "Enter how many containers came" }).int("Whole containers only").min(1, "At least one container").max(100, "At most 100 containers per delivery"),
  quantity: finite("size of each container").positive("The size must be above zero").max(1e9),
  unit: z.enum(STOCK_UNITS, { message: "Choose a unit" }),
  kind: z.enum(["bottle", "vial", "waste"]).default("bottle"),
  locationId: id().nullable().optional(),
  supplier: z.string().trim().max(200).default(""),
  lot: z.string().trim().max(200).default(""),
  priceCents: z.number().int("Give the price in whole cents").min(0).max(1e9).nullable().optional(),
  expiresAt: isoDate.nullable().optional(),
  retestAt: isoDate.nullable().optional(),
  groupId: id().nullable().optional(),
  /** An external customer's own containers: its organisation's name, as on its accounts. */
  organisation: z.string().trim().max(200).nullable().optional(),
  /**
   * Receive a flammable or combustible liquid by mass or amount although its chemical has no
   * density: its volume stays unknown and the storage totals say so ("cannot confirm").
   */
  allowUnknownVolume: z.boolean().optional(),
});
export type ReceiveInput = z.infer<typeof receiveInput>;

export const moveInput = z.object({
  locationId: id("Choose where it goes"),
  note: z.string().max(500).optional(),
});
export type MoveInput = z.infer<typeof moveInput>;

export const disposeInput = z.object({ reason: z.string().trim().max(1000).optional() });
export type DisposeInput = z.infer<typeof disposeInput>;

export const movementDto = z.object({
  id: z.number(),
  kind: z.string(),
  fromLocationId: z.number().nullable(),
  fromLocationName: z.string().nullable(),
  toLocationId: z.number().nullable(),
  toLocationName: z.string().nullable(),
  userName: z.string().nullable(),
  note: z.string(),
  at: z.string(),
});
export type MovementDto = z.infer<typeof movementDto>;

/** A usage; who, on which account and at what cost are null unless the reader may see the history (or it is their own). */
export const usageDto = z.object({
  id: z.number(),
  amount: z.number(),
  unit: z.string(),
  amountInContainerUnit: z.number(),
  costCents: z.number().nullable(),
  bookingId: z.number().nullable(),
  accountId: z.number().nullable(),
  userName: z.string().nullable(),
  note: z.string(),
  at: z.string(),
  mine: z.boolean(),
});
export type UsageDto = z.infer<typeof usageDto>;

export const lineageDto = z.object({
  containerId: z.number(),
  chemicalName: z.string(),
  role: z.enum(["solute", "solvent"]),
  amount: z.number(),
  unit: z.string(),
});
export type LineageDto = z.infer<typeof lineageDto>;

export const containerDetailDto = z.object({
  container: containerDto,
  chemical: chemicalDto,
  locationPath: z.string().nullable(),
  movements: z.array(movementDto),
  usages: z.array(usageDto),
  /** Parents this container was prepared from. */
  parents: z.array(lineageDto),
  /** Solutions prepared from this container. */
  children: z.array(lineageDto),
  /** Amounts held (or once held) for bookings' run plans. */
  reservations: z.array(reservationDto),
  /** False when the reader sees the chemical, hazards, quantity, place and state but not the people or the money. */
  historyShown: z.boolean(),
});
export type ContainerDetailDto = z.infer<typeof containerDetailDto>;

// ---------------------------------------------------------------- solutions

export const solutionPlanInput = z.object({
  soluteChemicalId: id("Choose the solute"),
  concentrationMolPerL: finite("concentration").positive("The concentration must be above zero").max(100, "The concentration must be at most 100 mol/L"),
  volumeMl: finite("volume").positive("The volume must be above zero").max(1e6, "The volume must be at most 1 000 000 mL"),
  purityPercent: finite("purity").gt(0, "The purity must be above 0 %").max(100, "The purity must be at most 100 %").optional(),
});
export type SolutionPlanInput = z.infer<typeof solutionPlanInput>;

export const solutionPlanDto = z.object({
  soluteChemicalId: z.number(),
  molarMassGPerMol: z.number(),
  soluteMassG: z.number(),
  pureSoluteMassG: z.number(),
  soluteAmountMol: z.number(),
  finalVolumeMl: z.number(),
  solventVolumeMl: z.number(),
  solventVolumeApproximate: z.boolean(),
  purityPercent: z.number(),
});
export type SolutionPlanDto = z.infer<typeof solutionPlanDto>;

export const prepareSolutionInput = z.object({
  soluteContainerId: id("Choose the solute container"),
  solventContainerId: id("Choose the solvent container"),
  concentrationMolPerL: solutionPlanInput.shape.concentrationMolPerL,
  volumeMl: solutionPlanInput.shape.volumeMl,
  purityPercent: solutionPlanInput.shape.purityPercent,
  /** What the balance showed; the planned mass when left out. */
  massWeighedG: finite("weighed mass").positive("The weighed mass must be above zero").max(1e6).optional(),
  locationId: id().nullable().optional(),
  expiresAt: isoDate.nullable().optional(),
  label: z.string().trim().max(200).optional(),
  bookingId: id().nullable().optional(),
});
export type PrepareSolutionInput = z.infer<typeof prepareSolutionInput>;

// ---------------------------------------------------------------- locations

/** A storage limit on a location, as the safety office entered it (see shared/schemas/storage.ts). */
export const locationLimitDto = z.object({
  id: z.number(),
  classes: z.array(nfpaClassSchema),
  maxLitres: z.number(),
  enteredVolume: z.number(),
  enteredUnit: z.enum(["L", "US gal"]),
  includesCabinets: z.boolean(),
  note: z.string(),
});
export type LocationLimitDto = z.infer<typeof locationLimitDto>;

export const locationDto = z.object({
  id: z.number(),
  parentId: z.number().nullable(),
  level: locationLevel,
  name: z.string(),
  path: z.string(),
  type: locationType,
  /** Limits by fire-code liquid class; the local fire code and the safety office set them. */
  limits: z.array(locationLimitDto),
  limitNote: z.string(),
});
export type LocationDto = z.infer<typeof locationDto>;

export const locationInput = z.object({
  parentId: id().nullable().optional(),
  level: locationLevel,
  name: z.string({ message: "Enter the location's name" }).trim().min(1, "Enter the location's name").max(200),
  type: locationType.default("general"),
  limitNote: z.string().max(1000).default(""),
});
export type LocationInput = z.infer<typeof locationInput>;
export const locationUpdate = locationInput.partial();
export type LocationUpdate = z.infer<typeof locationUpdate>;

// ---------------------------------------------------------------- safety review

export const locationTotalsDto = z.object({
  id: z.number(),
  parentId: z.number().nullable(),
  name: z.string(),
  path: z.string(),
  level: locationLevel,
  type: locationType,
  /** Litres by NFPA 30 liquid class: this location's containers and those of the places inside it. */
  litresByClass: locationClassTotals.shape.litresByClass,
  /** Flammable or combustible liquids here (or inside) whose volume cannot be computed (kept by mass or amount without a density). */
  unknownVolumeContainers: z.number().int().min(0),
  unknownVolumeContainerIds: z.array(z.number()),
  /** Each limit with the litres that count toward it and its finding: within, over or cannot_confirm. */
  limits: z.array(storageLimitResultDto.extend({ unknownVolumeContainers: z.number().int().min(0), note: z.string(), enteredVolume: z.number(), enteredUnit: z.enum(["L", "US gal"]) })),
  limitNote: z.string(),
  /** Some limit is exceeded. */
  overLimit: z.boolean(),
  /** No limit is exceeded by the known volumes, but some limit cannot be confirmed because of unknown volumes. */
  cannotConfirm: z.boolean(),
  containerCount: z.number(),
});
export type LocationTotalsDto = z.infer<typeof locationTotalsDto>;

export const sdsDto = z.object({
  id: z.number(),
  chemicalId: z.number(),
  chemicalName: z.string().optional(),
  originalName: z.string(),
  sizeBytes: z.number(),
  supplier: z.string(),
  reviewedOn: z.string(),
  uploadedAt: z.string(),
  /** The review period has passed since reviewedOn. */
  due: z.boolean(),
});
export type SdsDto = z.infer<typeof sdsDto>;

/** Supplier sheets are a few hundred kB; 10 MB leaves room for scanned ones. */
export const SDS_MAX_BYTES = 10 * 1024 * 1024;

export const sdsUploadFields = z.object({
  reviewedOn: isoDate,
  supplier: z.string().trim().max(200).default(""),
});
