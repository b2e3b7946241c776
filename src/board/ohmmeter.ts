/**
 * The simulated ohmmeter. A handheld meter's resistance range drives a small current through the part
 * and reads the voltage it makes, ratiometrically: reading = V across the probes / I through them.
 * We model the meter as a source of `openCircuitVolts` behind `sourceResistance` — a test current of
 * openCircuitVolts / sourceResistance into a short, falling as the voltage across the probes rises
 * (that fall is the meter's compliance limit, reached at openCircuitVolts when nothing conducts).
 *
 * Figures (common practice, from memory, not one meter's datasheet): on the 20 kΩ range a typical
 * handheld applies about 0.1 mA and has about 1–3 V across open probes. We take 3 V behind 30 kΩ:
 * 0.1 mA into a short, 75 µA into 10 kΩ. A linear resistor reads its value whatever the figures; a
 * junction reads V/I at the current the meter pushes: a silicon small-signal diode forward-biased
 * reads a few kΩ on this range (≈5.8 kΩ for a 1N4148 with these figures: ≈0.48 V at ≈84 µA) and
 * reads differently on another range — as real meters do. Reverse-biased it reads open.
 *
 * Capacitors are open at DC: the reading is the value the display settles to after the capacitor has
 * charged (a real meter's reading climbs on a big electrolytic; we give its end point).
 * A reading at or above OPEN_CIRCUIT_OHMS is reported as Infinity: the meter shows overload.
 */
export interface OhmmeterModel {
  openCircuitVolts: number;
  sourceResistance: number;
}

export const DEFAULT_OHMMETER: OhmmeterModel = { openCircuitVolts: 3, sourceResistance: 30e3 };

/**
 * Beyond the top range of a handheld meter: shown as overload. Common handhelds stop at 20–60 MΩ
 * (from memory); we put the line at 100 MΩ. A reverse-biased 1N4148 (the NXP model's 4.35 nA
 * saturation current at 3 V ≈ 690 MΩ) and a net tied only through the 1 GΩ floating-net tie land beyond it.
 */
export const OPEN_CIRCUIT_OHMS = 100e6;

/** Element and node names the meter adds to a circuit (no board net may start with "_"). */
export const METER_SOURCE = 'vmeter';
export const METER_RESISTOR = 'rmeter';
export const METER_NODE = '_meter';

/** The reading from the node voltages: V across the probes over the current the meter pushes. */
export function ohmmeterReading(vMeterNode: number, vProbe: number, vRef: number, model: OhmmeterModel): number {
  const current = (vMeterNode - vProbe) / model.sourceResistance;
  const volts = vProbe - vRef;
  const reading = volts / current;
  if (!(current > 0) || !(reading >= 0) || reading >= OPEN_CIRCUIT_OHMS) return Infinity;
  return reading;
}
