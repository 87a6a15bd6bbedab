/**
 * From the Galvani scale to the potentiostat's scale. A four-electrode cell measures the applied
 * potential E between two reference electrodes, which differs from Δ_o^w φ by a constant set by
 * the reference electrodes and their interfaces: E = Δ_o^w φ + offset (E taken with the same sign
 * as Δ_o^w φ, water against oil). Measuring the half-wave potential of a reference ion with a
 * known Δφ½ (TMA+ or TEA+ are the usual choices) fixes the offset:
 *   offset = E½(measured) − Δφ½(predicted),
 * and every predicted potential then has its applied value Δφ + offset.
 */

export interface PotentialScale {
  referenceIon: string;
  measuredHalfWaveV: number;
  /** Δφ½ of the reference ion on the Galvani scale, from the table (and its diffusion coefficients). */
  predictedHalfWaveV: number;
  /** E − Δ_o^w φ. */
  offsetV: number;
}

export function potentialScale(referenceIon: string, predictedHalfWaveV: number, measuredHalfWaveV: number): PotentialScale {
  return { referenceIon, measuredHalfWaveV, predictedHalfWaveV, offsetV: measuredHalfWaveV - predictedHalfWaveV };
}

/** The applied potential for a Galvani potential difference, or null without a scale. */
export function toAppliedV(galvaniV: number | null, scale: PotentialScale | null): number | null {
  return galvaniV === null || scale === null ? null : galvaniV + scale.offsetV;
}

/** The Galvani potential difference for an applied potential. */
export function toGalvaniV(appliedV: number, scale: PotentialScale): number {
  return appliedV - scale.offsetV;
}
