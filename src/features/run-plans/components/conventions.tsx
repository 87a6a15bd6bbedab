/** The conventions every run plan is computed with, stated where the numbers are read. */
export function RunPlanConventions() {
  return (
    <p className="mb-3 rounded-md border border-grey-200 bg-grey-50 px-3 py-2 text-xs text-grey-700" data-testid="run-plan-conventions">
      Potentials are Galvani potential differences Δ<sub>o</sub><sup>w</sup>φ = φ(water) − φ(organic) (IUPAC, Pure Appl. Chem. 76 (2004) 2147); standard transfer
      potentials from the ion table with their sources; Nernst equation for ion partition with activities taken as concentrations (no activity coefficients, no ion
      pairing); constants CODATA 2018; 25 °C unless the plan says otherwise. Applied potentials need a reference ion measured in your cell.
    </p>
  );
}
