/**
 * The quick actions a scanned label offers that no other part of Phasebook owns: report a
 * problem with a container, move it, mark it empty, dispose of it with a waste note; record
 * that an interface cell was cleaned; report an instrument fault (which takes the instrument
 * out of service until the manager reviews it, and tells the managers by e-mail). Logging a
 * usage and checking in or out go through the stockroom's and the schedule's own routes.
 */
import type { DataSource, EntityManager } from "typeorm";
import { isHalogenated } from "@shared/domain/chemistry";
import type { Role } from "@shared/schemas/auth";
import { Chemical, Container, Instrument, Location, User, UserRole } from "../entities";
import { Conflict, Forbidden, NotFound, RuleBroken } from "../errors";
import { hasRole, type AuthUser } from "../middleware/auth";
import { serialTransaction } from "../db/serial";
import { audit } from "../core/audit";
import { enqueueMail } from "../core/outbox";
import { mayHandleContainer } from "./label.service";

export interface ScanActionDeps {
  ds: DataSource;
  now: () => Date;
  publicUrl: string;
}

async function activeEmailsWithRole(em: EntityManager, role: Role): Promise<string[]> {
  const rows = await em
    .getRepository(User)
    .createQueryBuilder("u")
    .innerJoin(UserRole, "r", "r.userId = u.id AND r.role = :role", { role })
    .where("u.active = 1")
    .getMany();
  return rows.map((u) => u.email);
}

export function createScanActionService(deps: ScanActionDeps) {
  const { ds, now } = deps;

  async function loadContainer(em: EntityManager, id: number): Promise<{ c: Container; chem: Chemical }> {
    const c = await em.findOne(Container, { where: { id } });
    if (!c) throw new NotFound("That container");
    const chem = await em.findOneOrFail(Chemical, { where: { id: c.chemicalId } });
    return { c, chem };
  }

  async function requireHandle(em: EntityManager, user: AuthUser, c: Container): Promise<void> {
    if (!(await mayHandleContainer(em, user, c))) {
      throw new Forbidden("This container belongs to another research group; ask them, the manager or the safety officer.", "not_your_container");
    }
  }

  /** Anyone signed in may report a problem (a cracked cap, a missing label); the safety officers hear of it. */
  async function reportContainerProblem(user: AuthUser, id: number, note: string): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const { c, chem } = await loadContainer(em, id);
      const t = now();
      await audit(em, t, user.id, "container.problem_reported", "container", id, { note });
      for (const to of await activeEmailsWithRole(em, "safety_officer")) {
        await enqueueMail(em, t, {
          to,
          subject: `Problem reported: ${chem.name}, container ${c.id}`,
          text: `${user.name} (${user.email}) reported a problem with container ${c.id} (${chem.name}, CAS ${chem.casNumber}):\n\n${note}\n\nOpen it: ${deps.publicUrl}/stockroom/containers/${c.id}`,
        });
      }
    });
  }

  async function move(user: AuthUser, id: number, locationId: number): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const { c } = await loadContainer(em, id);
      await requireHandle(em, user, c);
      if (c.status === "disposed") throw new Conflict("This container was disposed of; it cannot be moved.", "container_disposed");
      if (c.status === "on_hold" && !hasRole(user, "manager", "safety_officer")) {
        throw new Conflict("This container is on hold; only the safety officer or the manager may move it.", "container_on_hold");
      }
      const to = await em.findOne(Location, { where: { id: locationId } });
      if (!to) throw new RuleBroken("That location does not exist.", [{ path: "locationId", message: "Choose an existing location." }]);
      if (c.locationId === locationId) return;
      await em.update(Container, id, { locationId });
      await audit(em, now(), user.id, "container.moved", "container", id, { from: c.locationId, to: locationId });
    });
  }

  async function markEmpty(user: AuthUser, id: number, wasteNote: string): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const { c, chem } = await loadContainer(em, id);
      await requireHandle(em, user, c);
      if (c.status === "empty" || c.status === "disposed") throw new Conflict(`This container is already ${c.status}.`, "container_finished");
      if (c.status === "on_hold") throw new Conflict("This container is on hold; the safety officer must release it first.", "container_on_hold");
      await em.update(Container, id, { status: "empty", quantity: 0 });
      await audit(em, now(), user.id, "container.emptied", "container", id, {
        quantityBefore: c.quantity,
        unit: c.unit,
        wasteNote,
        halogenated: halogenated(chem),
      });
    });
  }

  async function dispose(user: AuthUser, id: number, wasteNote: string): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const { c, chem } = await loadContainer(em, id);
      await requireHandle(em, user, c);
      if (c.status === "disposed") throw new Conflict("This container was already disposed of.", "container_finished");
      if (c.status === "on_hold" && !hasRole(user, "manager", "safety_officer")) {
        throw new Conflict("This container is on hold; only the safety officer or the manager may dispose of it.", "container_on_hold");
      }
      await em.update(Container, id, { status: "disposed", quantity: 0 });
      await audit(em, now(), user.id, "container.disposed", "container", id, {
        quantityBefore: c.quantity,
        unit: c.unit,
        wasteNote,
        // Halogenated waste goes to its own stream; the safety review counts it from these entries.
        halogenated: halogenated(chem),
      });
    });
  }

  async function loadInstrument(em: EntityManager, id: number): Promise<Instrument> {
    const i = await em.findOne(Instrument, { where: { id } });
    if (!i) throw new NotFound("That instrument");
    return i;
  }

  /** Interface cells must be cleaned and dried between users; this records who did it and when. */
  async function recordCleaned(user: AuthUser, id: number, note: string): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const i = await loadInstrument(em, id);
      if (i.kind !== "interface_cell") {
        throw new RuleBroken("Cleaning is recorded for interface cells only.", [{ path: "id", message: `${i.name} is not an interface cell.` }]);
      }
      await audit(em, now(), user.id, "instrument.cleaned", "instrument", id, { note });
    });
  }

  /** Takes the instrument out of service pending the manager's review, and e-mails the managers. */
  async function reportFault(user: AuthUser, id: number, note: string): Promise<void> {
    await serialTransaction(ds, async (em) => {
      const i = await loadInstrument(em, id);
      if (i.status === "retired") throw new Conflict("This instrument is retired.", "instrument_retired");
      const t = now();
      if (i.status === "in_service") await em.update(Instrument, id, { status: "under_maintenance" });
      await audit(em, t, user.id, "instrument.fault_reported", "instrument", id, { note, statusBefore: i.status, statusAfter: "under_maintenance" });
      for (const to of await activeEmailsWithRole(em, "manager")) {
        await enqueueMail(em, t, {
          to,
          subject: `Fault reported: ${i.name} is now under maintenance`,
          text:
            `${user.name} (${user.email}) reported a fault on ${i.name}:\n\n${note}\n\n` +
            `Phasebook set it to "under maintenance" so nobody starts a run on it. Review it and put it back in service when it is fixed:\n` +
            `${deps.publicUrl}/instruments/${i.id}`,
        });
      }
    });
  }

  return { reportContainerProblem, move, markEmpty, dispose, recordCleaned, reportFault };
}

function halogenated(chem: Chemical): boolean | null {
  if (!chem.formula) return null;
  try {
    return isHalogenated(chem.formula);
  } catch {
    return null;
  }
}

export type ScanActionService = ReturnType<typeof createScanActionService>;
