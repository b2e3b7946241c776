import { z } from 'zod';

/**
 * The closed vocabulary a diagnostic tree uses to ask for things on any board. A board file maps
 * the roles it has onto its own stages, test points, parts and conditions; a tree names roles only.
 * Add a role here (with its description) when a new kit needs one: a misspelt role is an error.
 */

export const STAGE_ROLES = {
  'power-entry': 'where the rails come in: header, reverse-polarity protection, decoupling',
  'input-stage': 'input buffer with the input-gain control',
  vca: 'the voltage-controlled amplifier that applies the gain reduction',
  'sidechain-filter': 'the switchable high-pass in front of the rectifier',
  rectifier: 'the full-wave rectifier of the sidechain',
  detector: 'the peak detector with attack and release',
  'control-voltage': 'threshold and ratio: turns the detector level into the VCA control',
  'gain-reduction-indicator': 'the gain-reduction LED and its driver',
  'level-meter': 'the output level meter',
  'makeup-stage': 'the makeup-gain amplifier',
} as const;

export const TEST_POINT_ROLES = {
  'pos-rail': '+12 V rail after the protection, near the power header',
  'neg-rail': '−12 V rail after the protection, near the power header',
  'pos-rail-at-ic': '+12 V at an op-amp supply pin',
  'neg-rail-at-ic': '−12 V at an op-amp supply pin',
  'pos-rail-resistance': 'resistance from the +12 V rail to ground, unpowered',
  'neg-rail-resistance': 'resistance from the −12 V rail to ground, unpowered',
  'input-stage-output': 'output of the input stage',
  'vca-input': 'signal input of the VCA',
  'vca-control': 'the control voltage or current input of the VCA',
  'vca-output': 'output of the VCA',
  'sidechain-input': 'input of the rectifier, after the sidechain filter',
  'rectifier-output': 'output of the full-wave rectifier',
  'detector-output': 'the peak detector capacitor voltage',
  'threshold-reference': 'the threshold voltage the detector level is compared with',
  'control-voltage': 'the control voltage after threshold and ratio',
  'gr-led-drive': 'the base or gate of the gain-reduction LED driver',
  'gr-led-current-sense': 'a point whose voltage tells the gain-reduction LED current',
  'meter-drive': 'the voltage feeding the level-meter comparators or driver',
  'makeup-input': 'input of the makeup stage',
  'makeup-output': 'output of the makeup stage',
  output: 'the module output',
} as const;

export const PART_ROLES = {
  'pos-rail-protection': 'reverse-polarity protection on the +12 V rail',
  'neg-rail-protection': 'reverse-polarity protection on the −12 V rail',
  'rail-decoupling': 'rail decoupling capacitors',
  'power-header': 'the power header the ribbon cable plugs into',
  'input-opamp': 'the op-amp of the input stage',
  'input-gain-pot': 'the input-gain control',
  'vca-transistors': 'the gain-cell transistors',
  'vca-tail': 'the part that sets the VCA control current',
  'vca-opamp': 'the op-amp around the VCA',
  'sidechain-hp-switch': 'the sidechain high-pass switch',
  'bypass-switch': 'the switch that routes the input straight to the output',
  'sidechain-hp-capacitor': 'the sidechain high-pass capacitor',
  'rectifier-diodes': 'the rectifier diodes',
  'rectifier-opamp': 'the op-amp of the rectifier',
  'detector-capacitor': 'the peak-hold capacitor',
  'attack-resistor': 'the fixed resistor in the charge path',
  'release-resistor': 'the fixed resistor in the discharge path',
  'attack-pot': 'the attack control',
  'release-pot': 'the release control',
  'threshold-pot': 'the threshold control',
  'ratio-pot': 'the ratio control',
  'control-opamp': 'the op-amp that forms the control voltage',
  'gr-led': 'the gain-reduction LED',
  'gr-led-driver': 'the transistor that drives the gain-reduction LED',
  'gr-led-resistor': 'the current-limit resistor of the gain-reduction LED',
  'meter-leds': 'the level-meter LEDs',
  'meter-drivers': 'the transistors or comparators that light the meter LEDs',
  'meter-resistors': 'the level-meter threshold ladder or LED resistors',
  'makeup-opamp': 'the op-amp of the makeup stage',
  'makeup-gain-pot': 'the makeup-gain control',
  'makeup-feedback-resistor': 'the fixed feedback resistor of the makeup stage',
  'makeup-input-resistor': 'the input resistor of the makeup stage',
} as const;

export const CONDITION_ROLES = {
  unpowered: 'power off, cable unplugged: resistance checks',
  quiescent: 'powered, no input, knobs at their middle',
  'dc-injection-below-threshold': 'a DC level at the input below the threshold: no gain reduction expected',
  'dc-injection-above-threshold': 'a DC level at the input well above the threshold: gain reduction expected',
  'dc-injection-max-ratio': 'DC above threshold with the ratio at maximum',
  'dc-injection-min-ratio': 'DC above threshold with the ratio at minimum',
  'sidechain-hp-on': 'DC injection with the sidechain high-pass switched in',
  'makeup-max': 'powered, makeup gain at maximum',
  'makeup-min': 'powered, makeup gain at minimum',
} as const;

/** What a meter measures at each test-point role; a role may only map to a test point of that quantity. */
export const TEST_POINT_ROLE_QUANTITY: Record<keyof typeof TEST_POINT_ROLES, 'voltage' | 'resistance'> = {
  ...(Object.fromEntries(Object.keys(TEST_POINT_ROLES).map((k) => [k, 'voltage'])) as Record<keyof typeof TEST_POINT_ROLES, 'voltage'>),
  'pos-rail-resistance': 'resistance',
  'neg-rail-resistance': 'resistance',
};

/** Whether each condition role is a powered one; a role may only map to a condition that agrees. */
export const CONDITION_ROLE_POWERED: Record<keyof typeof CONDITION_ROLES, boolean> = {
  ...(Object.fromEntries(Object.keys(CONDITION_ROLES).map((k) => [k, true])) as Record<keyof typeof CONDITION_ROLES, true>),
  unpowered: false,
};

export type StageRole = keyof typeof STAGE_ROLES;
export type TestPointRole = keyof typeof TEST_POINT_ROLES;
export type PartRole = keyof typeof PART_ROLES;
export type ConditionRole = keyof typeof CONDITION_ROLES;

const keysOf = <T extends Record<string, string>>(o: T) => Object.keys(o) as [keyof T & string, ...(keyof T & string)[]];

export const StageRoleSchema = z.enum(keysOf(STAGE_ROLES));
export const TestPointRoleSchema = z.enum(keysOf(TEST_POINT_ROLES));
export const PartRoleSchema = z.enum(keysOf(PART_ROLES));
export const ConditionRoleSchema = z.enum(keysOf(CONDITION_ROLES));
