/**
 * The distribution potential: the Galvani potential difference that a set of ions sets up when
 * they partition between water and an organic phase of given volumes.
 *
 * For each ion i with total amount n_i = c_i^w,0·V_w + c_i^o,0·V_o (mass balance), the Nernst
 * equation for ion partition gives the ratio at equilibrium
 *   K_i(Δφ) = c_i^o / c_i^w = exp(z_i F (Δφ − Δφ°_i) / RT),
 * so c_i^w = n_i / (V_w + K_i V_o) and c_i^o = K_i c_i^w. The one unknown, Δφ = Δ_o^w φ, is fixed
 * by electroneutrality of each phase, Σ z_i c_i^w = 0 = Σ z_i c_i^o. This is the treatment of
 * Hung (J. Electroanal. Chem. 115 (1980) 159) and Kakiuchi's later papers on partition
 * equilibria at liquid|liquid interfaces (both from memory); activities are taken as
 * concentrations and ion pairing is neglected.
 *
 * The charge in the organic phase, Q_o(Δφ) = Σ z_i n_i (1 − w_i), rises monotonically with Δφ
 * (cations enter the oil, anions leave it) while the charge in the water Q_w falls, so
 * h = Q_o − Q_w has exactly one root. We bracket it and bisect: robust, and each fraction
 * w_i = V_w/(V_w + K_i V_o) is a logistic function evaluated without overflow. Using both
 * phases' charges keeps the answer right when nearly everything sits in one phase (where one of
 * Q_o or Q_w would be a difference of nearly equal numbers).
 *
 * Closed form for one salt C^{z+} A^{z−} alone: electroneutrality of both phases makes
 * K_C = K_A, hence Δφ = (z₊Δφ°_C − z₋Δφ°_A) / (z₊ − z₋) — for a 1:1 salt (Δφ°_C + Δφ°_A)/2 —
 * whatever the amount and the volumes (the tests check this).
 */
import { thermalVoltageV } from "./constants";
import { IonTransferError } from "./resolve-ions";

export interface PartitioningIon {
  ion: string;
  charge: number;
  standardPotentialV: number;
  aqueousMolPerL: number;
  organicMolPerL: number;
}

export interface DistributionInput {
  ions: readonly PartitioningIon[];
  aqueousVolumeMl: number;
  organicVolumeMl: number;
  temperatureC: number;
}

export interface DistributionResult {
  galvaniPotentialV: number;
  ions: { ion: string; aqueousMolPerL: number; organicMolPerL: number }[];
  notes: string[];
}

/** 1 / (1 + e^x) without overflow: the fraction of an ion left in the water. */
function logisticComplement(x: number): number {
  if (x > 0) {
    const e = Math.exp(-x);
    return e / (1 + e);
  }
  return 1 / (1 + Math.exp(x));
}

/** Relative charge imbalance accepted as rounding of typed concentrations. */
const NEUTRALITY_TOLERANCE = 1e-9;

