/**
 * Physical constants for the run-plan computations, from the exact defining constants of the
 * revised SI (26th CGPM, 2018, Resolution 1; SI Brochure, 9th edition, 2019). CODATA 2018 lists
 * the same exact values and the derived F and R below. Older CODATA sets (F = 96 485.3365 C/mol
 * in 2010) still circulate; Phasebook uses these.
 */

/** Avogadro constant N_A, mol⁻¹ (exact). */
export const AVOGADRO_PER_MOL = 6.02214076e23;
/** Elementary charge e, C (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Boltzmann constant k, J/K (exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Faraday constant F = N_A·e = 96 485.332 12… C/mol (exact product; CODATA 2018). */
export const FARADAY_C_PER_MOL = AVOGADRO_PER_MOL * ELEMENTARY_CHARGE_C;
/** Molar gas constant R = N_A·k = 8.314 462 618… J/(mol·K) (exact product; CODATA 2018). */
export const GAS_CONSTANT_J_PER_MOL_K = AVOGADRO_PER_MOL * BOLTZMANN_J_PER_K;
/** 0 °C in kelvin (exact, by the definition of the Celsius scale). */
export const ZERO_CELSIUS_K = 273.15;
/** The temperature of the published standard potentials and Phasebook's default: 25 °C. */
export const STANDARD_TEMPERATURE_C = 25;

/** Thermodynamic temperature in kelvin of a Celsius temperature. */
export function kelvin(temperatureC: number): number {
  return temperatureC + ZERO_CELSIUS_K;
}

/** RT/F in volts at a Celsius temperature (25.693 mV at 25 °C). */
export function thermalVoltageV(temperatureC: number): number {
  return (GAS_CONSTANT_J_PER_MOL_K * kelvin(temperatureC)) / FARADAY_C_PER_MOL;
}
