/**
 * The words at the head of the screens that say the same to everyone. The screens show them
 * (PageHeader); the server writes them into a signed-in page load (server/http/page-boot.ts), so
 * the page says what it is at its first paint, before its code has arrived. (Who may open each
 * area is shared/areas.ts: the client's first chunk needs that, not these words.)
 */

export interface ScreenHead {
  title: string;
  description: string;
}

export const SCREEN_HEADS = {
  schedule: {
    title: "Schedule",
    description:
      "Select a free range to book it. Book a potentiostat and an interface cell together; a cleaning buffer follows each session on the cells. Drag or stretch your own bookings that have not started to move them.",
  },
  approvals: { title: "Approval queue", description: "Requests on instruments that need your approval. Approving checks the Schedule again." },
  utilisation: { title: "Utilisation", description: "Booked and used hours against bookable hours, per instrument and month." },
  scheduleSettings: {
    title: "Setups and booking policy",
    description: "Rules for the whole facility. Each instrument's own rules (approval, lead time, cleaning buffer, bookable hours) are on its page.",
  },
  myBookings: {
    title: "My bookings",
    description: "Check in when you start and out when you finish: billing uses those times. Cancel in good time so others can use the instrument.",
  },
  instruments: {
    title: "Instruments",
    description: "Potentiostats, interface cells and support equipment, with their status and booking rules. A run usually books a potentiostat and a cell together.",
  },
  training: { title: "Training", description: "Who may use which instrument, until when, and who may work after hours." },
  stockroom: { title: "Stockroom", description: "Every container's quantity, place and state, and the chemicals with their hazard data." },
  receive: { title: "Receive a delivery", description: "One line per delivery: Phasebook makes a container with its own label for each bottle." },
  prepare: {
    title: "Prepare a solution",
    description: "Phasebook computes the mass to weigh, records the concentration you actually made, and deducts both containers.",
  },
  stockImport: {
    title: "Import from CSV",
    description:
      "Line 1 holds the column names; every row is checked with the same rules as the forms. If any row is wrong, nothing is imported. Import the chemicals before their containers.",
  },
  runPlanNew: {
    title: "Plan a run",
    description:
      "Choose the two phases' electrolytes and the ions you want to see; Phasebook shows the window, where each ion transfers, its current, and what to weigh.",
  },
  scan: { title: "Scan", description: "Point the camera at the QR label on a bottle, a vial or a cell to open its record." },
  recharge: { title: "Recharge", description: "Rates per customer class, monthly statements, the finance journal and invoices for external customers." },
  safety: {
    title: "Safety review",
    description:
      "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.",
  },
  safetyLocations: {
    title: "Locations and limits",
    description: "Buildings, rooms, cabinets and shelves, with the flammable-liquid limits the safety office sets.",
  },
  people: {
    title: "People",
    description: "Everyone with a Phasebook account. Roles decide what each person sees; deactivated people cannot sign in.",
  },
  system: { title: "System", description: "Whether mail goes out, card invoices reach the payment service, and the nightly backup works." },
  profile: { title: "Profile", description: "Your account. Your name and roles are changed by an administrator." },
} as const satisfies Record<string, ScreenHead>;
export type ScreenHeadName = keyof typeof SCREEN_HEADS;
