/**
 * Physical constants and junction relations shared by the circuit stages.
 *
 * The constants are the exact SI values (SI Brochure, 9th edition, 2019).
 */

/** Boltzmann constant, joules per kelvin (exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Elementary charge, coulombs (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Offset from degrees Celsius to kelvin. */
export const ZERO_CELSIUS_K = 273.15;

/** Thermal voltage kT/q, volts, at a temperature in degrees Celsius. */
export function thermalVoltage(temperatureC: number): number {
  return (BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K)) / ELEMENTARY_CHARGE_C;
}

/**
 * Forward voltage of a Shockley diode carrying a current, volts.
 * @param currentA amperes, > 0
 * @param isA saturation current, amperes
 * @param n emission coefficient
 * @param vtV thermal voltage, volts
 */
export function shockleyVoltage(currentA: number, isA: number, n: number, vtV: number): number {
  return n * vtV * Math.log1p(currentA / isA);
}
