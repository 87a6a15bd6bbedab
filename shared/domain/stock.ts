/**
 * Stock arithmetic on top of units.ts: what a logged amount takes from a container (bottles
 * through density and molar mass, prepared solutions through their concentration), what it
 * costs at the chemical's unit cost, and how many litres a container holds for the safety
 * review's totals. Pure: the services call these inside their transactions, the UI for previews.
 */
import { convertAmount, parseUnit, unitDimension, UnitError, MAX_QUANTITY } from "./units";

export interface StockChemical {
  densityGPerMl: number | null;
  molarMass: number | null;
}

export interface StockContainer {
  unit: string;
  kind: string;
  /** mol/L, for prepared solutions. */
  concentrationMolPerL: number | null;
}

/**
 * The amount to deduct from a container, in the container's own unit. A bottle converts
 * through its chemical's density (mass ↔ volume) and molar mass (↔ amount of substance).
 * A prepared solution is kept as a volume of solution: an amount of its solute converts
 * through the concentration (V = n ÷ c); a mass of solution would need the solution's
 * density, which Phasebook does not know, so it is refused. Throws UnitError.
 * A float: for the decrement itself use exact-amounts.ts withdrawExact, which leaves exactly 0.
 */
export function amountInContainerUnit(amount: number, unit: string, container: StockContainer, chemical: StockChemical): number {
  if (typeof amount !== "number" || !Number.isFinite(amount)) throw new UnitError("invalid_amount", "amount", "The amount must be a finite number.");
  if (amount <= 0) throw new UnitError("invalid_amount", "amount", `The amount must be above zero (got ${amount}).`);
  if (amount > MAX_QUANTITY) throw new UnitError("invalid_amount", "amount", `The amount of ${amount} is larger than Phasebook accepts.`);
  const from = parseUnit(unit, "from");
  if (container.kind === "solution" && container.concentrationMolPerL) {
    const target = parseUnit(container.unit, "to");
    const fromDim = unitDimension(from);
    if (fromDim === "mass") {
      throw new UnitError(
        "needs_density",
        "from",
        "A prepared solution is measured by volume or by the amount of its solute; a mass of solution needs its density, which Phasebook does not keep. Log mL or mmol.",
      );
    }
    if (fromDim === "amount") {
      const mol = convertAmount({ amount, from, to: "mol" });
      const litres = mol / container.concentrationMolPerL;
      return convertAmount({ amount: litres, from: "L", to: target });
    }
    return convertAmount({ amount, from, to: target });
  }
  return convertAmount({
    amount,
    from,
    to: container.unit,
    densityGPerMl: chemical.densityGPerMl,
    molarMassGPerMol: chemical.molarMass,
  });
}

/**
 * Cost in whole cents of an amount at the chemical's unit cost (cents per costUnit), rounded
 * half up to the cent. Null when the chemical has no unit cost or the amount cannot be
 * expressed in the cost unit (e.g. a solid priced per g, logged in mL without a density).
 * Rounded at the time of use: for billing keep charges.ts usageCost (unrounded) with the usage
 * and round once on the charge line (consumableChargeLine).
 */
export function usageCostCents(
  amount: number,
  unit: string,
  chemical: StockChemical & { unitCostCents: number | null; costUnit: string | null },
): number | null {
  if (chemical.unitCostCents === null || chemical.costUnit === null) return null;
  try {
    const inCostUnit = convertAmount({
      amount,
      from: unit,
      to: chemical.costUnit,
      densityGPerMl: chemical.densityGPerMl,
      molarMassGPerMol: chemical.molarMass,
    });
    // Round the product once, after a tiny nudge so 0.5-cent products computed as 0.49999… round up.
    return Math.round(inCostUnit * chemical.unitCostCents + 1e-9);
  } catch (e) {
    if (e instanceof UnitError) return null;
    throw e;
  }
}

/**
 * Litres of liquid in a container, for storage totals: volumes directly, masses through the
 * density. Null when the quantity cannot be a volume (a solid without density, an amount).
 */
export function containerLitres(quantity: number, unit: string, densityGPerMl: number | null): number | null {
  try {
    return convertAmount({ amount: Math.max(0, quantity), from: unit, to: "L", densityGPerMl });
  } catch (e) {
    if (e instanceof UnitError) return null;
    throw e;
  }
}

