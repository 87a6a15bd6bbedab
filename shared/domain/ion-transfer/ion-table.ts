/**
 * Published standard ion-transfer potentials for the facility's liquid|liquid pairs.
 *
 * Convention (IUPAC, Samec, Pure Appl. Chem. 76 (2004) 2147): the Galvani potential difference is
 * Δ_o^w φ = φ(water) − φ(organic), and the standard ion-transfer potential of ion i is
 * Δ_o^w φ°_i = ΔG°_tr,i(w→o) / (z_i F). So a hydrophilic cation (ΔG°_tr > 0, z > 0) and a
 * hydrophobic anion (ΔG°_tr < 0, z < 0) both have positive Δ_o^w φ°; a hydrophilic anion and a
 * hydrophobic cation have negative Δ_o^w φ°. Single-ion values rest on the extrathermodynamic
 * TATB assumption (ΔG°_tr of tetraphenylarsonium = ΔG°_tr of tetraphenylborate), so TPAs+ and
 * TPB− sit symmetrically about zero. Values hold at 25 °C.
 *
 * Every number carries its source. "from memory" marks a value we could not re-read in its
 * source while writing this table: the planner uses it, and the screen and the API show that
 * mark beside it. Check such values against the original before publishing a result that
 * depends on them; the manager can add a better-sourced ion with its source.
 */

export type Phase = "aqueous" | "organic";

/** A number and the published source it comes from. */
export interface SourcedValue {
  value: number;
  source: string;
}

export interface TabulatedIon {
  /** The ion as the trade writes it: "Li+", "TB(C6F5)4-". */
  ion: string;
  /** Plain name for screens. */
  name: string;
  /** Charge number z (the sign is in the name; this is the number the equations use). */
  charge: number;
  /** Δ_o^w φ°_i in volts at 25 °C. */
  standardPotential: SourcedValue;
  /** Diffusion coefficient in water, cm²/s, at 25 °C and infinite dilution. */
  diffusionAqueous?: SourcedValue;
  /** Diffusion coefficient in the organic solvent, cm²/s. */
  diffusionOrganic?: SourcedValue;
}

export interface SolventEntry {
  /** Stable id used by the API: "dce", "nitrobenzene". */
  id: string;
  /** The organic solvent's name; the other phase is water. */
  name: string;
  /** Other spellings a person or a script may send. */
  aliases: readonly string[];
  ions: readonly TabulatedIon[];
}

/** The table every run-plan computation reads: one entry per water | solvent pair. */
export type IonTransferTable = readonly SolventEntry[];

// ---------------------------------------------------------------- sources

const FROM_MEMORY = "from memory: value and attribution not re-read in the source; check before relying on it";

const DCE_SABELA =
  "Sabela, Mareček, Samec & Fuoco, Electrochim. Acta 37 (1992) 231, standard Gibbs energies of ion transfer " +
  "water → 1,2-dichloroethane on the TATB scale, as quoted in later water|DCE compilations; " + FROM_MEMORY;
const DCE_TATB =
  "TATB assumption, ΔG°tr(TPAs+) = ΔG°tr(TPB−) = −35.1 kJ/mol for water → 1,2-dichloroethane " +
  "(Sabela, Mareček, Samec & Fuoco, Electrochim. Acta 37 (1992) 231); " + FROM_MEMORY;
const DCE_HYDROPHOBIC =
  "Value as quoted for water|1,2-dichloroethane in work that uses BTPPA TB(C6F5)4 as the organic supporting " +
  "electrolyte for its wide window; no single table re-read; " + FROM_MEMORY +
  "; uncertain to about ±0.1 V — what the planner relies on is that it lies outside the LiCl window";
const DCE_TPBCL =
  "Estimate for tetrakis(4-chlorophenyl)borate, more hydrophobic than TPB−; " + FROM_MEMORY +
  "; uncertain to about ±0.1 V (Kontturi et al., Ber. Bunsenges. Phys. Chem. 99 (1995) 1131, whose abstract was " +
  "read, show that ion pairing with TPBCl− and TPB− in DCE shifts the Rb+ limit by about 0.2 V: treat the value as a guide)";
const NB_SAMEC =
  "Water|nitrobenzene standard Gibbs energies of ion transfer on the TATB scale, as compiled by the Prague group " +
  "(e.g. Wandlowski, Mareček & Samec, Electrochim. Acta 35 (1990) 1173); " + FROM_MEMORY;
const AQ_DIFFUSION =
  "CRC Handbook of Chemistry and Physics, 'Ionic conductivity and diffusion at infinite dilution', 25 °C " +
  "(D = RTλ°/(z²F²) from the limiting molar conductivity); " + FROM_MEMORY;