export function distributionEquilibrium(input: DistributionInput): DistributionResult {
  const { ions, aqueousVolumeMl: vw, organicVolumeMl: vo, temperatureC } = input;
  if (!(Number.isFinite(vw) && vw > 0)) throw new IonTransferError("invalid_number", "aqueousVolumeMl", `The aqueous volume must be above zero (got ${vw}).`);
  if (!(Number.isFinite(vo) && vo > 0)) throw new IonTransferError("invalid_number", "organicVolumeMl", `The organic volume must be above zero (got ${vo}).`);
  if (ions.length === 0) throw new IonTransferError("invalid_number", "ions", "List at least one cation and one anion.");

  const amounts = ions.map((ion, index) => {
    const { aqueousMolPerL: cw, organicMolPerL: co } = ion;
    if (!(Number.isFinite(cw) && cw >= 0)) {
      throw new IonTransferError("invalid_number", `ions[${index}].aqueousMolPerL`, `The aqueous concentration of ${ion.ion} cannot be negative (got ${cw}).`);
    }
    if (!(Number.isFinite(co) && co >= 0)) {
      throw new IonTransferError("invalid_number", `ions[${index}].organicMolPerL`, `The organic concentration of ${ion.ion} cannot be negative (got ${co}).`);
    }
    if (cw === 0 && co === 0) {
      throw new IonTransferError("invalid_number", `ions[${index}]`, `${ion.ion} is at zero in both phases; give it a concentration in at least one.`);
    }
    if (!Number.isInteger(ion.charge) || ion.charge === 0) {
      throw new IonTransferError("invalid_ion", `ions[${index}].charge`, `The charge of ${ion.ion} must be a whole number other than zero.`);
    }
    return (cw * vw + co * vo) / 1000; // mol
  });

  const netCharge = ions.reduce((sum, ion, i) => sum + ion.charge * amounts[i], 0);
  const totalCharge = ions.reduce((sum, ion, i) => sum + Math.abs(ion.charge) * amounts[i], 0);
  if (Math.abs(netCharge) > NEUTRALITY_TOLERANCE * totalCharge) {
    throw new IonTransferError(
      "not_electroneutral",
      "ions",
      `The ions as given carry a net charge of ${(netCharge * 1000).toExponential(3)} mmol of charge over both phases; ` +
        "a set of ions in equilibrium must be electroneutral. Check the concentrations and the counter-ions.",
    );
  }
  const notes: string[] = [];
  const initialCharge = (phase: "aqueousMolPerL" | "organicMolPerL") => ions.reduce((s, ion) => s + ion.charge * ion[phase], 0);
  const initialScale = ions.reduce((s, ion) => s + Math.abs(ion.charge) * (ion.aqueousMolPerL + ion.organicMolPerL), 0);
  if (Math.abs(initialCharge("aqueousMolPerL")) > NEUTRALITY_TOLERANCE * initialScale || Math.abs(initialCharge("organicMolPerL")) > NEUTRALITY_TOLERANCE * initialScale) {
    notes.push("The starting phases as given are not each electroneutral; only the totals decide the equilibrium, so the result stands.");
  }

  const f = 1 / thermalVoltageV(temperatureC);
  const lnVolumeRatio = Math.log(vo / vw);
  // Fraction of ion i in the water: 1/(1 + K_i·V_o/V_w) = logisticComplement(x_i).
  const exponent = (i: number, dphi: number) => ions[i].charge * f * (dphi - ions[i].standardPotentialV) + lnVolumeRatio;
  const imbalance = (dphi: number) => {
    let organic = 0;
    let aqueous = 0;
    for (let i = 0; i < ions.length; i++) {
      const x = exponent(i, dphi);
      aqueous += ions[i].charge * amounts[i] * logisticComplement(x);
      organic += ions[i].charge * amounts[i] * logisticComplement(-x);
    }
    return organic - aqueous; // rises with Δφ
  };

  const potentials = ions.map((ion) => ion.standardPotentialV);
  let lo = Math.min(...potentials) - 1;
  let hi = Math.max(...potentials) + 1;
  for (let k = 0; k < 60 && imbalance(lo) > 0; k++) lo -= hi - lo;
  for (let k = 0; k < 60 && imbalance(hi) < 0; k++) hi += hi - lo;
  for (let k = 0; k < 200 && hi - lo > 1e-13; k++) {
    const mid = 0.5 * (lo + hi);
    if (imbalance(mid) > 0) hi = mid;
    else lo = mid;
  }
  const galvaniPotentialV = 0.5 * (lo + hi);

  return {
    galvaniPotentialV,
    ions: ions.map((ion, i) => {
      const x = exponent(i, galvaniPotentialV);
      return {
        ion: ion.ion,
        aqueousMolPerL: (amounts[i] * logisticComplement(x)) / (vw / 1000),
        organicMolPerL: (amounts[i] * logisticComplement(-x)) / (vo / 1000),
      };
    }),
    notes,
  };
}
