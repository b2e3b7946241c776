/**
 * Physical constants (CODATA 2018 exact SI values) and the nominal temperature SPICE uses.
 * kT/q = 25.852 mV at 300 K and 25.865 mV at 300.15 K.
 */
export const BOLTZMANN = 1.380649e-23; // J/K
export const ELEMENTARY_CHARGE = 1.602176634e-19; // C
export const KELVIN_OFFSET = 273.15;
/** SPICE's TNOM: model parameters are taken as measured at 27 °C, and analyses run there unless told otherwise. */
export const NOMINAL_TEMPERATURE_C = 27;

export function thermalVoltage(temperatureC: number = NOMINAL_TEMPERATURE_C): number {
  return (BOLTZMANN * (temperatureC + KELVIN_OFFSET)) / ELEMENTARY_CHARGE;
}
