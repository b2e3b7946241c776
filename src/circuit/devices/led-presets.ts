/**
 * LED diode models by colour. An LED is a diode with its own IS, N and RS; these presets are fits,
 * not any maker's model: N and RS are chosen per chemistry (N ≈ 2 for the GaAsP/GaP/AlGaInP
 * colours, N ≈ 3 for InGaN blue, white and bright green, a few ohms of RS), and IS is then solved
 * so that the forward voltage at 20 mA lands in the middle of the typical range listed in
 * /work/shared/REFERENCES.md (LED forward voltage at 20 mA: red 1.8–2.2 V, yellow 2.0–2.2 V,
 * GaP green ≈ 2.1 V, InGaN green 2.8–3.5 V, blue 3.0–3.6 V, white 2.8–3.6 V). The tests check the
 * solved forward voltage against those ranges. No reverse breakdown is modelled (LEDs are rated
 * for only about 5 V reverse; treat any reverse voltage beyond that as a fault in itself).
 */
import type { Model } from '../netlist.js';

export type LedColour = 'red' | 'yellow' | 'green' | 'green-ingan' | 'blue' | 'white';

export interface LedPreset {
  params: { IS: number; N: number; RS: number };
  /** The forward voltage at 20 mA the fit aims at, and the typical range it must stay in. */
  targetVf: number;
  typicalRange: [number, number];
}

export const LED_PRESETS: Record<LedColour, LedPreset> = {
  red: { params: { IS: 2.24e-18, N: 2.0, RS: 5 }, targetVf: 2.0, typicalRange: [1.8, 2.2] },
  yellow: { params: { IS: 3.24e-19, N: 2.0, RS: 5 }, targetVf: 2.1, typicalRange: [2.0, 2.2] },
  /** Classic GaP indicator green. */
  green: { params: { IS: 1.09e-17, N: 2.2, RS: 5 }, targetVf: 2.1, typicalRange: [2.0, 2.2] },
  /** Bright InGaN green. */
  'green-ingan': { params: { IS: 1.17e-18, N: 3.0, RS: 10 }, targetVf: 3.1, typicalRange: [2.8, 3.5] },
  blue: { params: { IS: 8.92e-20, N: 3.0, RS: 10 }, targetVf: 3.3, typicalRange: [3.0, 3.6] },
  white: { params: { IS: 3.24e-19, N: 3.0, RS: 10 }, targetVf: 3.2, typicalRange: [2.8, 3.6] },
};

export const LED_COLOURS = Object.keys(LED_PRESETS) as LedColour[];

/** A `.model` card for an LED of this colour, named `led_<colour>` unless a name is given. */
export function ledModel(colour: LedColour, name = `led_${colour.replace('-', '_')}`): Model {
  return { name, type: 'D', params: { ...LED_PRESETS[colour].params } };
}
