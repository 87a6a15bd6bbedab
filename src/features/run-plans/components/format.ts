/** How run-plan numbers read on screen: volts with their sign, currents in a sensible unit, ions with superscript charges. */
export function formatVolts(v: number | null): string {
  if (v === null) return "—";
  return `${v >= 0 ? "+" : "−"}${Math.abs(v).toFixed(3)} V`;
}

export function formatCurrent(a: number | null): string {
  if (a === null) return "—";
  const m = Math.abs(a);
  const sign = a < 0 ? "−" : "";
  if (m >= 1e-3) return `${sign}${(m * 1e3).toPrecision(3)} mA`;
  if (m >= 1e-6) return `${sign}${(m * 1e6).toPrecision(3)} µA`;
  return `${sign}${(m * 1e9).toPrecision(3)} nA`;
}

export function formatRange(a: number | null): string {
  if (a === null) return "—";
  if (a >= 1e-3) return `${a * 1e3} mA`;
  if (a >= 1e-6) return `${Math.round(a * 1e6)} µA`;
  return `${Math.round(a * 1e9)} nA`;
}

export function formatMass(g: number | null, unit: "g" | "mL" = "g"): string {
  if (g === null) return "—";
  if (unit === "mL") return `${Number(g.toPrecision(4))} mL`;
  return g < 1 ? `${Number((g * 1000).toPrecision(4))} mg` : `${Number(g.toPrecision(4))} g`;
}

/** "Li+" → "Li⁺", "TB(C6F5)4-" → "TB(C6F5)4⁻". */
export function prettyIon(ion: string): string {
  return ion.replace(/\+$/, "⁺").replace(/-$/, "⁻");
}

export function phaseWord(phase: "aqueous" | "organic"): string {
  return phase === "aqueous" ? "aqueous" : "organic";
}

export function molar(c: number): string {
  return c >= 0.1 ? `${Number(c.toPrecision(3))} M` : `${Number((c * 1000).toPrecision(3))} mM`;
}