// ---------------------------------------------------------------- values

/** Diffusion coefficients in water (cm²/s, 25 °C, infinite dilution), shared by every water | solvent pair. */
const AQUEOUS_D: Readonly<Record<string, number>> = {
  "H+": 9.311e-5,
  "Li+": 1.029e-5,
  "Na+": 1.334e-5,
  "K+": 1.957e-5,
  "Cl-": 2.032e-5,
  "Br-": 2.08e-5,
  "ClO4-": 1.792e-5,
  "TMA+": 1.196e-5,
  "TEA+": 0.868e-5,
  "TPrA+": 0.623e-5,
  "TBA+": 0.519e-5,
};

function ion(
  symbol: string,
  name: string,
  charge: number,
  standardPotentialV: number,
  source: string,
): TabulatedIon {
  const entry: TabulatedIon = { ion: symbol, name, charge, standardPotential: { value: standardPotentialV, source } };
  if (Object.hasOwn(AQUEOUS_D, symbol)) entry.diffusionAqueous = { value: AQUEOUS_D[symbol], source: AQ_DIFFUSION };
  return entry;
}

const DCE_IONS: readonly TabulatedIon[] = [
  ion("H+", "proton", 1, 0.55, DCE_SABELA),
  ion("Li+", "lithium", 1, 0.58, DCE_SABELA),
  ion("Na+", "sodium", 1, 0.59, DCE_SABELA),
  ion("K+", "potassium", 1, 0.54, DCE_SABELA),
  ion("Cl-", "chloride", -1, -0.53, DCE_SABELA),
  ion("Br-", "bromide", -1, -0.44, DCE_SABELA),
  ion("ClO4-", "perchlorate", -1, -0.17, DCE_SABELA),
  ion("TMA+", "tetramethylammonium", 1, 0.16, DCE_SABELA),
  ion("TEA+", "tetraethylammonium", 1, 0.019, DCE_SABELA),
  ion("TPrA+", "tetrapropylammonium", 1, -0.091, DCE_SABELA),
  ion("TBA+", "tetrabutylammonium", 1, -0.225, DCE_SABELA),
  ion("TPAs+", "tetraphenylarsonium", 1, -0.364, DCE_TATB),
  ion("TPB-", "tetraphenylborate", -1, 0.364, DCE_TATB),
  ion("TPBCl-", "tetrakis(4-chlorophenyl)borate", -1, 0.49, DCE_TPBCL),
  ion("BTPPA+", "bis(triphenylphosphoranylidene)ammonium", 1, -0.7, DCE_HYDROPHOBIC),
  ion("TB(C6F5)4-", "tetrakis(pentafluorophenyl)borate", -1, 0.7, DCE_HYDROPHOBIC),
];

const NITROBENZENE_IONS: readonly TabulatedIon[] = [
  ion("H+", "proton", 1, 0.337, NB_SAMEC),
  ion("Li+", "lithium", 1, 0.395, NB_SAMEC),
  ion("Na+", "sodium", 1, 0.354, NB_SAMEC),
  ion("K+", "potassium", 1, 0.242, NB_SAMEC),
  ion("Cl-", "chloride", -1, -0.325, NB_SAMEC),
  ion("Br-", "bromide", -1, -0.294, NB_SAMEC),
  ion("ClO4-", "perchlorate", -1, -0.083, NB_SAMEC),
  ion("TMA+", "tetramethylammonium", 1, 0.035, NB_SAMEC),
  ion("TEA+", "tetraethylammonium", 1, -0.059, NB_SAMEC),
  ion("TBA+", "tetrabutylammonium", 1, -0.248, NB_SAMEC),
  ion("TPAs+", "tetraphenylarsonium", 1, -0.372, NB_SAMEC),
  ion("TPB-", "tetraphenylborate", -1, 0.372, NB_SAMEC),
];

/** Phasebook's built-in table. The server may extend it with ions and solvents the manager adds. */
export const STANDARD_ION_TRANSFER_TABLE: IonTransferTable = Object.freeze([
  { id: "dce", name: "1,2-dichloroethane", aliases: ["DCE", "1,2-DCE", "1,2-dichloroethane", "dichloroethane"], ions: DCE_IONS },
  { id: "nitrobenzene", name: "nitrobenzene", aliases: ["NB", "PhNO2", "nitrobenzene"], ions: NITROBENZENE_IONS },
]);

/** The solvent the facility uses most, assumed where a request names table ions without a solvent. */
export const DEFAULT_SOLVENT_ID = "dce";
