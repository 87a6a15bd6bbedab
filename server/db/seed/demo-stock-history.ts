/**
 * The demo stock's history, so container pages have something to show: a receipt movement for
 * every container, a few usages of 1,2-dichloroethane and lithium chloride by the demo PhD
 * student (with their cost at the chemical's unit cost, kept unrounded), and the lineage of the prepared 10 mM
 * lithium chloride solution (its solute came from the opened LiCl bottle; water is not stocked).
 */
import type { EntityManager } from "typeorm";
import { lineAmountCents, usageCost } from "@shared/domain/charges";
import { Chemical, ContainerMovement, ContainerUsage, SolutionComponent } from "../../entities";
import type { DemoContainer } from "./demo-containers";
import { isoAfter } from "./demo-time";

export async function seedStockHistory(
  em: EntityManager,
  now: Date,
  opts: { containers: readonly DemoContainer[]; ids: number[]; locationIdOf: (c: DemoContainer) => number; memberId: number; receiverId: number },
): Promise<void> {
  const { containers, ids } = opts;
  for (let i = 0; i < containers.length; i++) {
    const c = containers[i];
    await em.insert(ContainerMovement, {
      containerId: ids[i],
      fromLocationId: null,
      toLocationId: opts.locationIdOf(c),
      userId: c.kind === "solution" ? opts.memberId : opts.receiverId,
      kind: c.kind === "solution" ? "prepared" : "received",
      note: c.kind === "solution" ? c.lot : c.supplier ? `from ${c.supplier}` : "",
      at: isoAfter(now, (c.openedDays ?? -23) - (c.kind === "solution" ? 0 : 7)),
    });
  }
  const account = (await em.query(`SELECT accountId FROM account_members WHERE userId = ? ORDER BY accountId LIMIT 1`, [opts.memberId])) as { accountId: number }[];
  const accountId = account[0]?.accountId ?? null;
  const chemicalOf = async (index: number) => {
    const [{ chemicalId }] = (await em.query(`SELECT chemicalId FROM containers WHERE id = ?`, [ids[index]])) as { chemicalId: number }[];
    return em.findOneByOrFail(Chemical, { id: chemicalId });
  };

  const use = async (index: number, amount: number, unit: string, days: number, note: string) => {
    const chem = await chemicalOf(index);
    // The cost kept unrounded, as logging a usage keeps it; costCents is that figure rounded, for display.
    const cost = usageCost(amount, unit, chem);
    await em.insert(ContainerUsage, {
      containerId: ids[index],
      userId: opts.memberId,
      bookingId: null,
      accountId,
      amount,
      unit,
      amountInContainerUnit: amount,
      costCents: cost === null ? null : lineAmountCents(cost.quantity, cost.unitCostCents),
      costQuantity: cost?.quantity ?? null,
      costUnit: cost?.unit ?? null,
      unitCostCents: cost?.unitCostCents ?? null,
      note,
      at: isoAfter(now, days),
    });
  };

  // The opened 500 mL bottle of 1,2-dichloroethane in fume hood FH-2: 500 → 420 mL.
  const hoodDce = containers.findIndex((c) => c.chemical === "dce" && c.location === "hoodInterface");
  if (hoodDce >= 0) {
    await use(hoodDce, 30, "mL", -5, "organic phase, interface run");
    await use(hoodDce, 50, "mL", -2, "organic phase, interface run");
  }
  // The prepared LiCl solution: 10 mmol/L × 0.250 L × 42.39 g/mol = 0.1060 g from the opened bottle.
  const solution = containers.findIndex((c) => c.kind === "solution");
  const liclBottle = containers.findIndex((c) => c.chemical === "licl" && c.kind === "bottle" && c.status === "in_use");
  if (solution >= 0 && liclBottle >= 0) {
    const chem = await chemicalOf(liclBottle);
    const grams = Math.round(0.01 * 0.25 * (chem.molarMass ?? 42.39) * 10_000) / 10_000;
    await use(liclBottle, grams, "g", -3, "solution preparation (solute)");
    await em.insert(SolutionComponent, { solutionContainerId: ids[solution], parentContainerId: ids[liclBottle], role: "solute", amount: grams, unit: "g" });
  }
}
